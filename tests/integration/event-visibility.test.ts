// Event details show only what the reader may see (issue 12, item 3): another party's lot in a
// shared event is "another party's lot", with no code and no weight, and so are the event's
// figures that carry its weight. Seeded 2024 season (src/server/records/seed-brewing.ts): Ikeda Farm's
// harvest polished together with the cooperative's, the polished rice soaked at the brewery.
import { beforeAll, describe, expect, it } from "vitest";
import { GET as getLotEvents } from "../../app/api/lots/[code]/events/route";
import { getSqlite } from "@/server/platform/db";
import { neighbours } from "@/server/trace/lineage";
import { DEMO_USERS } from "@/server/records/seed";
import { call, jsonRequest, signInAs } from "../support/api";

type Line = { lot: string | null; quantity: number | null; unit: string | null; otherParty?: boolean };
type Ev = { id: number; step: string; inputs: Line[]; outputs: Line[]; measurements: { name: string }[]; attributes: Record<string, unknown> };

const cookies: Record<string, string> = {};
const one = <T>(sql: string, ...args: unknown[]) => getSqlite().prepare(sql).get(...args) as T;
const codes = (sql: string, ...args: unknown[]) => (getSqlite().prepare(sql).all(...args) as { code: string }[]).map((r) => r.code);
const history = async (who: string, code: string) => (await call(getLotEvents, jsonRequest(`/api/lots/${code}/events`, { cookie: cookies[who] }), { code })).body.items as Ev[];

let ikeda = "";
let run = 0;
let others: string[] = [];
let polished = "";

beforeAll(async () => {
  for (const who of ["grower", "miller", "admin", "auditor"]) cookies[who] = await signInAs(`${who}@example.com`);
  ikeda = one<{ code: string }>("select code from lots where kind = 'harvest' and field_id = 'field-ikeda-terrace' and crop_year = 2024").code;
  run = one<{ id: number }>("select e.id from events e join event_inputs i on i.event_id = e.id join lots l on l.id = i.lot_id where e.step = 'polishing' and l.code = ?", ikeda).id;
  // Every other lot of the run: the cooperative's harvest in, the mill's polished rice and bran out.
  others = codes("select l.code from event_inputs i join lots l on l.id = i.lot_id where i.event_id = ? and l.code != ? union select l.code from event_outputs o join lots l on l.id = o.lot_id where o.event_id = ?", run, ikeda, run);
  polished = one<{ code: string }>("select l.code from event_outputs o join lots l on l.id = o.lot_id where o.event_id = ? and l.kind = 'polished'", run).code;
});

describe("a grower reading a co-polished run", () => {
  it("sees its own harvest and the other grower's lot only as another party's lot", async () => {
    expect(others.length).toBe(3);
    const e = (await history("grower", ikeda)).find((x) => x.id === run)!;
    expect(e.inputs).toEqual([
      { lot: ikeda, quantity: 1500, unit: "kg", use: "draw" },
      { lot: null, quantity: null, unit: null, use: "draw", otherParty: true },
    ]);
    expect(e.outputs).toEqual([
      { lot: null, kind: null, quantity: null, unit: null, otherParty: true },
      { lot: null, kind: null, quantity: null, unit: null, otherParty: true },
    ]);
    // The run's weights are the cooperative's and the mill's too; its ratios are no lot's weight.
    expect(Object.keys(e.attributes).filter((k) => /Kg$/.test(k))).toEqual([]);
    expect(e.attributes).toMatchObject({ targetPolishingRatioPct: 50, achievedPolishingRatioPct: 50 });
    const text = JSON.stringify(e);
    for (const code of others) expect(text).not.toContain(code);
  });

  it("one step forward names no lot the grower may not see", () => {
    const grower = DEMO_USERS.find((u) => u.id === "user-grower")!;
    const lotId = one<{ id: number }>("select id from lots where code = ?", ikeda).id;
    const { forward } = neighbours(grower, lotId);
    expect(forward.length).toBeGreaterThan(0);
    for (const n of forward) expect(n).toMatchObject({ code: null, visible: false });
  });
});

describe("a mill reading its polished rice after the brewery used it", () => {
  it("sees the brewery's soaked rice only as another party's lot, with no weights", async () => {
    const soaks = (await history("miller", polished)).filter((e) => e.step === "soaking");
    expect(soaks.length).toBeGreaterThan(0);
    for (const e of soaks) {
      expect(e.inputs[0]).toMatchObject({ lot: polished });
      expect(e.outputs).toEqual([{ lot: null, kind: null, quantity: null, unit: null, otherParty: true }]);
      expect(e.attributes.dryKg).toBeUndefined();
      expect(e.attributes.drainedKg).toBeUndefined();
      expect(e.attributes.use).toBeDefined();
    }
  });
});

describe("roles that read every record", () => {
  it("see every lot of the run as before", async () => {
    for (const who of ["admin", "auditor"]) {
      const e = (await history(who, ikeda)).find((x) => x.id === run)!;
      expect([...e.inputs, ...e.outputs].map((l) => l.lot).sort()).toEqual([ikeda, ...others].sort());
      expect(e.attributes).toMatchObject({ brownKg: 2000, polishedKg: 1000, branKg: 960 });
    }
  });
});
