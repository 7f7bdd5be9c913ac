/**
 * The bare comparison for `npm run bench:load`: node:http + better-sqlite3 and nothing else,
 * running exactly the SQL the app ran for one request of each route (captured by the bench
 * through better-sqlite3's verbose hook, values included), the write in one IMMEDIATE
 * transaction as the app does, on a connection set up as the app's is (the same pragmas, and
 * WAL checkpoints in a worker thread: src/server/platform/checkpointer.ts).
 * Usage: tsx --conditions=react-server bench/bare-server.ts <db> <statements.json> <port>
 */
import { readFileSync } from "node:fs";
import http from "node:http";
import Database from "better-sqlite3";
import { startCheckpointer } from "../src/server/platform/checkpointer";

const [dbFile, statementsFile, port] = process.argv.slice(2) as [string, string, string];
const captured = JSON.parse(readFileSync(statementsFile, "utf8")) as { read: string[]; write: string[] };

const db = new Database(dbFile);
db.pragma("journal_mode = WAL");
db.pragma("busy_timeout = 5000");
db.pragma("foreign_keys = ON");
db.pragma("synchronous = NORMAL");
startCheckpointer(db);

const prepare = (sql: string) => {
  const statement = db.prepare(sql);
  return () => (statement.reader ? statement.all() : statement.run());
};
const reads = captured.read.map(prepare);
const writes = captured.write.map(prepare);
const write = db.transaction(() => {
  let last: unknown;
  for (const run of writes) last = run();
  return last;
});

http
  .createServer((req, res) => {
    if (req.method === "GET") {
      let rows: unknown;
      for (const run of reads) rows = run();
      res.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify((rows as unknown[])[0]));
      return;
    }
    let body = "";
    req.on("data", (c) => (body += c));
    req.on("end", () => {
      JSON.parse(body);
      const result = write.immediate();
      res.writeHead(201, { "content-type": "application/json" }).end(JSON.stringify({ result, outputs: [] }));
    });
  })
  .listen(Number(port), () => console.log("bare ready"));
