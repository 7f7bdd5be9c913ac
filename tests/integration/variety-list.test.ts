import { readFileSync } from "node:fs";
import path from "node:path";
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { POST as postCommit } from "../../app/api/import/commit/route";
import { GET as getLotRoute } from "../../app/api/lots/[code]/route";
import { translator } from "@/i18n/messages";
import { createLineCollector } from "@/lib/validation/csv";
import { getSqlite } from "@/server/platform/db";
import { DEMO_USERS } from "@/server/records/seed";
import type { SessionUser } from "@/server/accounts/session";
import { addVariety, readVarietyList, removeVariety } from "@/server/floor/variety-list";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";
import { dispatchAndReceive } from "../support/receipts";

// Variety names are public registered names; the starting list is common practice (from memory).
const en = translator("en");
const t = (key: string, values?: Record<string, string | number>) => en(key as never, values as never);
const actor = (id: string) => DEMO_USERS.find((u) => u.id === id)! as SessionUser;
const NOT_LISTED = t("varietyList.notListed");
let grower: string;
let admin: string;
let miller: string;
const harvest = (variety: string, brownKg = 300, field = "field-ikeda-terrace") =>
  call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body: { fieldId: field, variety, cropYear: 2026, brownKg, moisturePct: 14.8, grade: "1", bags: 10 } }));
const lot = async (code: string) => (await call(getLotRoute, jsonRequest(`/api/lots/${code}`, { cookie: miller }), { code })).body;
const audits = () => getSqlite().prepare("select detail from audit_log where subject = 'varietyList' order by id").all() as { detail: string }[];

function csvBody(name: string) {
  const parsed = Papa.parse<string[]>(readFileSync(path.resolve("fixtures/csv", name), "utf8"), { header: false, skipEmptyLines: false });
  const lines = createLineCollector();
  lines.add(parsed.data, parsed.meta.linebreak);
  return { kind: "harvests", header: lines.header!, rows: lines.rows };
}

beforeAll(async () => {
  grower = await signInAs("grower@example.com");
  admin = await signInAs("admin@example.com");
  miller = await signInAs("miller@example.com");
});

describe("varieties come from the list", () => {
  it("starts from the common-practice list of sake and table rice", () => {
    expect(readVarietyList().map((v) => v.name)).toEqual(expect.arrayContaining(["Yamada Nishiki", "Omachi", "Gohyakumangoku", "Miyama Nishiki", "Hattan Nishiki", "Koshihikari"]));
  });

  it("refuses a harvest of a variety not on the list (422, field message), changing nothing", async () => {
    const before = await tableDigests();
    const res = await harvest("Sasanishiki");
    expect(res.status).toBe(422);
    expect(res.body.error.fields).toEqual({ variety: [NOT_LISTED] });
    expect(NOT_LISTED).toContain("Settings → Rice varieties");
    expect(await tableDigests()).toEqual(before);
  });

  it("keeps the list's spelling of a name typed in another case", async () => {
    const res = await harvest("  yamada nishiki ");
    expect(res.status).toBe(201);
    expect((await call(getLotRoute, jsonRequest(`/api/lots/${res.body.code}`, { cookie: grower }), { code: res.body.code })).body.variety).toBe("Yamada Nishiki");
  });

  it("refuses the whole CSV file when a row names an unlisted variety", async () => {
    const before = await tableDigests();
    const res = await call(postCommit, jsonRequest("/api/import/commit", { cookie: grower, body: csvBody("harvests-unlisted-variety.csv") }));
    expect(res.status).toBe(422);
    expect(res.body.problems).toEqual([{ line: 3, code: "invalid", fields: { variety: [NOT_LISTED] } }]);
    expect(await tableDigests()).toEqual(before);
  });

  it("is edited by the office only, each change audited; a removed name is refused again", async () => {
    const before = await tableDigests();
    expect(() => addVariety(actor("user-grower"), { name: "Sasanishiki", kind: "table" }, t)).toThrow(expect.objectContaining({ status: 403 }));
    for (const who of ["user-brewer", "user-miller", "user-auditor"]) {
      expect(() => addVariety(actor(who), { name: "Sasanishiki", kind: "table" }, t)).toThrow(expect.objectContaining({ status: 403 }));
      expect(() => removeVariety(actor(who), { name: "Omachi" }, t)).toThrow(expect.objectContaining({ status: 403 }));
    }
    expect(() => addVariety(actor("user-admin"), { name: "OMACHI", kind: "sake" }, t)).toThrow(expect.objectContaining({ status: 422 }));
    expect(await tableDigests()).toEqual(before);
    addVariety(actor("user-admin"), { name: "Sasanishiki", kind: "table" }, t);
    expect(JSON.parse(audits().at(-1)!.detail)).toMatchObject({ variety: "Sasanishiki", change: "added" });
    const accepted = await harvest("Sasanishiki", 100, "field-ikeda-cedar");
    expect(accepted.status).toBe(201);
    removeVariety(actor("user-admin"), { name: "Sasanishiki" }, t);
    expect((await harvest("Sasanishiki")).status).toBe(422);
    // The lot recorded while it was listed keeps its variety.
    expect(getSqlite().prepare("select variety from lots where code = ?").get(accepted.body.code)).toEqual({ variety: "Sasanishiki" });
  });
});

describe("polishing two varieties together", () => {
  let yamada = "";
  const omachi = "H26-0006"; // seeded: Omachi from the co-op, received at the mill and not yet polished
  const run = (attributes?: Record<string, unknown>) =>
    call(postEvent, jsonRequest("/api/events", { cookie: miller, body: { step: "polishing", ...(attributes ? { attributes } : {}), inputs: [{ lot: yamada, quantity: 600 }, { lot: omachi, quantity: 200 }], outputs: [{ kind: "polished", quantity: 480 }, { kind: "bran", quantity: 310 }], measurements: [{ name: "targetPolishingRatioPct", value: 60, unit: "%" }] } }));

  beforeAll(async () => {
    const h = await harvest("Yamada Nishiki", 600);
    yamada = h.body.code;
    expect((await dispatchAndReceive(admin, miller, yamada, 600)).status).toBe(201);
    expect((await lot(omachi)).variety).toBe("Omachi");
  });

  it("is refused without the confirmation (422 on attributes.mixedVarietiesConfirmed), changing nothing", async () => {
    const before = await tableDigests();
    for (const attributes of [undefined, { mixedVarietiesConfirmed: false }, { mixedVarietiesConfirmed: "yes" }]) {
      const res = await run(attributes);
      expect(res.status).toBe(422);
      expect(res.body.error.fields["attributes.mixedVarietiesConfirmed"]).toEqual([t("varietyList.mixConfirm", { varieties: "Yamada Nishiki, Omachi" })]);
    }
    expect(await tableDigests()).toEqual(before);
  });

  it("once confirmed, keeps both varieties with their shares of the rice", async () => {
    const res = await run({ mixedVarietiesConfirmed: true });
    expect(res.status).toBe(201);
    const polished = await lot(res.body.outputs[0].code);
    // 600 kg and 200 kg of brown rice: 75 % and 25 % (worked by hand).
    expect(polished.variety).toBeUndefined();
    expect(polished.attributes.varieties).toEqual([{ variety: "Yamada Nishiki", share: 0.75 }, { variety: "Omachi", share: 0.25 }]);
  });
});
