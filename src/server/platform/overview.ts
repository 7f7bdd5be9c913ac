import "server-only";
import { count, isNull } from "drizzle-orm";
import { fields, outbox, parties, users } from "@/db/schema";
import { getDb } from "./db";

export function overviewCounts() {
  const db = getDb();
  const n = (table: typeof parties | typeof users | typeof fields | typeof outbox) => db.select({ n: count() }).from(table).get()!.n;
  return {
    parties: n(parties),
    users: n(users),
    invited: db.select({ n: count() }).from(users).where(isNull(users.passwordHash)).get()!.n,
    fields: n(fields),
    outbox: n(outbox),
  };
}
