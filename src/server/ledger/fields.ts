import "server-only";
import { asc, eq } from "drizzle-orm";
import { generateIdFromEntropySize } from "lucia";
import { fields, parties } from "@/db/schema";
import { can, canRecordOnField } from "@/domain/permissions";
import type { FieldInput } from "@/lib/validation/fields";
import type { Translate } from "@/lib/validation/field-errors";
import { recordAudit } from "../records/audit";
import { getDb } from "../platform/db";
import { forbidden, invalid } from "../platform/errors";
import type { SessionUser } from "../accounts/session";

const columns = {
  id: fields.id,
  name: fields.name,
  region: fields.region,
  areaHa: fields.areaHa,
  growerId: fields.growerId,
  growerName: parties.name,
  latitude: fields.latitude,
  longitude: fields.longitude,
};

/** Growers see their own paddies; roles that read all records see every grower's. */
export function listFields(actor: SessionUser) {
  const q = getDb().select(columns).from(fields).innerJoin(parties, eq(parties.id, fields.growerId));
  if (can(actor, "fields:read-all")) return q.orderBy(asc(parties.name), asc(fields.name)).all();
  if (can(actor, "fields:write-own")) return q.where(eq(fields.growerId, actor.partyId)).orderBy(asc(fields.name)).all();
  throw forbidden();
}

export function createField(actor: SessionUser, input: FieldInput, t: Translate) {
  // A grower may leave growerId out; naming another grower is refused, not silently changed.
  const growerId = input.growerId ?? (can(actor, "fields:write-any") ? undefined : actor.partyId);
  if (!growerId) throw invalid({ growerId: [t("validation.required")] });
  if (!canRecordOnField(actor, { growerId })) throw forbidden("errors.notYourFarm");
  const id = generateIdFromEntropySize(10);
  getDb().transaction((tx) => {
    const grower = tx.select({ kind: parties.kind }).from(parties).where(eq(parties.id, growerId)).get();
    if (grower?.kind !== "grower") throw invalid({ growerId: [t("validation.unknownGrower")] });
    const { growerId: _ignored, ...rest } = input;
    tx.insert(fields).values({ id, growerId, ...rest, createdAt: new Date() }).run();
    recordAudit(tx, { userId: actor.id, action: "field.created", subject: id, detail: { name: input.name, growerId } });
  });
  return { id };
}
