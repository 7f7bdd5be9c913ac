import "server-only";
import { and, eq, type SQL } from "drizzle-orm";
import { z } from "zod";
import type { DbOrTx } from "@/db/client";
import { fields, parties } from "@/db/schema";
import { can } from "@/domain/permissions";
import { harvestCsvRowSchema, IMPORT_COLUMNS, importRequestSchema, MAX_IMPORT_BYTES, MAX_IMPORT_ROWS, noonOn, receiptCsvRowSchema, type ImportKind, type ImportRequest } from "@/lib/validation/csv";
import { eventSchema, harvestSchema } from "@/lib/validation/events";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { getDb } from "../platform/db";
import { breweryTimeZone } from "../platform/settings";
import { AppError, forbidden, invalid, type ErrorCode, type FieldErrors } from "../platform/errors";
import { applyEvent } from "../ledger/events";
import { registerHarvestInTx } from "../ledger/harvests";
import { readJson } from "../platform/http";
import { remember, replay, requestHash } from "../ledger/idempotency";
import type { SessionUser } from "../accounts/session";

export type RowProblem = { line: number; code: ErrorCode; fields: FieldErrors };
export type ImportReport = { kind: ImportKind; rows: number; committed: boolean; problems: RowProblem[]; created: { line: number; code: string }[] };

/** Growers and the office bring in harvests; whoever records receipts (mill, brewery, office) brings in receipts. */
export function importKindsFor(actor: SessionUser): ImportKind[] {
  const kinds: ImportKind[] = [];
  if (can(actor, "harvests:record-own") || can(actor, "harvests:record-any")) kinds.push("harvests");
  if (can(actor, "polishing:record") || can(actor, "brewing:record")) kinds.push("receipts");
  return kinds;
}

/** Reads an import: a bounded body, the schema, then whether this role may import this kind. */
export async function readImportRequest(request: Request, actor: SessionUser, t: Translate): Promise<ImportRequest> {
  if (importKindsFor(actor).length === 0) throw forbidden();
  // The JSON of a 2 MB file's cells: room for quoting and line numbers, no more.
  if (Number(request.headers.get("content-length") ?? 0) > MAX_IMPORT_BYTES * 4) throw invalid({ _: [t("csv.import.tooLarge")] });
  const envelope = await readJson(request, importEnvelopeSchema, t);
  if (!importKindsFor(actor).includes(envelope.kind)) throw forbidden();
  const body = { ...envelope, rows: await parseRows(envelope.rows) };
  const bytes = body.rows.reduce((n, r) => n + r.cells.reduce((m, c) => m + Buffer.byteLength(c) + 1, 0), 0);
  if (bytes > MAX_IMPORT_BYTES) throw invalid({ rows: [t("csv.import.tooLarge")] });
  return body;
}

// The request's rows are checked a slice at a time below: 5,000 rows at once held the event
// loop for up to 200 ms (measured on the loaded 2-core test machine).
const importEnvelopeSchema = importRequestSchema.extend({ rows: z.array(z.unknown()).min(1).max(MAX_IMPORT_ROWS) });
const importRowsSchema = z.array(importRequestSchema.shape.rows.element);
const nextTurn = () => new Promise((resolve) => setImmediate(resolve));

/** The rows against the request's schema, 500 at a time; an issue names its row as in the whole request. */
async function parseRows(rows: unknown[]): Promise<ImportRequest["rows"]> {
  const parsed: ImportRequest["rows"] = [];
  for (let from = 0; from < rows.length; from += 500) {
    if (from > 0) await nextTurn();
    const slice = importRowsSchema.safeParse(rows.slice(from, from + 500));
    if (!slice.success) throw new z.ZodError(slice.error.issues.map((issue) => ({ ...issue, path: ["rows", from + Number(issue.path[0]), ...issue.path.slice(1)] })));
    parsed.push(...slice.data);
  }
  return parsed;
}

/** Thrown to undo a transaction on purpose, carrying what the caller is to answer. */
class Rollback extends Error {
  constructor(readonly response: { status: number; report: ImportReport }) {
    super("import rolled back");
  }
}

function immediately(work: (tx: DbOrTx) => { status: number; report: ImportReport }) {
  try {
    return getDb().transaction(work, { behavior: "immediate" });
  } catch (error) {
    if (error instanceof Rollback) return error.response;
    throw error;
  }
}

/**
 * A preview gives the event loop back after 25 ms of rows (at least 10 rows, at most 200): a
 * harvest row takes about 2 ms on the 2-core test machine, so another request waits about
 * 25 ms behind a preview of any length. A file of 10 rows or fewer is always one chunk.
 */
export const PREVIEW_CHUNK = { minRows: 10, maxRows: 200, ms: 25 };

/**
 * A dry run: every row is written, in order, then undone — a chunk at a time, each chunk in a
 * transaction of its own that is rolled back at its end, with a turn of the event loop between
 * chunks. (One transaction cannot stay open across turns: every request shares the one
 * connection, and would write inside it.) Rows see the earlier rows of their chunk; a clash
 * between rows of different chunks shows at commit, which runs every row in one transaction.
 */
export async function previewImport(actor: SessionUser, body: ImportRequest, t: Translate): Promise<ImportReport> {
  const columns = mapHeader(body.kind, body.header, t);
  const problems: RowProblem[] = [];
  for (let next = 0; next < body.rows.length; ) {
    if (next > 0) await nextTurn();
    const deadline = performance.now() + PREVIEW_CHUNK.ms;
    const rows = body.rows.slice(next, next + PREVIEW_CHUNK.maxRows);
    const chunk = immediately((tx) => {
      const run = runRows(tx, actor, { ...body, rows }, columns, t, (done) => done < PREVIEW_CHUNK.minRows || performance.now() < deadline);
      throw new Rollback({ status: 200, report: { kind: body.kind, rows: run.checked, committed: false, problems: run.problems, created: [] } });
    }).report;
    problems.push(...chunk.problems);
    next += chunk.rows;
  }
  return { kind: body.kind, rows: body.rows.length, committed: false, problems, created: [] };
}

/** The same run, kept only when no row failed; the same Idempotency-Key answers the first commit again. */
export function commitImport(actor: SessionUser, body: ImportRequest, t: Translate, idempotencyKey: string | null) {
  const columns = mapHeader(body.kind, body.header, t);
  // Only a request with an Idempotency-Key is remembered, so only its body is hashed.
  const hash = idempotencyKey ? requestHash({ path: "import", body }) : "";
  return immediately((tx) => {
    const replayed = replay(tx, idempotencyKey, actor.id, hash);
    if (replayed) return { status: replayed.status, report: replayed.body as ImportReport };
    const { problems, created } = runRows(tx, actor, body, columns, t);
    const report = { kind: body.kind, rows: body.rows.length, committed: problems.length === 0, problems, created: problems.length ? [] : created };
    if (problems.length) throw new Rollback({ status: 422, report });
    remember(tx, idempotencyKey, actor.id, hash, { status: 201, body: report });
    return { status: 201, report };
  });
}

/** Where each column sits in the file's header: names matched without regard to case. */
function mapHeader(kind: ImportKind, header: string[], t: Translate): Map<string, number> {
  const { all, optional } = IMPORT_COLUMNS[kind];
  const known = new Map(all.map((c) => [c.toLowerCase(), c]));
  const columns = new Map<string, number>();
  const errors: string[] = [];
  header.forEach((raw, index) => {
    const name = raw.replace(/^\uFEFF/, "").trim();
    const column = known.get(name.toLowerCase());
    if (!name) return;
    if (!column) errors.push(t("csv.import.unknownColumn", { name }));
    else if (columns.has(column)) errors.push(t("csv.import.duplicateColumn", { name }));
    else columns.set(column, index);
  });
  const missing = all.filter((c) => !optional.includes(c) && !columns.has(c));
  if (missing.length) errors.push(t("csv.import.missingColumns", { names: missing.join(", ") }));
  if (errors.length) throw invalid({ header: errors });
  return columns;
}

/** Runs the rows in order while `more(rows done)` says so (a preview's chunk); all of them by default. */
function runRows(tx: DbOrTx, actor: SessionUser, body: ImportRequest, columns: Map<string, number>, t: Translate, more = (_done: number) => true) {
  const importRow = body.kind === "harvests" ? importHarvestRow : importReceiptRow;
  const problems: RowProblem[] = [];
  const created: { line: number; code: string }[] = [];
  let checked = 0;
  for (const { line, cells } of body.rows) {
    if (!more(checked)) break;
    checked += 1;
    try {
      const values = valuesOf(cells, body.header.length, columns, t);
      // A savepoint per row: a row that fails halfway leaves nothing for the rows after it.
      created.push({ line, code: tx.transaction((row) => importRow(row, actor, values, t)) });
    } catch (error) {
      problems.push({ line, ...problemOf(error, body.kind, t) });
    }
  }
  return { problems, created, checked };
}

function valuesOf(cells: string[], width: number, columns: Map<string, number>, t: Translate): Record<string, string> {
  // Short lines are read as blank trailing cells; extra cells are refused unless empty.
  if (cells.slice(width).some((c) => c.trim() !== "")) throw invalid({ _: [t("csv.import.cellCount", { found: cells.length, expected: width })] });
  return Object.fromEntries([...columns].map(([name, index]) => [name, cells[index] ?? ""]));
}

function importHarvestRow(tx: DbOrTx, actor: SessionUser, values: Record<string, string>, t: Translate): string {
  const row = harvestCsvRowSchema.safeParse(values);
  const visible = can(actor, "fields:read-all") ? undefined : eq(fields.growerId, actor.partyId);
  // By id the field is found wherever it is; the harvest then answers another grower's field as
  // unknown, as the API does.
  const fieldId = resolve(tx, fields, values.field, visible, "field", t("validation.unknownField"), t);
  if (!row.success || typeof fieldId !== "string") throw invalid(merge(row, fieldId, t));
  const { field: _field, harvestedOn, ...rest } = row.data;
  const input = harvestSchema.parse({ fieldId, ...rest, ...(harvestedOn ? { at: noonOn(harvestedOn, breweryTimeZone(tx)) } : {}) });
  return registerHarvestInTx(tx, actor, input, t).code;
}

function importReceiptRow(tx: DbOrTx, actor: SessionUser, values: Record<string, string>, t: Translate): string {
  const row = receiptCsvRowSchema.safeParse(values);
  const from = resolve(tx, parties, values.from, undefined, "from", t("validation.unknownCounterparty"), t);
  if (!row.success || typeof from !== "string") throw invalid(merge(row, from, t));
  const { lot, quantity, receivedOn, deliverySlip, place } = row.data;
  const input = eventSchema.parse({
    step: "receiving",
    at: noonOn(receivedOn, breweryTimeZone(tx)),
    inputs: [{ lot, quantity }],
    counterpartyId: from,
    ...(deliverySlip ? { referenceDoc: deliverySlip } : {}),
    ...(place ? { place } : {}),
  });
  applyEvent(tx, actor, input, t);
  return lot;
}

/** Every problem of a row at once: its cells', and the reference it names. */
function merge(row: z.ZodSafeParseResult<unknown>, reference: string | FieldErrors, t: Translate): FieldErrors {
  return { ...(row.success ? {} : cellErrors(row.error, t)), ...(typeof reference === "string" ? {} : reference) };
}

/** A field or party named by its id, or by its exact name among those the importer may see. */
function resolve(tx: DbOrTx, table: typeof fields | typeof parties, ref: string | undefined, scope: SQL | undefined, column: string, unknown: string, t: Translate): string | FieldErrors {
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

function problemOf(error: unknown, kind: ImportKind, t: Translate): { code: ErrorCode; fields: FieldErrors } {
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
