import "server-only";
import { randomBytes } from "node:crypto";
import { sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { can } from "@/domain/permissions";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { tankEntrySchema } from "@/lib/validation/registers";
import { getDb } from "../platform/db";
import { AppError, forbidden, invalid } from "../platform/errors";
import { readMasterList, writeMasterList } from "./master-lists";
import type { SessionUser } from "../accounts/session";

/** A tank of the brewery's register; deactivated, never deleted, so old tank lots keep their name. */
export type TankEntry = { id: string; name: string; capacityL: number; location: string; active: boolean };

const EPS = 1e-6;
const nameKey = (name: string) => name.trim().replace(/\s+/g, " ").toLowerCase();

export function readTankRegister(db: DbOrTx = getDb()): TankEntry[] {
  return readMasterList<TankEntry>(db, "tankRegister", []);
}

/** The tank lot still holding mash in this tank (not yet pressed off), if any. */
export function tankOccupant(db: DbOrTx, tank: TankEntry): string | null {
  const row = db.get<{ code: string }>(sql`
    select code from lots where kind = 'tank' and on_hand > ${EPS}
      and (json_extract(attributes, '$.tankId') = ${tank.id} or lower(json_extract(attributes, '$.tankName')) = ${nameKey(tank.name)})
    order by id desc limit 1`);
  return row?.code ?? null;
}

/** The register with what each tank holds now: what the office list and the floor form show. */
export function tankRegisterWithContents(db: DbOrTx = getDb()) {
  return readTankRegister(db).map((tank) => ({ ...tank, holds: tankOccupant(db, tank) }));
}

/** Adds a tank (no id) or changes one; names stay unique, a tank holding mash stays active. */
export function saveTank(actor: SessionUser, raw: unknown, t: Translate): { id: string } {
  if (!can(actor, "settings:manage")) throw forbidden();
  const parsed = tankEntrySchema.safeParse(raw);
  if (!parsed.success) throw invalid(fieldErrorsFrom(parsed.error, t));
  const input = parsed.data;
  return getDb().transaction((tx) => {
    const before = readTankRegister(tx);
    const current = input.id ? before.find((x) => x.id === input.id) : undefined;
    if (input.id && !current) throw invalid({ id: [t("tankRegister.unknownTank")] });
    if (before.some((x) => x.id !== input.id && nameKey(x.name) === nameKey(input.name))) throw invalid({ name: [t("tankRegister.nameTaken")] });
    const entry: TankEntry = { id: current?.id ?? `tank-${randomBytes(6).toString("hex")}`, name: input.name.replace(/\s+/g, " "), capacityL: input.capacityL, location: input.location, active: current ? input.active : true };
    if (current && !entry.active) {
      const holds = tankOccupant(tx, current);
      if (holds) throw new AppError("conflict", { key: "errors.tankInUse", values: { name: current.name, code: holds } }, { active: [t("errors.tankInUse", { name: current.name, code: holds })] });
    }
    if (current && JSON.stringify(current) === JSON.stringify(entry)) return { id: entry.id };
    const after = current ? before.map((x) => (x.id === entry.id ? entry : x)) : [...before, entry];
    writeMasterList(tx, "tankRegister", before, after, actor.id, { tank: entry.name, change: current ? (current.active && !entry.active ? "deactivated" : "changed") : "added" });
    return { id: entry.id };
  });
}

/**
 * The register entry a first addition fills: picked by id (the floor form) or by its name (the
 * API). A brewery without a register may still name a tank freely; with one, the tank must be
 * on it, active and empty — a tank still holding an unpressed mash takes no new one.
 */
export function resolveFirstAdditionTank(tx: DbOrTx, spec: Record<string, unknown>, t: Translate): { tankId: string; tankName: string } | null {
  const register = readTankRegister(tx).filter((x) => x.active);
  const id = typeof spec.tankId === "string" ? spec.tankId : undefined;
  const name = typeof spec.tankName === "string" ? spec.tankName : undefined;
  if (id === undefined && (name === undefined || register.length === 0)) return null;
  const tank = id !== undefined ? register.find((x) => x.id === id) : register.find((x) => nameKey(x.name) === nameKey(name!));
  const field = id !== undefined ? "outputs.0.tankId" : "outputs.0.tankName";
  if (!tank) throw invalid({ [field]: [t("tankRegister.notOnRegister")] });
  const holds = tankOccupant(tx, tank);
  if (holds) throw new AppError("conflict", { key: "errors.tankInUse", values: { name: tank.name, code: holds } }, { [field]: [t("errors.tankInUse", { name: tank.name, code: holds })] });
  return { tankId: tank.id, tankName: tank.name };
}

/** Active tanks with no unpressed mash: what the floor's first addition offers. */
export function freeTanks(db: DbOrTx = getDb()) {
  return tankRegisterWithContents(db)
    .filter((x) => x.active && !x.holds)
    .map(({ id, name, capacityL, location }) => ({ id, name, capacityL, location }));
}
