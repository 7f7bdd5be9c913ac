// The harvest import checks a file by reading alone and writes it with statements prepared
// once (src/server/records/harvest-import.ts). Its answers must be those of the way it ran
// before: every row through the harvest API's own write path (registerHarvestInTx, reading the
// ledger afresh for each row) in a savepoint, the whole run rolled back. That reference is
// written out here, independently of the import's code, and compared row by row.
import { beforeAll, describe, expect, it } from "vitest";
import { z } from "zod";
import { fields, parties, users } from "@/db/schema";
import { translator } from "@/i18n/messages";
import { harvestCsvRowSchema, noonOn } from "@/lib/validation/csv";
import { harvestSchema } from "@/lib/validation/events";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { registerHarvestInTx } from "@/server/ledger/harvests";
import { getDb, getSqlite } from "@/server/platform/db";
import { invalid } from "@/server/platform/errors";
import { breweryTimeZone } from "@/server/platform/settings";
import type { SessionUser } from "@/server/accounts/session";
import { and, eq } from "drizzle-orm";
import { POST as postCommit } from "../../app/api/import/commit/route";
import { POST as postPreview } from "../../app/api/import/preview/route";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

const t = translator("en") as unknown as Translate;
const header = ["field", "variety", "cropYear", "brownKg", "moisturePct", "grade", "bags", "harvestedOn"];
const good = [
  ["field-ikeda-terrace", "Yamada Nishiki", "2026", "600", "14.8", "1", "10", "2026-09-28"],
  ["Cedar Bend", "omachi", "2025", "1,260", "15", "tokuto", "8", "2025/09/30"],
  ["Terrace Paddy", "Yamada Nishiki", "2026", "１２６０", "14.5", "2", "12", "2026-10-01"],
  [" field-ikeda-cedar ", "Yamada Nishiki", "2024", "120.5", "16.2", "out-of-grade", "0", "2024-12-31"],
];
const bad = [
  ["field-ikeda-terrace", "Yamada Nishiki", "2026", "600", "14.8", "premium", "10", "2026-09-28"],
  ["field-nakase-river", "Omachi", "2026", "480", "14.9", "3", "8", "2026-10-02"],
  ["No Such Field", "Yamada Nishiki", "abc", "600", "14.8", "1", "10", "2026-09-28"],
  ["field-ikeda-cedar", "Yamada Nishiki", "2026", "600", "16.2", "1", "10", "2026-09-28"],
  ["field-ikeda-cedar", "Kinmon Blue", "2026", "600", "14.8", "1", "10", "2026-09-28"],
  ["field-ikeda-cedar", "Yamada Nishiki", "2026", "600", "14.8", "1", "10", "2026-09-28", "extra"],
  ["", "Yamada Nishiki", "2026", "600", "14.8", "1", "10", "2026-09-28"],
  ["field-ikeda-cedar", "Yamada Nishiki", "2026", "600", "14.8", "1", "10", "2026-13-40"],
  ["field-ikeda-cedar", "Yamada Nishiki", "1999", "0", "14.8", "1", "-1", "2026-09-28"],
  ["North Basin", "Yamada Nishiki", "2026", "600", "14.8", "1", "10", ""],
];
const file = (cells: string[][]) => cells.map((c, i) => ({ line: i + 2, cells: c }));

async function actorOf(email: string): Promise<SessionUser> {
  const u = getDb().select().from(users).where(eq(users.email, email)).get()!;
  return { id: u.id, role: u.role, partyId: u.partyId, email: u.email, name: u.name };
}

/** The import as it ran before: each row through the API's path in a savepoint, all undone; returns problems and the rows written. */
function reference(actor: SessionUser, rows: { line: number; cells: string[] }[]) {
  const sqlite = getSqlite();
  const top = (table: string) => (sqlite.prepare(`select coalesce(max(id), 0) as n from ${table}`).get() as { n: number }).n;
  const since = { lots: top("lots"), events: top("events") };
  const out = { problems: [] as { line: number; code: string; fields: Record<string, string[]> }[], written: null as unknown };
  try {
    getDb().transaction((tx) => {
      for (const { line, cells } of rows) {
        try {
          if (cells.slice(header.length).some((c) => c.trim() !== "")) throw invalid({ _: [t("csv.import.cellCount", { found: cells.length, expected: header.length })] });
          const values = Object.fromEntries(header.map((h, i) => [h, cells[i] ?? ""]));
          tx.transaction((row) => {
            const parsed = harvestCsvRowSchema.safeParse(values);
            const fieldId = resolveField(row, actor, values.field!);
            if (!parsed.success || typeof fieldId !== "string") throw invalid({ ...(parsed.success ? {} : zodFields(parsed.error)), ...(typeof fieldId === "string" ? {} : fieldId) });
            const { field: _f, harvestedOn, ...rest } = parsed.data;
            registerHarvestInTx(row, actor, harvestSchema.parse({ fieldId, ...rest, ...(harvestedOn ? { at: noonOn(harvestedOn, breweryTimeZone(row)) } : {}) }), t);
          });
        } catch (error) {
          out.problems.push({ line, ...asProblem(error) });
        }
      }
      out.written = writtenSince(since);
      throw new Error("undo");
    });
  } catch (error) {
    if ((error as Error).message !== "undo") throw error;
  }
  return out;
}

function resolveField(tx: Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0], actor: SessionUser, ref: string): string | Record<string, string[]> {
  const value = ref.trim();
  if (!value) return {};
  if (tx.select({ id: fields.id }).from(fields).where(eq(fields.id, value)).get()) return value;
  const scope = actor.role === "grower" ? eq(fields.growerId, actor.partyId) : undefined;
  const named = tx.select({ id: fields.id }).from(fields).where(and(eq(fields.name, value), scope)).all();
  if (named.length === 1) return named[0]!.id;
  return { field: [named.length ? t("csv.import.ambiguousName") : t("validation.unknownField")] };
}

const RENAMED: Record<string, string> = { fieldId: "field", at: "harvestedOn" };
/** Zod's issues as the forms word them; the import's own ("csv.…") through the catalogue. */
function zodFields(error: z.ZodError) {
  const own = error.issues.filter((i) => i.message.startsWith("csv."));
  const rest = error.issues.filter((i) => !i.message.startsWith("csv."));
  const out: Record<string, string[]> = rest.length ? fieldErrorsFrom(new z.ZodError(rest), t) : {};
  for (const i of own) (out[i.path.join(".") || "_"] ??= []).push(t(i.message));
  return Object.fromEntries(Object.entries(out).map(([k, v]) => [RENAMED[k] ?? k, v]));
}

function asProblem(error: unknown): { code: string; fields: Record<string, string[]> } {
  if (error instanceof z.ZodError) return { code: "invalid", fields: zodFields(error) };
  const e = error as { code: string; fields?: Record<string, string[]>; say: (t: Translate) => string };
  return { code: e.code, fields: Object.fromEntries(Object.entries(e.fields ?? { _: [e.say(t)] }).map(([k, v]) => [RENAMED[k] ?? k, v])) };
}

/** Every row a harvest writes, without ids and the moment of recording. */
function writtenSince(since: { lots: number; events: number }) {
  const sqlite = getSqlite();
  return {
    lots: sqlite.prepare("select code, kind, unit, party_id, origin_party_id, field_id, variety, crop_year, grade, moisture_pct, polishing_ratio_pct, attributes, quantity_in, on_hand, content_in, in_transit_to, created_at from lots where id > ? order by id").all(since.lots),
    events: sqlite.prepare("select step, at, user_id, party_id, counterparty_id, place, reference_doc, note, corrects, reason, attributes from events where id > ? order by id").all(since.events),
    outputs: sqlite.prepare("select l.code, o.quantity, o.content from event_outputs o join lots l on l.id = o.lot_id where o.event_id > ? order by o.id").all(since.events),
    sources: sqlite.prepare("select l.code, s.code as source, d.amount from lot_source_deltas d join lots l on l.id = d.lot_id join lots s on s.id = d.source_lot_id where d.event_id > ? order by d.id").all(since.events),
    counters: sqlite.prepare("select prefix, last from lot_code_counters order by prefix").all(),
  };
}

let grower: string, admin: string;
beforeAll(async () => {
  grower = await signInAs("grower@example.com");
  admin = await signInAs("admin@example.com");
  // A second "Terrace Paddy", another grower's: ambiguous to the office, unseen by the grower.
  getDb().insert(fields).values({ id: "field-nakase-terrace", growerId: "grower-nakase", name: "Terrace Paddy", region: "Hyogo", areaHa: 1, latitude: 35, longitude: 134.6, createdAt: new Date() }).run();
  expect(getDb().select().from(parties).where(eq(parties.id, "grower-nakase")).get()).toBeDefined();
});

const send = (route: typeof postPreview, path: string, cookie: string, rows: { line: number; cells: string[] }[]) => call(route, jsonRequest(path, { cookie, body: { kind: "harvests", header, rows } }));

describe.each([
  ["grower@example.com", () => grower],
  ["admin@example.com", () => admin],
])("the harvest import as %s answers what the API's own path answers", (email, cookie) => {
  it("names the same problems, row by row, in the preview and the refused commit, writing nothing", async () => {
    const rows = file([...good, ...bad, ...good]);
    const expected = reference(await actorOf(email), rows);
    expect(expected.problems.length).toBeGreaterThan(6);
    const before = await tableDigests();
    const checked = await send(postPreview, "/api/import/preview", cookie(), rows);
    expect(checked.status).toBe(200);
    expect(checked.body.problems).toEqual(expected.problems);
    const refused = await send(postCommit, "/api/import/commit", cookie(), rows);
    expect(refused.status).toBe(422);
    expect(refused.body.problems).toEqual(expected.problems);
    expect(await tableDigests()).toEqual(before);
  });

  it("writes the same rows when the file is good", async () => {
    const actor = await actorOf(email);
    const rows = file(actor.role === "grower" ? [...good, ...good] : [good[0]!, good[1]!, bad[1]!, good[3]!]);
    const expected = reference(actor, rows);
    expect(expected.problems).toEqual([]);
    const since = { lots: (getSqlite().prepare("select max(id) as n from lots").get() as { n: number }).n, events: (getSqlite().prepare("select max(id) as n from events").get() as { n: number }).n };
    const committed = await send(postCommit, "/api/import/commit", cookie(), rows);
    expect(committed.status).toBe(201);
    const written = writtenSince(since);
    expect(written).toEqual(expected.written);
    expect(committed.body.created).toEqual(rows.map((r, i) => ({ line: r.line, code: (written.lots[i] as { code: string }).code })));
  });
});
