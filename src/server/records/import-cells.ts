import "server-only";
import { and, eq, type SQL } from "drizzle-orm";
import { z } from "zod";
import type { DbOrTx } from "@/db/client";
import { fields, parties } from "@/db/schema";
import type { ImportKind } from "@/lib/validation/csv";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { AppError, invalid, type ErrorCode, type FieldErrors } from "../platform/errors";

// A file's cells as the import reads them, and a row's problems as the page shows them.

export type RowProblem = { line: number; code: ErrorCode; fields: FieldErrors };

export function valuesOf(cells: string[], width: number, columns: Map<string, number>, t: Translate): Record<string, string> {
  // Short lines are read as blank trailing cells; extra cells are refused unless empty.
  if (cells.slice(width).some((c) => c.trim() !== "")) throw invalid({ _: [t("csv.import.cellCount", { found: cells.length, expected: width })] });
  return Object.fromEntries([...columns].map(([name, index]) => [name, cells[index] ?? ""]));
}

/** Every problem of a row at once: its cells', and the reference it names. */
export function merge(row: z.ZodSafeParseResult<unknown>, reference: string | FieldErrors, t: Translate): FieldErrors {
  return { ...(row.success ? {} : cellErrors(row.error, t)), ...(typeof reference === "string" ? {} : reference) };
}

/** A field or party named by its id, or by its exact name among those the importer may see. */
export function resolve(tx: DbOrTx, table: typeof fields | typeof parties, ref: string | undefined, scope: SQL | undefined, column: string, unknown: string, t: Translate): string | FieldErrors {
  const value = ref?.trim() ?? "";
  if (!value) return {};
  if (tx.select({ id: table.id }).from(table).where(eq(table.id, value)).get()) return value;
  const named = tx.select({ id: table.id }).from(table).where(and(eq(table.name, value), scope)).limit(2).all();
  if (named.length === 1) return named[0]!.id;
  return { [column]: [named.length ? t("csv.import.ambiguousName") : unknown] };
}

// The events layer names inputs as the API does; the file names them by its columns.
const COLUMN_OF: Record<ImportKind, Record<string, string>> = {
  harvests: { fieldId: "field", at: "harvestedOn" },
  receipts: { inputs: "lot", "inputs.0.lot": "lot", "inputs.0.quantity": "quantity", counterpartyId: "from", referenceDoc: "deliverySlip", at: "receivedOn" },
};

export function problemOf(error: unknown, kind: ImportKind, t: Translate): { code: ErrorCode; fields: FieldErrors } {
  const rename = (f: FieldErrors) => Object.fromEntries(Object.entries(f).map(([k, v]) => [COLUMN_OF[kind][k] ?? k, v]));
  if (error instanceof z.ZodError) return { code: "invalid", fields: rename(cellErrors(error, t)) };
  if (error instanceof AppError) return { code: error.code, fields: rename(error.fields ?? { _: [error.say(t)] }) };
  throw error;
}

/** Zod issues as field messages; this area's own messages ("csv.…") are translated here. */
function cellErrors(error: z.ZodError, t: Translate): FieldErrors {
  const own = error.issues.filter((i) => i.message.startsWith("csv."));
  const rest = error.issues.filter((i) => !i.message.startsWith("csv."));
  const out = rest.length ? fieldErrorsFrom(new z.ZodError(rest), t) : {};
  for (const issue of own) (out[issue.path.join(".") || "_"] ??= []).push(t(issue.message));
  return out;
}
