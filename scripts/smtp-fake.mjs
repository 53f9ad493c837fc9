// The local SMTP fake: accepts every message on loopback and writes it as one .eml file.
// Usage: node scripts/smtp-fake.mjs --port 2525 --dir .data/outbox
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { SMTPServer } from 'smtp-server';

const { values } = parseArgs({ options: { port: { type: 'string' }, dir: { type: 'string' } } });
const port = Number(values.port ?? 2525);
const outbox = values.dir ?? '.data/outbox';
fs.mkdirSync(outbox, { recursive: true });

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  banner: 'Hilum local mail catcher',
  onData(stream, _session, callback) {
    const chunks = [];
    stream.on('data', (chunk) => chunks.push(chunk));
    stream.on('end', () => {
      // Time-ordered names, written to a temp name first so a reader never sees half a message.
      const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${crypto.randomUUID().slice(0, 8)}.eml`;
      const tmp = path.join(outbox, `.${name}.tmp`);
      fs.writeFileSync(tmp, Buffer.concat(chunks));
      fs.renameSync(tmp, path.join(outbox, name));
      callback();
    });
  },
});

server.on('error', (error) => process.stderr.write(`smtp fake: ${error.message}\n`));
server.listen(port, '127.0.0.1', () => {
  process.stdout.write(`SMTP fake ready on 127.0.0.1:${port}, writing to ${outbox}\n`);
});

const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
