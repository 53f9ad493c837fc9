// `npm run typecheck`: browser code against the DOM without Node's types, Node code without the
// DOM's, and the tests (Node, driving a browser) with both. Each config names what it checks.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const tsc = path.join(root, 'node_modules', 'tsgo', 'bin', 'tsc');
let failed = false;
for (const config of ['tsconfig.client.json', 'tsconfig.server.json', 'tsconfig.tests.json']) {
  const run = spawnSync(process.execPath, [tsc, '-p', config, '--noEmit'], { cwd: root, stdio: 'inherit' });
  if (run.status !== 0) {
    process.stderr.write(`type check failed: ${config}\n`);
    failed = true;
  }
}
process.exit(failed ? 1 : 0);
