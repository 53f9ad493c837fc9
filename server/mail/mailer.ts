import nodemailer from 'nodemailer';
import type { Config } from '../config';

export interface MailMessage {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

export interface Mailer {
  send(message: MailMessage): Promise<{ messageId: string }>;
  ping(timeoutMs?: number): Promise<boolean>;
  close(): void;
}

/** Sends through SMTP only: the local fake in development and tests, a provider in production. */
export function createMailer(options: Config['mail']): Mailer {
  const transportOptions = {
    host: options.host,
    port: options.port,
    secure: options.secure,
    auth: options.user ? { user: options.user, pass: options.password ?? '' } : undefined,
    ignoreTLS: !options.secure && (options.host === '127.0.0.1' || options.host === 'localhost'),
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    socketTimeout: 10_000,
  };
  const transport = nodemailer.createTransport(transportOptions);

  return {
    async send(message) {
      const info = await transport.sendMail({ from: options.from, ...message });
      return { messageId: info.messageId };
    },
    async ping(timeoutMs = 2_000) {
      // A short-lived transport with a short timeout, so a dead server answers quickly.
      const probe = nodemailer.createTransport({
        ...transportOptions,
        connectionTimeout: timeoutMs,
        greetingTimeout: timeoutMs,
      });
      try {
        return await probe.verify();
      } catch {
        return false;
      } finally {
        probe.close();
      }
    },
    close() {
      transport.close();
    },
  };
}
