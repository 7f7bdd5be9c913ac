import "server-only";
import type Database from "better-sqlite3";
import { Worker } from "node:worker_threads";

/**
 * Past this many pages in the write-ahead log (64 MB at SQLite's 4 KB pages), the server's own
 * connection checkpoints at commit as SQLite does by default at 1,000: the bound that keeps the
 * log from growing under writes that never pause, since only a checkpoint that catches up with
 * the log lets the next writer start it again from the beginning.
 */
export const WAL_BOUND_PAGES = 16_000;

export type Checkpointer = {
  /**
   * Resolves with the report of the first pass that began after this call (a test's way to
   * wait for one); a report already queued from an earlier pass does not count.
   */
  nextPass(): Promise<{ checkpointed: number; log: number }>;
  stop(): Promise<void>;
};

/**
 * Moves WAL checkpoints off the server's thread. SQLite's default runs a checkpoint — copying
 * the log into the database file and syncing it — inside whichever commit crosses 1,000 pages,
 * and with one Node thread every request waits behind it: under 50 phones writing at once the
 * event loop stopped for over 40 ms 63 times in 15 s, against 9–14 with this worker
 * (bench/LOAD.md). A worker thread with its own connection now checkpoints every
 * `intervalMs`; the server's connection keeps only the far bound above.
 */
export function startCheckpointer(sqlite: Database.Database, { intervalMs = 100, boundPages = WAL_BOUND_PAGES } = {}): Checkpointer {
  if (sqlite.memory) throw new Error("An in-memory database has no write-ahead log to checkpoint.");
  sqlite.pragma(`wal_autocheckpoint = ${boundPages}`);
  const worker = new Worker(new URL("./checkpoint-worker.mjs", import.meta.url), { workerData: { file: sqlite.name, intervalMs } });
  worker.unref();
  type Pass = { checkpointed: number; log: number };
  let waiting: { ask: number; resolve: (pass: Pass) => void }[] = [];
  let asks = 0;
  worker.on("message", (message: (Pass & { asked: number }) | { error: string }) => {
    if ("error" in message) {
      // A pass that failed (a disk error, say) is logged; the next pass, or the bound, retries.
      console.error(`checkpoint: ${message.error}`);
      return;
    }
    const { checkpointed, log, asked } = message;
    const answered = waiting.filter(({ ask }) => ask <= asked);
    waiting = waiting.filter(({ ask }) => ask > asked);
    for (const { resolve } of answered) resolve({ checkpointed, log });
  });
  worker.on("error", (error) => console.error("checkpoint worker:", error));
  return {
    nextPass: () =>
      new Promise((resolve) => {
        const ask = ++asks;
        waiting.push({ ask, resolve });
        worker.postMessage(ask);
      }),
    async stop() {
      const exited = new Promise((resolve) => worker.once("exit", resolve));
      worker.postMessage("stop");
      await exited;
      waiting = [];
      sqlite.pragma("wal_autocheckpoint = 1000");
    },
  };
}
