import "server-only";
import { eq, inArray, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { eventInputs, events, lots, measurements, parties } from "@/db/schema";
import { can, type Permission } from "@/domain/permissions";
import type { EventInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { forbidden, invalid } from "../platform/errors";
import { placeholdersFor, prepared } from "../platform/prepared";
import type { SessionUser } from "../accounts/session";

// The rows every recorded step writes, shared by steps (events.ts) and receipts (receipts.ts).

export type LotRow = typeof lots.$inferSelect;

export function lotByCode(tx: DbOrTx, code: string): LotRow | undefined {
  return prepared(tx, "lot-by-code", (db) => db.select().from(lots).where(eq(lots.code, sql.placeholder("code"))).prepare()).get({ code });
}

export function requireAny(actor: SessionUser, permission: Permission | readonly Permission[]) {
  const list = Array.isArray(permission) ? permission : [permission];
  if (!list.some((p) => can(actor, p as Permission))) throw forbidden();
}

export type NewEvent = Omit<typeof events.$inferInsert, "id" | "corrects">;
const EVENT_FIELDS = ["step", "at", "recordedAt", "userId", "partyId", "counterpartyId", "place", "referenceDoc", "note", "reason", "attributes"] as const;

/** Inserts a step's event row (prepared once per connection: every floor write makes one). */
export function insertEvent(tx: DbOrTx, row: NewEvent): number {
  const statement = prepared(tx, "insert-event", (db) =>
    db
      .insert(events)
      .values(placeholdersFor<NewEvent>(EVENT_FIELDS))
      .returning({ id: events.id })
      .prepare(),
  );
  return statement.get(row as Record<string, unknown>)!.id;
}

type NewEventInput = Omit<typeof eventInputs.$inferInsert, "id">;
const INPUT_FIELDS = ["eventId", "lotId", "quantity", "content", "use", "previousPartyId"] as const;

export function insertEventInput(tx: DbOrTx, row: NewEventInput) {
  prepared(tx, "insert-event-input", (db) =>
    db
      .insert(eventInputs)
      .values(placeholdersFor<NewEventInput>(INPUT_FIELDS))
      .prepare(),
  ).run(row as Record<string, unknown>);
}

export function resolveEventParty(tx: DbOrTx, actor: SessionUser, input: EventInput, t: Translate): string {
  if (!input.partyId || input.partyId === actor.partyId) return actor.partyId;
  // Only the office records on another party's behalf (e.g. a receipt at the mill).
  if (!can(actor, "lots:act-any")) throw forbidden("errors.notYourParty");
  if (!tx.select({ id: parties.id }).from(parties).where(eq(parties.id, input.partyId)).get()) throw invalid({ partyId: [t("validation.unknownParty")] });
  return input.partyId;
}

export function partyKind(tx: DbOrTx, partyId: string) {
  return tx.select({ kind: parties.kind }).from(parties).where(eq(parties.id, partyId)).get()!.kind;
}

export function writeMeasurements(tx: DbOrTx, eventId: number, input: EventInput, held: LotRow[], made: LotRow[], t: Translate) {
  if (!input.measurements.length) return;
  const known = new Map([...held, ...made].map((l) => [l.code, l.id]));
  const rows = input.measurements.map((m, n) => {
    let lotId: number | null = made[0]?.id ?? held[0]?.id ?? null;
    if (m.lot) {
      const id = known.get(m.lot);
      if (id === undefined) throw invalid({ [`measurements.${n}.lot`]: [t("validation.unknownLot")] });
      lotId = id;
    }
    return { eventId, lotId, name: m.name, value: m.value, unit: m.unit };
  });
  const insert = prepared(tx, "insert-measurement", (db) =>
    db
      .insert(measurements)
      .values(placeholdersFor<typeof measurements.$inferInsert>(["eventId", "lotId", "name", "value", "unit"]))
      .prepare(),
  );
  for (const row of rows) insert.run(row);
  const moisture = input.measurements.find((m) => m.name === "moisturePct" && !m.lot);
  if (moisture && made[0]) tx.update(lots).set({ moisturePct: moisture.value }).where(inArray(lots.id, [made[0].id])).run();
}
