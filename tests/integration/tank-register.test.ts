import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { GET as listLotsRoute } from "../../app/api/lots/route";
import { translator } from "@/i18n/messages";
import { getSqlite } from "@/server/platform/db";
import { DEMO_USERS } from "@/server/records/seed";
import type { SessionUser } from "@/server/accounts/session";
import { freeTanks, readTankRegister, saveTank } from "@/server/floor/tank-register";
import { findTankLotByName } from "@/server/floor/tanks";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

// The tank register and a first addition that picks its tank from it. That a mash is started
// from a yeast starter is common practice (no published source; the warning only asks to check).
const en = translator("en");
const t = (key: string, values?: Record<string, string | number>) => en(key as never, values as never);
const actor = (id: string) => DEMO_USERS.find((u) => u.id === id)! as SessionUser;
const m = (name: string, value: number, unit: string) => ({ name, value, unit });
let brewer: string;
let grower: string;
const event = (body: unknown) => call(postEvent, jsonRequest("/api/events", { cookie: brewer, body }));
const tankAudits = () => (getSqlite().prepare("select user_id as userId, detail from audit_log where action = 'settings.updated' and subject = 'tankRegister' order by id").all() as { userId: string; detail: string }[]).map((r) => ({ userId: r.userId, detail: JSON.parse(r.detail) }));

/** A steamed mash portion of `kg`, made from the brewery's polished lot P26-0003. */
async function steamed(kg: number): Promise<string> {
  const soak = await event({ step: "soaking", inputs: [{ lot: "P26-0003", quantity: kg }], outputs: [{ kind: "soaked", quantity: kg * 1.28, use: "mash" }], measurements: [m("soakMinutes", 40, "min"), m("waterTempC", 10, "°C")] });
  const steam = await event({ step: "steaming", inputs: [{ lot: soak.body.outputs[0].code, quantity: kg * 1.28 }], outputs: [{ kind: "steamed", quantity: kg * 1.36 }], measurements: [m("steamMinutes", 50, "min")] });
  expect(steam.status).toBe(201);
  return steam.body.outputs[0].code;
}
const firstAddition = (lot: string, kg: number, tank: Record<string, string>) =>
  event({ step: "mash-addition", attributes: { addition: "first" }, inputs: [{ lot, quantity: kg }], outputs: [{ kind: "tank", quantity: kg + 20, ...tank }], measurements: [m("waterL", 20, "L")] });

beforeAll(async () => {
  brewer = await signInAs("brewer@example.com");
  grower = await signInAs("grower@example.com");
});

describe("the tank register", () => {
  it("is seeded with named tanks, each empty once pressed", () => {
    expect(readTankRegister().map((x) => x.name)).toEqual(["Tank 1", "Tank 2", "Tank 3", "Tank 4", "Tank 5", "Small tank A"]);
    expect(freeTanks().map((x) => x.name)).toContain("Tank 3");
  });

  it("refuses a brewer (403) and changes nothing", async () => {
    const before = await tableDigests();
    expect(() => saveTank(actor("user-brewer"), { name: "Tank 9", capacityL: "1000", location: "", active: "on" }, t)).toThrow(expect.objectContaining({ status: 403 }));
    expect(await tableDigests()).toEqual(before);
  });

  it("adds a tank with an audit entry, refuses a name already taken and bad capacity", async () => {
    const audits = tankAudits().length;
    const { id } = saveTank(actor("user-admin"), { name: "  Tank   7 ", capacityL: "1200", location: "Annex", active: "on" }, t);
    expect(readTankRegister().find((x) => x.id === id)).toEqual({ id, name: "Tank 7", capacityL: 1200, location: "Annex", active: true });
    expect(tankAudits().length).toBe(audits + 1);
    expect(tankAudits().at(-1)).toMatchObject({ userId: "user-admin", detail: { tank: "Tank 7", change: "added" } });
    const before = await tableDigests();
    expect(() => saveTank(actor("user-admin"), { name: "tank 7", capacityL: "900", active: "on" }, t)).toThrow(expect.objectContaining({ status: 422, fields: { name: [t("tankRegister.nameTaken")] } }));
    expect(() => saveTank(actor("user-admin"), { name: "Tank 8", capacityL: "-5", active: "on" }, t)).toThrow(expect.objectContaining({ status: 422 }));
    expect(await tableDigests()).toEqual(before);
  });

  it("deactivates rather than deletes: the tank stays on the register, no longer offered", () => {
    const tank = readTankRegister().find((x) => x.name === "Tank 7")!;
    saveTank(actor("user-admin"), { id: tank.id, name: tank.name, capacityL: "1200", location: "Annex" }, t);
    expect(readTankRegister().find((x) => x.id === tank.id)!.active).toBe(false);
    expect(freeTanks().map((x) => x.id)).not.toContain(tank.id);
    expect(tankAudits().at(-1)!.detail).toMatchObject({ change: "deactivated", before: expect.arrayContaining([expect.objectContaining({ id: tank.id, active: true })]) });
  });
});

describe("a first addition picks a register tank", () => {
  const tank4 = () => readTankRegister().find((x) => x.name === "Tank 4")!;
  let tankLot = "";

  it("records the register entry on the tank lot and warns that there is no starter", async () => {
    const res = await firstAddition(await steamed(50), 68, { tankId: tank4().id });
    expect(res.status).toBe(201);
    expect(res.body.warnings).toEqual([t("tankRegister.noStarter")]);
    tankLot = res.body.outputs[0].code;
    const row = getSqlite().prepare("select attributes from lots where code = ?").get(tankLot) as { attributes: string };
    expect(JSON.parse(row.attributes)).toMatchObject({ tankId: tank4().id, tankName: "Tank 4" });
  });

  it("no longer offers the tank, and refuses a second mash in it (409) changing nothing, by id or by name", async () => {
    expect(freeTanks().map((x) => x.name)).not.toContain("Tank 4");
    const portion = await steamed(20);
    const before = await tableDigests();
    const byId = await firstAddition(portion, 27.2, { tankId: tank4().id });
    expect(byId.status).toBe(409);
    expect(byId.body.error.fields["outputs.0.tankId"]).toEqual([t("errors.tankInUse", { name: "Tank 4", code: tankLot })]);
    const byName = await firstAddition(portion, 27.2, { tankName: "tank 4" });
    expect(byName.status).toBe(409);
    expect(await tableDigests()).toEqual(before);
  });

  it("refuses a name that is not on the register, and a deactivated tank (422)", async () => {
    const portion = await steamed(10);
    const before = await tableDigests();
    const unknown = await firstAddition(portion, 13.6, { tankName: "Tank 99" });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.fields["outputs.0.tankName"]).toEqual([t("tankRegister.notOnRegister")]);
    const off = await firstAddition(portion, 13.6, { tankName: "Tank 7" });
    expect(off.status).toBe(422);
    expect(await tableDigests()).toEqual(before);
  });

  it("refuses to deactivate a tank that holds mash (409)", () => {
    const tank = tank4();
    expect(() => saveTank(actor("user-admin"), { id: tank.id, name: tank.name, capacityL: String(tank.capacityL), location: tank.location }, t)).toThrow(expect.objectContaining({ status: 409 }));
    expect(tank4().active).toBe(true);
  });

  it("finds the tank lot by its name for the brewery, and for no other party", async () => {
    expect(findTankLotByName(actor("user-brewer"), "  TANK 4 ")!.code).toBe(tankLot);
    // Another party's tank answers as a name that does not exist.
    expect(findTankLotByName(actor("user-grower"), "Tank 4")).toBeNull();
    const mine = await call(listLotsRoute, jsonRequest("/api/lots?q=Tank%204", { cookie: brewer }));
    expect(mine.body.items.map((l: { code: string }) => l.code)).toEqual([tankLot]);
    const theirs = await call(listLotsRoute, jsonRequest("/api/lots?q=Tank%204", { cookie: grower }));
    expect(theirs.body.items).toEqual([]);
  });

  it("offers the tank again once the mash is pressed off, and adds no warning with a starter", async () => {
    const press = await event({ step: "pressing", inputs: [{ lot: tankLot, quantity: 88 }], outputs: [{ kind: "sake", quantity: 90 }] });
    expect(press.status).toBe(201);
    expect(freeTanks().map((x) => x.name)).toContain("Tank 4");
    // Common practice: a starter (moto) in the first addition.
    const st = await steamed(10);
    const koji = getSqlite().prepare("select code from lots where kind = 'koji' and on_hand > 5 and party_id = 'brewery-kirinoha' order by id desc").get() as { code: string } | undefined;
    const starter = await event({ step: "starter", inputs: [{ lot: st, quantity: 13.6 }, ...(koji ? [{ lot: koji.code, quantity: 2 }] : [])], outputs: [{ kind: "starter", quantity: 20 }], measurements: [m("waterL", 5, "L")] });
    expect(starter.status).toBe(201);
    const res = await event({ step: "mash-addition", attributes: { addition: "first" }, inputs: [{ lot: starter.body.outputs[0].code, quantity: 20 }], outputs: [{ kind: "tank", quantity: 30, tankId: tank4().id }], measurements: [m("waterL", 10, "L")] });
    expect(res.status).toBe(201);
    expect(res.body.warnings).toEqual([]);
    expect(findTankLotByName(actor("user-brewer"), "Tank 4")!.code).toBe(res.body.outputs[0].code);
  });
});
