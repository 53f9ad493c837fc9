// The compiled production server as a child process, for the tests that run it as production does:
// built by scripts/build-server.mjs, the database prepared by its compiled preparation, started as
// `npm run serve` starts it (plain Node on build/…/index.js, no TypeScript loader).
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';

export const root = path.resolve(import.meta.dirname, '..', '..');

export interface Cluster {
  url: string;
  stop(): void;
  halt(): Promise<void>;
  resume(): Promise<void>;
}
/** scripts/lib/services.mjs, as `npm start` and `npm test` use it. */
export interface Services {
  ensurePostgres(): string;
  freePort(): Promise<number>;
  startPostgres(options: {
    bin: string;
    dataDir: string;
    port: number;
    database?: string;
    durable?: boolean;
  }): Promise<Cluster>;
}
const importScript = (file: string) => import(pathToFileURL(path.join(root, file)).href);

export const services = async () => (await importScript('scripts/lib/services.mjs')) as Services;

export interface Built {
  index: string;
  prepare: string;
  /** Removes the build. */
  remove(): void;
}

/**
 * Builds the server into a folder of its own inside the checkout (so the compiled server finds
 * node_modules as production does), named after `name`; `remove()` deletes it again.
 */
export async function buildCompiledServer(name: string): Promise<Built> {
  const dir = path.join(root, 'build', `${name}-${crypto.randomBytes(4).toString('hex')}`);
  const { buildServer } = await importScript('scripts/build-server.mjs');
  const built = (await buildServer(dir)) as { index: string; prepare: string };
  return { ...built, remove: () => fs.rmSync(dir, { recursive: true, force: true }) };
}

/** The compiled database preparation, as a deployment runs it before the servers: its exit and output. */
export function prepareDatabase(built: Built, env: NodeJS.ProcessEnv) {
  const prepared = spawnSync(process.execPath, [built.prepare, '--no-demo'], {
    cwd: root,
    env,
    encoding: 'utf8',
  });
  return { status: prepared.status, output: `${prepared.stdout}${prepared.stderr}` };
}

/** What a production server needs beyond the database: a signing secret shared by every server. */
export const sessionSecret = () => crypto.randomBytes(32).toString('base64url');

/**
 * Resolves once `check` returns a value, polling every 50 ms. Fails after `timeoutMs`, or at once
 * when `abort` returns a reason (a server that died), with `detail()` beside the reason.
 */
export async function waitFor<T>(
  what: string,
  check: () => T | undefined | false | Promise<T | undefined | false>,
  options: { timeoutMs?: number; abort?: () => string; detail?: () => string } = {},
): Promise<T> {
  const deadline = Date.now() + (options.timeoutMs ?? 60_000);
  const detail = () => options.detail?.() ?? '';
  for (;;) {
    const value = await check();
    if (value) return value;
    const aborted = options.abort?.();
    if (aborted) throw new Error(`${aborted} while waiting for ${what}: ${detail()}`);
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}: ${detail()}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** One compiled server process: its output so far, and whether it exited without being asked to. */
export interface ServerProcess {
  child: ChildProcess;
  /** Everything it printed (the production log: a JSON line per request at LOG_LEVEL=info). */
  output(): string;
  /** '' while running or after a stop asked for; otherwise how it ended ("code 1, signal null"). */
  crashed(): string;
  /** SIGTERM (a graceful stop), resolving once the process has exited. */
  stop(): Promise<void>;
  /** SIGKILL, resolving once the process has exited (as a crash the test caused, not counted). */
  kill(): Promise<void>;
}

/**
 * Starts `node <built.index>` with `env` (`npm run serve`'s command) and resolves once it listens.
 * `onCrash` is told when the process exits without stop() or kill().
 */
export async function launchCompiledServer(
  built: Built,
  env: NodeJS.ProcessEnv,
  options: { onCrash?: (how: string) => void; timeoutMs?: number } = {},
): Promise<ServerProcess> {
  // (The IPC channel only carries the server's 'listening' notice.)
  const child = spawn(process.execPath, [built.index], {
    cwd: root,
    env,
    stdio: ['ignore', 'pipe', 'pipe', 'ipc'],
  });
  let output = '';
  let crashed = '';
  let asked = false;
  let listening = false;
  child.on('message', (message: { type?: string }) => (listening ||= message.type === 'listening'));
  child.stdout!.on('data', (chunk) => (output += chunk));
  child.stderr!.on('data', (chunk) => (output += chunk));
  const exited = new Promise<void>((resolve) =>
    child.once('exit', (code, signal) => {
      if (!asked) {
        crashed = `code ${code}, signal ${signal}`;
        options.onCrash?.(crashed);
      }
      resolve();
    }),
  );
  const end = async (signal: NodeJS.Signals) => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    asked = true;
    child.kill(signal);
    await exited;
  };
  const server: ServerProcess = {
    child,
    output: () => output,
    crashed: () => crashed,
    stop: () => end('SIGTERM'),
    kill: () => end('SIGKILL'),
  };
  try {
    await waitFor('the server to listen', () => listening, {
      timeoutMs: options.timeoutMs ?? 60_000,
      abort: () => (crashed ? `the server exited (${crashed})` : ''),
      detail: () => output.slice(-2000),
    });
  } catch (error) {
    await server.kill();
    throw error;
  }
  return server;
}
