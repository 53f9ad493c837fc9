// The local S3-compatible object store (s3rver) on loopback, for development and tests.
// Usage: node scripts/s3-fake.mjs --port 4569 --dir uploads --bucket hilum
import fs from 'node:fs';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';

const { values } = parseArgs({
  options: { port: { type: 'string' }, dir: { type: 'string' }, bucket: { type: 'string' } },
});
const port = Number(values.port ?? 4569);
const directory = values.dir ?? 'uploads';
fs.mkdirSync(directory, { recursive: true });

const server = new S3rver({
  address: '127.0.0.1',
  port,
  directory,
  silent: true,
  configureBuckets: [{ name: values.bucket ?? 'hilum' }],
});

await server.run();
process.stdout.write(`object-store fake ready on 127.0.0.1:${port}\n`);

const stop = async () => {
  await server.close();
  process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
