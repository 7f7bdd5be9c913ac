import { z } from "zod";
import { GRADES, hundredthsOf, MAX_MOISTURE_PCT } from "@/domain/grades";
import type { MoistureStepPct } from "@/domain/supplier-prices";
import { isInvoiceNumber, normaliseInvoiceNumber } from "@/domain/invoice-number";
import { PAYMENT_METHODS, ROUNDINGS } from "@/domain/money";
import { ENTRY_RATES } from "@/domain/tax";
import { fieldErrorsFrom, type Translate } from "./field-errors";
import { typedNumber } from "./typed";

/** Whole yen; forms send strings as people type them ("1,260", full width), the API numbers. */
const yen = (min: number, max = 1_000_000_000) => typedNumber(min, max, { int: true });
const optionalYen = (min: number) => z.preprocess((v) => (v === "" ? undefined : v), yen(min).optional());
const figure = (min: number, max: number) => typedNumber(min, max);
const text = (max: number) => z.string().trim().max(max);
const day = z.iso.date();

export const invoiceNumberSchema = z.object({
  invoiceNumber: z
    .string()
    .transform(normaliseInvoiceNumber)
    .refine((v) => v === "" || isInvoiceNumber(v), { message: "suppliers.validation.invoiceNumber" }),
});

export const growerContractSchema = z.object({
  variety: text(60).min(1),
  cropYear: figure(2000, 2100).pipe(z.number().int()),
  prices: z.object(Object.fromEntries(GRADES.map((g) => [g, optionalYen(0)])) as Record<(typeof GRADES)[number], ReturnType<typeof optionalYen>>),
  moistureStepPct: z.union([z.literal("0.1"), z.literal("0.5"), z.literal("1"), z.literal(0.1), z.literal(0.5), z.literal(1)]).transform((v) => Number(v) as MoistureStepPct),
  // The contract's own threshold; left blank, the MAFF ceiling for graded brown rice (15.0 %).
  moistureThresholdPct: z
    .preprocess((v) => (typeof v === "string" && v.trim() === "" ? undefined : v), figure(10, 20).optional())
    .refine((v) => v === undefined || Math.abs(v * 100 - hundredthsOf(v)) < 1e-6, { message: "suppliers.validation.hundredths" })
    .transform((v) => v ?? MAX_MOISTURE_PCT),
  moistureDeductionYen: yen(0, 1_000_000),
  note: text(500).default(""),
}).refine((c) => Object.values(c.prices).some((p) => p !== undefined), { path: ["prices"], message: "suppliers.validation.needsPrice" });
export type GrowerContractInput = z.infer<typeof growerContractSchema>;

/** Tiers are written "up to" a target ratio; the last, open one covers every target above. */
export const millContractSchema = z.object({
  tiers: z
    .array(z.object({ upToRatioPct: z.preprocess((v) => (v === "" ? null : v), figure(1, 100).nullable()), feePerKgYen: optionalYen(0) }))
    .max(8)
    .transform((tiers) => tiers.filter((t) => t.feePerKgYen !== undefined) as { upToRatioPct: number | null; feePerKgYen: number }[])
    .refine((tiers) => tiers.length > 0, { message: "suppliers.validation.needsTier" })
    .refine((tiers) => tiers.filter((t) => t.upToRatioPct === null).length <= 1, { message: "suppliers.validation.oneOpenTier" })
    .refine((tiers) => new Set(tiers.map((t) => t.upToRatioPct)).size === tiers.length, { message: "suppliers.validation.tiersDiffer" }),
  note: text(500).default(""),
});
export type MillContractInput = z.infer<typeof millContractSchema>;

export { PAYMENT_METHODS };

export const paymentSchema = z.object({
  date: day,
  amountYen: yen(1),
  method: z.enum(PAYMENT_METHODS),
  reference: text(100).default(""),
  // Confirms a payment larger than the balance owed (src/server/suppliers/supplier-payments.ts).
  overpaymentReason: text(500).default(""),
});
export type PaymentInput = z.infer<typeof paymentSchema>;

/** Why a payment is reversed: it stays on the account beside the reversal. */
export const reversalSchema = z.object({ reason: text(500).min(3) });

export const adjustmentSchema = z.object({
  date: day,
  // Positive: the brewery owes more; negative: less.
  amountYen: yen(-1_000_000_000).refine((v) => v !== 0, { message: "suppliers.validation.notZero" }),
  taxRatePct: z.preprocess((v) => (typeof v === "string" ? Number(v) : v), z.union(ENTRY_RATES.map((r) => z.literal(r)) as [z.ZodLiteral<0>, z.ZodLiteral<8>, z.ZodLiteral<10>])),
  reason: text(500).min(3),
});
export type AdjustmentInput = z.infer<typeof adjustmentSchema>;

export const statementSchema = z
  .object({ from: day, to: day, email: z.union([z.boolean(), z.literal("on"), z.literal("")]).optional().transform((v) => v === true || v === "on") })
  .refine((s) => s.from <= s.to, { path: ["to"], message: "suppliers.validation.rangeOrder" });
export type StatementInput = z.infer<typeof statementSchema>;

export const roundingSchema = z.object({ rounding: z.enum(ROUNDINGS) });

/** Zod issues as field messages; the supplier rules speak from the suppliers catalogue. */
export function supplierFieldErrors(error: z.ZodError, t: Translate): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const own = issue.message.startsWith("suppliers.");
    const part = own ? { [issue.path.join(".") || "_"]: [t(issue.message)] } : fieldErrorsFrom(new z.ZodError([issue]), t);
    for (const [field, messages] of Object.entries(part)) (out[field] ??= []).push(...messages);
  }
  return out;
}

/** Parses with a schema or throws the field errors as an application error (422). */
export function parseSupplierInput<S extends z.ZodType>(schema: S, raw: unknown, t: Translate, fail: (fields: Record<string, string[]>) => Error): z.infer<S> {
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw fail(supplierFieldErrors(parsed.error, t));
  return parsed.data;
}
