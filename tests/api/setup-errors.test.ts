import { spawn } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '..', '..');

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

async function portsEnv(dataDir: string) {
  return {
    HILUM_DATA_DIR: dataDir,
    PORT: String(await freePort()),
    HILUM_PG_PORT: String(await freePort()),
    HILUM_S3_PORT: String(await freePort()),
    HILUM_SMTP_PORT: String(await freePort()),
  };
}

/** Runs `npm start`'s script and returns its exit code and what it printed. */
function start(env: Record<string, string>, asUser?: string) {
  const cmd = asUser ? 'runuser' : process.execPath;
  const args = asUser ? ['-u', asUser, '--', process.execPath, 'scripts/start.mjs'] : ['scripts/start.mjs'];
  return new Promise<{ code: number | null; out: string }>((resolve) => {
    const child = spawn(cmd, args, { cwd: root, env: { ...process.env, ...env } });
    let out = '';
    child.stdout.on('data', (c) => (out += c));
    child.stderr.on('data', (c) => (out += c));
    child.on('exit', (code) => resolve({ code, out }));
  });
}

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-setup-'));
fs.chmodSync(tmp, 0o755);
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

describe('npm start with bad set-up input', () => {
  it('when the app port is already in use, then it exits non-zero with one clear line', async () => {
    const env = await portsEnv(path.join(tmp, 'a'));
    const blocker = net.createServer().listen(Number(env.PORT), '127.0.0.1');
    await new Promise((r) => blocker.once('listening', r));
    const { code, out } = await start(env);
    blocker.close();
    expect(code).not.toBe(0);
    expect(out.trim()).toBe(
      `hilum: port ${env.PORT} (PORT) is already in use; stop what uses it or set PORT`,
    );
  });

  it('when the data directory cannot be written, then it exits non-zero with one clear line', async () => {
    const file = path.join(tmp, 'a-file');
    fs.writeFileSync(file, 'not a directory');
    const { code, out } = await start(await portsEnv(path.join(file, 'data')));
    expect(code).not.toBe(0);
    expect(out).toMatch(
      /^hilum: the data directory .* cannot be written; choose another with HILUM_DATA_DIR\n$/,
    );
    expect(out).not.toMatch(/\bat .*\.m?js:\d+/);
  });

  const isRoot = process.getuid?.() === 0;
  // The unprivileged user must reach the checkout: every folder above it open to others (a checkout
  // under a private temporary folder is not, and the case cannot be run there).
  const reachable = (dir: string): boolean =>
    (fs.statSync(dir).mode & 0o001) !== 0 && (path.dirname(dir) === dir || reachable(path.dirname(dir)));
  it.runIf(isRoot && reachable(root))(
    'when PostgreSQL is missing and it is not run as root, then it names the command to run',
    async () => {
      // As an unprivileged user, on a machine where the PostgreSQL binaries are not found.
      const dataDir = path.join(tmp, 'nobody');
      fs.mkdirSync(dataDir, { recursive: true });
      fs.chownSync(dataDir, 65534, 65534);
      const { code, out } = await start(
        {
          ...(await portsEnv(dataDir)),
          HILUM_S3_DIR: path.join(dataDir, 's3'),
          HILUM_PG_BASE: '/nonexistent',
        },
        'nobody',
      );
      expect(code).not.toBe(0);
      expect(out.trim()).toBe(
        'hilum: PostgreSQL server is not installed; run: sudo apt-get update && sudo apt-get install -y postgresql',
      );
    },
  );
});
