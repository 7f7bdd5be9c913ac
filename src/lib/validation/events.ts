import { z } from "zod";
import { GRADES } from "@/domain/grades";
import { API_STEPS, LOT_KIND_LIST } from "@/domain/steps";

const MAX_QTY = 10_000_000;
export const lotCode = z.string().trim().toUpperCase().min(1).max(20);
const quantity = z.number().finite().min(0).max(MAX_QTY);
const positive = z.number().finite().positive().max(MAX_QTY);
const text = (max: number) => z.string().trim().max(max);
const attributeValue = z.union([z.string().max(200), z.number().finite(), z.boolean()]);

/**
 * Event-level attributes are stored as one JSON text on the event and read on every trace:
 * flat (a value is a string, number or boolean, never an object, so depth is 1), at most 32
 * names and 4 KB as stored. A mash addition or a koji start needs a handful.
 */
export const MAX_EVENT_ATTRIBUTES = 32;
export const MAX_EVENT_ATTRIBUTE_BYTES = 4096;
const storedBytes = (value: unknown) => new TextEncoder().encode(JSON.stringify(value)).length;
const eventAttributes = z
  .record(z.string().regex(/^[A-Za-z][A-Za-z0-9]*$/).max(40), attributeValue)
  .refine((a) => Object.keys(a).length <= MAX_EVENT_ATTRIBUTES, { message: "validation.attributesTooMany" })
  .refine((a) => storedBytes(a) <= MAX_EVENT_ATTRIBUTE_BYTES, { message: "validation.attributesTooLarge" });

export const eventInputSchema = z.object({ lot: lotCode, quantity });

/** A new lot (kind, quantity, unit, and the trade's attributes beside them) or an existing lot to add to. */
export const eventOutputSchema = z.union([
  z.object({ lot: lotCode, quantity: positive }).strict(),
  z
    .object({ kind: z.enum(LOT_KIND_LIST), quantity: positive, unit: z.enum(["kg", "L", "bottle"]).optional() })
    .catchall(attributeValue)
    .refine((o) => Object.keys(o).length <= 20, { message: "validation.tooManyAttributes" }),
]);

export const measurementSchema = z.object({
  name: text(60).min(1).regex(/^[A-Za-z][A-Za-z0-9]*$/, { message: "validation.measurementName" }),
  value: z.number().finite(),
  unit: text(20),
  lot: lotCode.optional(),
});

export const eventSchema = z
  .object({
    step: z.enum(API_STEPS),
    at: z.iso.datetime({ offset: true }).optional(),
    inputs: z.array(eventInputSchema).max(50).default([]),
    outputs: z.array(eventOutputSchema).max(50).default([]),
    measurements: z.array(measurementSchema).max(100).default([]),
    counterpartyId: z.string().min(1).max(64).optional(),
    partyId: z.string().min(1).max(64).optional(),
    place: text(200).optional(),
    referenceDoc: text(100).optional(),
    note: text(2000).optional(),
    corrects: z.number().int().positive().optional(),
    reason: text(500).optional(),
    // Step details that belong to the event, not to one lot (e.g. which mash addition).
    attributes: eventAttributes.optional(),
  })
  .strict();
export type EventInput = z.infer<typeof eventSchema>;
export type NewOutput = { kind: (typeof LOT_KIND_LIST)[number]; quantity: number; unit?: string; [attribute: string]: unknown };

export const harvestSchema = z
  .object({
    fieldId: z.string().min(1).max(64),
    variety: text(60).min(1),
    cropYear: z.number().int().min(2000).max(2100),
    brownKg: positive,
    moisturePct: z.number().finite().min(5).max(40),
    grade: z.enum(GRADES),
    bags: z.number().int().min(0).max(100_000),
    at: z.iso.datetime({ offset: true }).optional(),
  })
  .strict();
export type HarvestInput = z.infer<typeof harvestSchema>;
