import { z } from "zod";
import { parseTypedDate, parseTypedNumber } from "@/domain/typed-input";

/**
 * Zod pieces for what forms and CSV files send as text: "1,260", "１３.５", "2026/10/03".
 * A number or a Date already parsed passes through, so the same schema reads JSON too.
 * Text that is not a number keeps a message a person can act on (`validation.number`).
 */
const blank = (v: unknown) => v === undefined || v === null || (typeof v === "string" && v.trim() === "");

function toNumber(v: unknown, ctx: z.RefinementCtx, int: boolean): unknown {
  if (typeof v !== "string") return v;
  const n = parseTypedNumber(v);
  if (n === null) {
    ctx.addIssue({ code: "custom", message: int ? "validation.wholeNumber" : "validation.number" });
    return z.NEVER;
  }
  return n;
}

type NumberOptions = { int?: boolean; positive?: boolean };

function numberSchema(min: number, max: number, { int = false, positive = false }: NumberOptions) {
  const kind = int ? "validation.wholeNumber" : "validation.number";
  // Only the type issue is worded here; bounds keep zod's own codes, which field-errors words.
  let n = z.number({ error: (issue) => (issue.code !== "invalid_type" ? undefined : issue.input === undefined ? "validation.required" : kind) }).finite().min(min).max(max);
  if (positive) n = n.positive();
  return int ? n.int({ message: "validation.wholeNumber" }) : n;
}

/** A required number typed by a person, between min and max. */
export function typedNumber(min: number, max: number, options: NumberOptions = {}) {
  return z.preprocess((v, ctx) => (blank(v) ? undefined : toNumber(v, ctx, options.int ?? false)), numberSchema(min, max, options));
}

/** The same, where a blank box means "not given". */
export function optionalTypedNumber(min: number, max: number, options: NumberOptions = {}) {
  return z.preprocess((v, ctx) => (blank(v) ? undefined : toNumber(v, ctx, options.int ?? false)), numberSchema(min, max, options).optional());
}

function toDay(v: unknown, ctx: z.RefinementCtx): unknown {
  if (typeof v !== "string") return v;
  const day = parseTypedDate(v);
  if (day === null) {
    ctx.addIssue({ code: "custom", message: "validation.date" });
    return z.NEVER;
  }
  return day;
}

const daySchema = z.string({ error: (issue) => (issue.code !== "invalid_type" ? undefined : issue.input === undefined ? "validation.required" : "validation.date") }).regex(/^\d{4}-\d{2}-\d{2}$/, { message: "validation.date" });

/** A required calendar day typed as 2026/10/03, 2026-10-03 or 2026年10月3日, read as "YYYY-MM-DD". */
export function typedDate() {
  return z.preprocess((v, ctx) => (blank(v) ? undefined : toDay(v, ctx)), daySchema);
}

/** The same, where a blank box means "not given". */
export function optionalTypedDate() {
  return z.preprocess((v, ctx) => (blank(v) ? undefined : toDay(v, ctx)), daySchema.optional());
}
