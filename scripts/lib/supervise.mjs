// Keeps the app server running for `npm start`: a server that exits unexpectedly is started again
// after a pause that doubles with each quick crash; after `maxFastCrashes` crashes in a row, each
// within `fastMs` of its start, it gives up. Plain Node, like the rest of scripts/lib.
import { stopChild } from './services.mjs';

/**
 * `start()` spawns one server process. `say(line)` reports each restart; `onGiveUp()` is called
 * once the crashes came too fast; `stopping()` is true while the caller shuts everything down (an
 * exit then, say from the terminal's Ctrl-C reaching the server too, is expected). Returns
 * { stop(), starts }: stop() ends the current process and starts no other; `starts` counts the
 * processes started.
 */
export function supervise(
  start,
  {
    say,
    onGiveUp,
    stopping = () => false,
    fastMs = 30_000,
    maxFastCrashes = 5,
    firstDelayMs = 1_000,
    maxDelayMs = 16_000,
  },
) {
  let child;
  let timer;
  let stopped = false;
  let fastCrashes = 0;
  const state = {
    starts: 0,
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await stopChild(child);
    },
  };
  const run = () => {
    const startedAt = Date.now();
    child = start();
    state.starts += 1;
    child.once('exit', (code, signal) => {
      if (stopped || stopping()) return;
      fastCrashes = Date.now() - startedAt < fastMs ? fastCrashes + 1 : 1;
      const how = signal ? `signal ${signal}` : `exit code ${code}`;
      if (fastCrashes >= maxFastCrashes) {
        stopped = true;
        say(
          `the app server stopped unexpectedly (${how}), ${fastCrashes} times in a row within ` +
            `${fastMs / 1000} s of starting; giving up (see its messages above)`,
        );
        onGiveUp();
        return;
      }
      const delay = Math.min(maxDelayMs, firstDelayMs * 2 ** (fastCrashes - 1));
      say(`the app server stopped unexpectedly (${how}); starting it again in ${delay / 1000} s`);
      timer = setTimeout(run, delay);
    });
  };
  run();
  return state;
}
