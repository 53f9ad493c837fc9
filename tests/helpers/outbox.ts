import { readOutbox, type CapturedMail } from '#server/mail/outbox';

/** Waits until the SMTP fake has written a message matching `match` (mail is asynchronous). */
export async function waitForMail(
  match: (mail: CapturedMail) => boolean,
  timeoutMs = 10_000,
): Promise<CapturedMail> {
  const dir = process.env.OUTBOX_DIR;
  if (!dir) throw new Error('OUTBOX_DIR is not set: run the suite with `npm test`');
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await readOutbox(dir, 500)).find(match);
    if (found) return found;
    if (Date.now() > deadline) throw new Error('no matching mail arrived in the outbox');
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The first link in a mail's text that starts with `prefix`. */
export function linkIn(mail: CapturedMail, prefix: string): string {
  const link = mail.text.split(/\s+/).find((word) => word.startsWith(prefix));
  if (!link) throw new Error(`no link starting ${prefix} in: ${mail.text}`);
  return link;
}
