import http from 'node:http';
import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';

/** The app listening on 127.0.0.1 on a port of its own. */
export async function listening(app: Express) {
  const server = app.listen(0, '127.0.0.1');
  await once(server, 'listening');
  const { port } = server.address() as AddressInfo;
  return {
    port,
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()));
        server.closeAllConnections();
      }),
  };
}

export interface Answer {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: { error?: { code: string; message: string } } & Record<string, unknown>;
}

/**
 * POSTs JSON to the app on `port` from the loopback address `from` (all of 127.0.0.0/8 is this
 * machine), on a connection of its own: the app sees a different client per address, as it would
 * see people on different networks.
 */
export function postFrom(
  port: number,
  from: string,
  path: string,
  body: unknown,
  headers: Record<string, string> = {},
): Promise<Answer> {
  const payload = JSON.stringify(body);
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        path,
        method: 'POST',
        localAddress: from,
        agent: false,
        headers: {
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(payload),
          ...headers,
        },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          resolve({ status: res.statusCode ?? 0, headers: res.headers, body: text ? JSON.parse(text) : {} });
        });
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    req.end(payload);
  });
}
