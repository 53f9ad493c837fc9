// `npm start`'s supervisor (scripts/lib/supervise.mjs) on real child processes: one that crashes
// once and then runs, and one that always crashes.
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '..', '..');

interface Supervised {
  starts: number;
  stop(): Promise<void>;
}
type Supervise = (
  start: () => ChildProcess,
  options: {
    say(line: string): void;
    onGiveUp(): void;
    fastMs?: number;
    maxFastCrashes?: number;
    firstDelayMs?: number;
    maxDelayMs?: number;
  },
) => Supervised;

const load = async (): Promise<Supervise> =>
  (await import(pathToFileURL(path.join(root, 'scripts/lib/supervise.mjs')).href)).supervise;

async function waitFor(what: string, check: () => boolean, ms = 30_000) {
  const deadline = Date.now() + ms;
  while (!check()) {
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-supervise-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

describe('the app-server supervisor of npm start', () => {
  it('when the server crashes, then it says so and starts it again, and stop() ends it for good', async () => {
    const supervise = await load();
    // Crashes on its first run (no marker yet), then stays up until stopped.
    const marker = path.join(tmp, 'crashed-once');
    const script =
      `const fs = require('node:fs'); if (!fs.existsSync(${JSON.stringify(marker)})) ` +
      `{ fs.writeFileSync(${JSON.stringify(marker)}, ''); process.exit(3); } ` +
      `console.log('up'); setInterval(() => {}, 1000);`;
    const lines: string[] = [];
    let up = false;
    let current: ChildProcess | undefined;
    let gaveUp = false;
    const supervised = supervise(
      () => {
        current = spawn(process.execPath, ['-e', script], { stdio: ['ignore', 'pipe', 'inherit'] });
        current.stdout!.on('data', (chunk) => (up ||= String(chunk).includes('up')));
        return current;
      },
      { say: (line) => lines.push(line), onGiveUp: () => (gaveUp = true), firstDelayMs: 50 },
    );
    await waitFor('the second server to be up', () => up);
    expect(supervised.starts).toBe(2);
    expect(lines).toEqual(['the app server stopped unexpectedly (exit code 3); starting it again in 0.05 s']);

    const last = current!;
    await supervised.stop();
    expect(last.exitCode !== null || last.signalCode !== null).toBe(true);
    expect(supervised.starts).toBe(2);
    expect(gaveUp).toBe(false);
  });

  it('when the server keeps crashing at start, then it backs off and gives up with a clear line', async () => {
    const supervise = await load();
    const lines: string[] = [];
    let gaveUp = false;
    const startedAt: number[] = [];
    const supervised = supervise(
      () => {
        startedAt.push(Date.now());
        return spawn(process.execPath, ['-e', 'process.exit(2)'], { stdio: 'ignore' });
      },
      {
        say: (line) => lines.push(line),
        onGiveUp: () => (gaveUp = true),
        maxFastCrashes: 4,
        firstDelayMs: 40,
      },
    );
    await waitFor('the supervisor to give up', () => gaveUp);
    expect(supervised.starts).toBe(4);
    // Backoff: 40, 80, 160 ms between starts (at least; a busy machine adds to each).
    expect(lines.slice(0, 3).map((l) => l.match(/again in ([\d.]+) s/)?.[1])).toEqual([
      '0.04',
      '0.08',
      '0.16',
    ]);
    expect(startedAt[3]! - startedAt[2]!).toBeGreaterThanOrEqual(160);
    expect(lines[3]).toBe(
      'the app server stopped unexpectedly (exit code 2), 4 times in a row within 30 s of starting; ' +
        'giving up (see its messages above)',
    );
    await supervised.stop();
    expect(supervised.starts).toBe(4);
  });
});
