import { Writable } from 'node:stream';
import pino, { type LevelWithSilent } from 'pino';

/** A logger writing into memory, as pino writes to stdout in production. */
export function capturedLogger(level: LevelWithSilent) {
  const lines: string[] = [];
  const stream = new Writable({
    write(chunk: Buffer, _encoding, done) {
      lines.push(chunk.toString('utf8'));
      done();
    },
  });
  return { logger: pino({ level }, stream), text: () => lines.join('') };
}
