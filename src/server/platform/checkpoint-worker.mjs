// The background checkpointer's thread (src/server/platform/checkpointer.ts). Plain JavaScript so that
// it runs in a worker thread without a TypeScript loader. It copies committed pages from the
// write-ahead log into the database file on a connection of its own, so the server's thread
// never waits for that copy or its fsync. PASSIVE never blocks, and is never blocked by, the
// server's readers and writer (https://www.sqlite.org/c3ref/wal_checkpoint_v2.html).
import { parentPort, workerData } from "node:worker_threads";
import Database from "better-sqlite3";

const { file, intervalMs } = workerData;
const db = new Database(file, { fileMustExist: true });
// The latest request for news of a pass (checkpointer.ts `nextPass`): each report names the
// request seen before its pass began, so a caller never takes a report from an older pass.
let asked = 0;

const timer = setInterval(() => {
  const seen = asked;
  try {
    const [result] = db.pragma("wal_checkpoint(PASSIVE)");
    parentPort.postMessage({ checkpointed: result.checkpointed, log: result.log, asked: seen });
  } catch (error) {
    parentPort.postMessage({ error: String(error) });
  }
}, intervalMs);

parentPort.on("message", (message) => {
  if (typeof message === "number") {
    asked = message;
    return;
  }
  if (message !== "stop") return;
  clearInterval(timer);
  db.close();
  parentPort.close();
});
