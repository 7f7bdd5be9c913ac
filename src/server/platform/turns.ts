import "server-only";

/** How many fast requests run before the event loop takes its next turn. */
export const REQUESTS_PER_TURN = 4;

const waiting: (() => void)[] = [];
let draining = false;

/**
 * Runs the fast path's requests (src/server/platform/fast-path.ts) in arrival order, a few per turn of
 * the event loop. Node's event loop accepts one new connection per turn (libuv 1.45 and later),
 * and a turn that answers every waiting request at once lasts as long as all of them: with 50
 * phones writing, a phone that had just connected waited about 20 ms a turn for each new
 * connection ahead of it — 0.6 s for the last of 30 (`npm run bench:load`, bench/LOAD.md).
 * Short turns also keep Next's pages and the timers going while the floor is busy.
 */
export function inTurn(run: () => void): void {
  waiting.push(run);
  if (draining) return;
  draining = true;
  setImmediate(drain);
}

function drain() {
  for (let i = 0; i < REQUESTS_PER_TURN && waiting.length > 0; i++) {
    try {
      waiting.shift()!();
    } catch (error) {
      // A run answers its own errors; one that throws anyway must not stop the others.
      console.error(error);
    }
  }
  if (waiting.length > 0) setImmediate(drain);
  else draining = false;
}
