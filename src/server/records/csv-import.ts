import "server-only";
import { z } from "zod";
import type { DbOrTx } from "@/db/client";
import { can } from "@/domain/permissions";
import { IMPORT_COLUMNS, importRequestSchema, MAX_IMPORT_BYTES, MAX_IMPORT_ROWS, type ImportKind, type ImportRequest } from "@/lib/validation/csv";
import type { Translate } from "@/lib/validation/field-errors";
import { getDb } from "../platform/db";
import { forbidden, invalid } from "../platform/errors";
import { writeHarvest, type CheckedHarvest } from "../ledger/harvests";
import { readJson } from "../platform/http";
import { remember, replay, requestHash } from "../ledger/idempotency";
import type { SessionUser } from "../accounts/session";
import { harvestFile, type HarvestRowCheck } from "./harvest-import";
import { problemOf, valuesOf, type RowProblem } from "./import-cells";
import { runReceiptRows } from "./receipt-import";

export type { RowProblem } from "./import-cells";
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
class Rollback<T> extends Error {
  constructor(readonly answer: T) {
    super("import rolled back");
  }
}

function immediately<T>(work: (tx: DbOrTx) => T): T {
  try {
    return getDb().transaction(work, { behavior: "immediate" });
  } catch (error) {
    if (error instanceof Rollback) return error.answer as T;
    throw error;
  }
}

/**
 * A preview gives the event loop back after 25 ms of rows (at least 10 rows, at most 200): a
 * receipt row is written and undone, about 2 ms on the 2-core test machine, so another request
 * waits about 25 ms behind a preview of any length. A file of 10 rows or fewer is always one chunk.
 */
export const PREVIEW_CHUNK = { minRows: 10, maxRows: 200, ms: 25 };

type More = (done: number) => boolean;

/**
 * Checks every row, in order, a chunk at a time with a turn of the event loop between chunks.
 * Harvest rows are checked by reading alone (harvest-import.ts). Receipt rows are written and
 * undone: each chunk in a transaction of its own that is rolled back at its end (one
 * transaction cannot stay open across turns: every request shares the one connection, and
 * would write inside it). Rows see the earlier rows of their chunk; a clash between receipts
 * of different chunks shows at commit, which runs every row in one transaction.
 */
export async function previewImport(actor: SessionUser, body: ImportRequest, t: Translate): Promise<ImportReport> {
  const columns = mapHeader(body.kind, body.header, t);
  const problems: RowProblem[] = [];
  // What harvest rows read (fields, the variety list, the clock) is read once for the request.
  const checkRow = body.kind === "harvests" ? harvestFile(getDb(), actor, t) : null;
  for (let next = 0; next < body.rows.length; ) {
    if (next > 0) await nextTurn();
    const deadline = performance.now() + PREVIEW_CHUNK.ms;
    const more: More = (done) => done < PREVIEW_CHUNK.minRows || performance.now() < deadline;
    const chunk = { ...body, rows: body.rows.slice(next, next + PREVIEW_CHUNK.maxRows) };
    const run = checkRow ? checkHarvestRows(checkRow, chunk, columns, t, more) : dryRunReceipts(actor, chunk, columns, t, more);
    problems.push(...run.problems);
    next += run.checked;
  }
  return { kind: body.kind, rows: body.rows.length, committed: false, problems, created: [] };
}

function dryRunReceipts(actor: SessionUser, body: ImportRequest, columns: Map<string, number>, t: Translate, more: More): { problems: RowProblem[]; checked: number } {
  return immediately((tx) => {
    throw new Rollback(runReceiptRows(tx, actor, body, columns, t, more));
  });
}

/** The same rows, kept only when no row failed; the same Idempotency-Key answers the first commit again. */
export function commitImport(actor: SessionUser, body: ImportRequest, t: Translate, idempotencyKey: string | null) {
  const columns = mapHeader(body.kind, body.header, t);
  // Only a request with an Idempotency-Key is remembered, so only its body is hashed.
  const hash = idempotencyKey ? requestHash({ path: "import", body }) : "";
  return immediately((tx): { status: number; report: ImportReport } => {
    const replayed = replay(tx, idempotencyKey, actor.id, hash);
    if (replayed) return { status: replayed.status, report: replayed.body as ImportReport };
    const { problems, created } = body.kind === "harvests" ? commitHarvestRows(tx, actor, body, columns, t) : runReceiptRows(tx, actor, body, columns, t);
    const report = { kind: body.kind, rows: body.rows.length, committed: problems.length === 0, problems, created: problems.length ? [] : created };
    if (problems.length) throw new Rollback({ status: 422, report });
    remember(tx, idempotencyKey, actor.id, hash, { status: 201, body: report });
    return { status: 201, report };
  });
}

/** Every harvest row is checked before the first is written: a file with a bad row writes nothing. */
function commitHarvestRows(tx: DbOrTx, actor: SessionUser, body: ImportRequest, columns: Map<string, number>, t: Translate) {
  const { problems, good } = checkHarvestRows(harvestFile(tx, actor, t), body, columns, t);
  const created = problems.length ? [] : good.map(({ line, harvest }) => ({ line, code: writeHarvest(tx, actor, harvest).code }));
  return { problems, created };
}

/** The harvest rows in order while `more(rows done)` says so (a preview's chunk); all of them by default. */
function checkHarvestRows(checkRow: HarvestRowCheck, body: ImportRequest, columns: Map<string, number>, t: Translate, more: More = () => true) {
  const problems: RowProblem[] = [];
  const good: { line: number; harvest: CheckedHarvest }[] = [];
  let checked = 0;
  for (const { line, cells } of body.rows) {
    if (!more(checked)) break;
    checked += 1;
    try {
      good.push({ line, harvest: checkRow(valuesOf(cells, body.header.length, columns, t)) });
    } catch (error) {
      problems.push({ line, ...problemOf(error, "harvests", t) });
    }
  }
  return { problems, good, checked };
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
