import { execFile, execFileSync } from "node:child_process";
import { mkdirSync, renameSync, rmSync, copyFileSync, existsSync } from "node:fs";
import path from "node:path";
import { promisify } from "node:util";
import Database from "better-sqlite3";
import { expect, test } from "@playwright/test";
import { productionServer } from "../support/production-server";

// `npm run backup` against the production server while phones write to it, then the restore
// DEVELOPERS.md documents: stop, set the live files aside, put the copy in place, start again.
const root = path.resolve(import.meta.dirname, "../..");
const port = Number(process.env.E2E_BACKUP_PORT || 3131);
const dir = path.join(root, "tests/.tmp", `backup-${process.pid}`);
const db = path.join(dir, "grainline.db");
const copy = path.join(dir, "backup.db");
const server = productionServer(port, db);
const { base, env } = server;


function rows(file: string) {
  const d = new Database(file, { readonly: true });
  const names = (d.prepare("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' order by name").all() as { name: string }[]).map((r) => r.name);
  const all = Object.fromEntries(names.map((n) => [n, d.prepare(`select * from "${n}" order by rowid`).all()]));
  const integrity = d.pragma("integrity_check", { simple: true });
  d.close();
  return { all, integrity };
}

test("npm run backup while the server takes writes; the documented restore brings back every row of the copy", async () => {
  test.setTimeout(180_000);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), "--conditions=react-server", "src/cli/prepare-db.ts"], { cwd: root, env });

  let running = await server.start();
  const signIn = await fetch(`${base}/api/auth/sign-in`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email: "brewer@example.com", password: "grainline-demo" }) });
  const cookie = signIn.headers.get("set-cookie")!.split(";")[0]!;
  const write = (n: number) =>
    fetch(`${base}/api/events`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie },
      body: JSON.stringify({ step: "measuring", inputs: [{ lot: "P26-0001", quantity: 0 }], measurements: [{ name: "moisturePct", value: 13 + (n % 10) / 10, unit: "%" }] }),
    }).then((r) => r.status);

  // Writes before, during and after the backup, through the production server.
  let n = 0;
  let writing = true;
  const statuses: number[] = [];
  const writer = (async () => {
    while (writing) statuses.push(await write(n++));
  })();
  await new Promise((r) => setTimeout(r, 300));
  const { stdout } = await promisify(execFile)("npm", ["run", "--silent", "backup", "--", copy], { cwd: root, env });
  await new Promise((r) => setTimeout(r, 300));
  writing = false;
  await writer;
  expect(stdout).toContain("Backed up");
  expect(statuses.length).toBeGreaterThan(20);
  expect(statuses.every((s) => s === 201)).toBe(true);

  const live = rows(db);
  const backup = rows(copy);
  expect(backup.integrity).toBe("ok");
  expect(Object.keys(backup.all)).toEqual(Object.keys(live.all));
  for (const table of Object.keys(live.all)) {
    // The copy is the database as it stood at one moment: every row it holds is the live row in that place.
    expect(live.all[table]!.slice(0, backup.all[table]!.length), table).toEqual(backup.all[table]);
  }
  const eventsIn = (r: typeof live) => r.all.events!.length;
  expect(eventsIn(backup)).toBeLessThan(eventsIn(live)); // writes went on after the copy was taken

  // Restore as documented.
  await server.stop(running);
  for (const suffix of ["", "-wal", "-shm"]) if (existsSync(db + suffix)) renameSync(db + suffix, `${db}${suffix}.before-restore`);
  copyFileSync(copy, db);
  running = await server.start();
  const lot = await fetch(`${base}/api/lots/P26-0001`, { headers: { cookie } });
  expect(lot.status).toBe(200); // the session in the copy still signs the brewer in
  const again = await write(0);
  expect(again).toBe(201);
  await server.stop(running);
  const restored = rows(db);
  expect(restored.integrity).toBe("ok");
  expect(eventsIn(restored)).toBe(eventsIn(backup) + 1);
  rmSync(dir, { recursive: true, force: true });
});
