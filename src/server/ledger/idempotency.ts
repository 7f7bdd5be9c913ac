import "server-only";
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { idempotencyKeys } from "@/db/schema";
import { writeTransaction } from "../platform/db";
import { AppError } from "../platform/errors";

export type StoredResponse = { status: number; body: unknown };

export function requestHash(body: unknown): string {
  return createHash("sha256").update(JSON.stringify(body)).digest("hex");
}

/**
 * The first answer given to this key, if any. The same key with another body is a
 * client bug, answered 409 rather than guessed at.
 */
export function replay(tx: DbOrTx, key: string | null, userId: string, hash: string): StoredResponse | null {
  if (!key) return null;
  const row = tx.select().from(idempotencyKeys).where(eq(idempotencyKeys.key, `${userId}:${key}`)).get();
  if (!row) return null;
  if (row.requestHash !== hash) throw new AppError("conflict", "errors.idempotencyKeyReused");
  return { status: row.status, body: JSON.parse(row.response) };
}

export function remember(tx: DbOrTx, key: string | null, userId: string, hash: string, response: StoredResponse): void {
  if (!key) return;
  tx.insert(idempotencyKeys)
    .values({ key: `${userId}:${key}`, userId, requestHash: hash, status: response.status, response: JSON.stringify(response.body), createdAt: new Date() })
    .run();
}

/**
 * A floor write that answers 201: `write` runs in one write transaction, once per
 * Idempotency-Key. A retry with the same key and body gets the first answer again.
 */
export function createOnce(path: string, input: unknown, userId: string, key: string | null, write: (tx: DbOrTx) => unknown): StoredResponse {
  // Only a request with an Idempotency-Key is remembered, so only its body is hashed.
  const hash = key ? requestHash({ path, input }) : "";
  return writeTransaction((tx) => {
    const replayed = replay(tx, key, userId, hash);
    if (replayed) return replayed;
    const response = { status: 201, body: write(tx) };
    remember(tx, key, userId, hash, response);
    return response;
  });
}
