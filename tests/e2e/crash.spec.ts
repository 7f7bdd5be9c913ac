import { execFileSync } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { expect, test } from "@playwright/test";
import { productionServer } from "../support/production-server";

// The production server (as `npm start` runs it) on a database of its own,
// killed with SIGKILL in the middle of a burst.
const root = path.resolve(import.meta.dirname, "../..");
const port = Number(process.env.E2E_CRASH_PORT || 3130);
const db = path.join(root, "tests/.tmp", `crash-${process.pid}.db`);

const server = productionServer(port, db);
const { base } = server;

test("kill -9 during a burst of 1,000 writes: the database is intact and every acknowledged write is there", async () => {
  test.setTimeout(180_000);
  mkdirSync(path.dirname(db), { recursive: true });
  for (const suffix of ["", "-wal", "-shm"]) rmSync(db + suffix, { force: true });
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), "--conditions=react-server", "src/cli/prepare-db.ts"], { cwd: root, env: { ...process.env, GRAINLINE_DB: db } });

  let running = await server.start();
  const signIn = await fetch(`${base}/api/auth/sign-in`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email: "brewer@example.com", password: "grainline-demo" }) });
  const cookie = signIn.headers.get("set-cookie")!.split(";")[0]!;

  const acknowledged: number[] = [];
  let sent = 0;
  const write = async () => {
    const res = await fetch(`${base}/api/events`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie },
      body: JSON.stringify({ step: "measuring", inputs: [{ lot: "P26-0001", quantity: 0 }], measurements: [{ name: "moisturePct", value: 13 + (sent++ % 10) / 10, unit: "%" }] }),
    });
    if (res.ok) acknowledged.push((await res.json()).id);
  };
  const burst = Promise.allSettled(Array.from({ length: 1000 }, (_, i) => new Promise((r) => setTimeout(r, i)).then(write)));
  await new Promise((r) => setTimeout(r, 400));
  running.kill("SIGKILL");
  await burst;
  expect(acknowledged.length).toBeGreaterThan(0);
  expect(acknowledged.length).toBeLessThan(1000);

  running = await server.start();
  const check = new Database(db, { readonly: true });
  expect(check.pragma("integrity_check", { simple: true })).toBe("ok");
  const stored = new Set((check.prepare("select id from events where step = 'measuring'").all() as { id: number }[]).map((r) => r.id));
  const missing = acknowledged.filter((id) => !stored.has(id));
  expect(missing).toEqual([]);
  check.close();
  await server.stop(running);
});
