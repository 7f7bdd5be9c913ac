import "server-only";
import { sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { lotCodeCounters } from "@/db/schema";
import { CODE_PREFIX, type LotKind } from "@/domain/steps";
import { placeholdersFor, prepared } from "../platform/prepared";

/** The next code for a kind in a year, e.g. "P26-0012"; called inside the writing transaction (prepared once: an import allocates thousands). */
export function allocateLotCode(tx: DbOrTx, kind: LotKind, at: Date): string {
  const prefix = `${CODE_PREFIX[kind]}${String(at.getUTCFullYear() % 100).padStart(2, "0")}`;
  const row = prepared(tx, "allocate-lot-code", (db) =>
    db
      .insert(lotCodeCounters)
      .values({ ...placeholdersFor<{ prefix: string }>(["prefix"]), last: 1 })
      .onConflictDoUpdate({ target: lotCodeCounters.prefix, set: { last: sql`${lotCodeCounters.last} + 1` } })
      .returning({ last: lotCodeCounters.last })
      .prepare(),
  ).get({ prefix })!;
  return `${prefix}-${String(row.last).padStart(4, "0")}`;
}
