import "server-only";
import QRCode from "qrcode";
import { readableMask } from "./qr-readable";
import { labelUrl, MAX_LABEL_CODES } from "@/domain/label-url";
import { parseTypedNumber } from "@/domain/typed-input";
import { eq } from "drizzle-orm";
import { lots, parties } from "@/db/schema";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { findLot, listLots } from "../ledger/lots";
import type { SessionUser } from "../accounts/session";

export type LabelLayout = "sheet" | "bag" | "roll";
export const LABEL_LAYOUTS: readonly LabelLayout[] = ["sheet", "bag", "roll"];
export type ErrorCorrection = "M" | "Q";

// ISO/IEC 18004 asks for a light margin (quiet zone) of 4 modules on every side.
export const QUIET_ZONE_MODULES = 4;
// GS1 General Specifications §5.12.3.1: the smallest QR module (X-dimension) is 0.396 mm.
export const MIN_MODULE_MM = 0.396;
/** Printed width of the QR symbol, quiet zone included: a 70 × 37 mm sheet label less 2 mm edges; most of a 100 mm bag label; a 62 mm roll less 6 mm each side. */
export const QR_WIDTH_MM: Record<LabelLayout, number> = { sheet: 33, bag: 80, roll: 50 };
/**
 * The paper each layout prints on, as CSS @page sizes: A4 label sheets; a 100 × 150 mm
 * thermal label and a 62 mm continuous roll cut at 100 mm, the sizes label printers for
 * shipping and bag labels take (common practice). A bag or roll page is the label itself.
 */
export const PAGE_SIZE: Record<LabelLayout, string> = { sheet: "A4", bag: "100mm 150mm", roll: "62mm 100mm" };
/** One print job's labels at most: 20 A4 sheets' worth, or a long roll. */
export const MAX_LABELS = 480;
export const MAX_COPIES = 200;
/**
 * Polished rice leaves the mill in 30 kg paper bags (common practice in Japan, from memory; brown
 * rice travels in 30 kg bags too, priced by the 60 kg bale). When the mill recorded no bag count
 * on the polishing run, a polished lot gets one label per 30 kg, the last bag part-full.
 */
export const POLISHED_BAG_KG = 30;
/** Sheet labels: 3 × 8 labels of 70 × 37 mm on A4 (210 × 297 mm), a common label stock (common practice). */
export const LABELS_PER_SHEET = 24;
const PNG_PIXELS_PER_MODULE = 10;

/**
 * ISO/IEC 18004 error-correction levels L/M/Q/H recover about 7/15/25/30 % of the symbol.
 * Bags on a brewery floor get wet, scuffed and creased, so labels use Q whenever the
 * bigger Q symbol still keeps its modules at or above the minimum X-dimension at this
 * print width; otherwise M, never lower.
 */
export function pickErrorCorrection(text: string, widthMm: number): ErrorCorrection {
  const modules = QRCode.create(text, { errorCorrectionLevel: "Q" }).modules.size + 2 * QUIET_ZONE_MODULES;
  return widthMm / modules >= MIN_MODULE_MM ? "Q" : "M";
}

/** Print only symbols the floor's decoder has read back (see qr-readable.ts). */
function maskOption(url: string, level: ErrorCorrection) {
  const mask = readableMask(url, level);
  return mask === undefined ? {} : { maskPattern: mask };
}

export function parseLabelLayout(raw: string | string[] | undefined): LabelLayout {
  return raw === "bag" || raw === "roll" ? raw : "sheet";
}

/** The copies field: empty (or anything but a whole number from 1 to MAX_COPIES) means one label per bag. */
export function parseCopies(raw: string | string[] | undefined): number | null {
  const n = parseTypedNumber((Array.isArray(raw) ? raw[0] : raw) ?? "");
  return n !== null && Number.isInteger(n) && n >= 1 && n <= MAX_COPIES ? n : null;
}

/** One label per bag: a harvest's bags as the grower registered them; a polished lot's as the mill recorded them, else one per 30 kg. */
export function bagsOf(lot: { kind: string; quantity: number; attributes: Record<string, unknown> }): { count: number; source: "recorded" | "computed" | "one" } {
  const recorded = lot.attributes.bags;
  if ((lot.kind === "harvest" || lot.kind === "polished") && typeof recorded === "number" && Number.isInteger(recorded) && recorded >= 1) return { count: Math.min(recorded, MAX_COPIES), source: "recorded" };
  if (lot.kind === "polished" && lot.quantity > 0) return { count: Math.min(Math.ceil(lot.quantity / POLISHED_BAG_KG - 1e-9), MAX_COPIES), source: "computed" };
  return { count: 1, source: "one" };
}

/** The party whose run made the lot: for polished rice, the mill. */
function makerName(code: string): string | null {
  return getDb().select({ name: parties.name }).from(lots).innerJoin(parties, eq(parties.id, lots.originPartyId)).where(eq(lots.code, code)).get()?.name ?? null;
}

/**
 * The QR of a lot's label as PNG. Chosen for the smaller (sheet) print, so the same image
 * serves both layouts. Lots the actor may not see are "not found", never "forbidden".
 */
export async function renderLabelPng(actor: SessionUser, code: string, origin: string): Promise<Buffer> {
  const lot = findLot(actor, code);
  if (!lot) throw notFound({ key: "errors.lotNotFound", values: { code } });
  const url = labelUrl(origin, lot);
  const level = pickErrorCorrection(url, QR_WIDTH_MM.sheet);
  return QRCode.toBuffer(url, {
    type: "png",
    errorCorrectionLevel: level,
    ...maskOption(url, level),
    margin: QUIET_ZONE_MODULES,
    scale: PNG_PIXELS_PER_MODULE,
  });
}

export type LabelView = {
  code: string;
  kind: string;
  variety: string | null;
  cropYear: number | null;
  quantity: number;
  unit: string;
  holder: string;
  /** Polished rice: the polishing ratio and the mill that polished it, as the trade prints them on the bag. */
  polishingRatioPct: number | null;
  mill: string | null;
  copies: number;
  bags: "recorded" | "computed" | "one";
  url: string;
  errorCorrection: ErrorCorrection;
  svg: string;
};

export type LabelSheet =
  | { status: "ok"; layout: LabelLayout; labels: LabelView[]; notFound: string[] }
  | { status: "too-many"; layout: LabelLayout; count: number; max: number }
  | { status: "too-many-labels"; layout: LabelLayout; count: number; max: number };

/** Labels for the codes the actor may see; the others come back as "not found" and are not printed. */
export async function buildLabelSheet(actor: SessionUser, codes: readonly string[], layout: LabelLayout, origin: string, copies: number | null = null): Promise<LabelSheet> {
  if (codes.length > MAX_LABEL_CODES) return { status: "too-many", layout, count: codes.length, max: MAX_LABEL_CODES };
  const labels: LabelView[] = [];
  const missing: string[] = [];
  for (const code of codes) {
    const lot = findLot(actor, code);
    if (!lot) {
      missing.push(code);
      continue;
    }
    const url = labelUrl(origin, lot);
    const bags = bagsOf(lot);
    const errorCorrection = pickErrorCorrection(url, QR_WIDTH_MM[layout]);
    const svg = await QRCode.toString(url, { type: "svg", errorCorrectionLevel: errorCorrection, margin: QUIET_ZONE_MODULES, ...maskOption(url, errorCorrection) });
    labels.push({
      code: lot.code,
      kind: lot.kind,
      variety: lot.variety ?? null,
      cropYear: lot.cropYear ?? null,
      quantity: lot.quantity,
      unit: lot.unit,
      holder: lot.party.name,
      polishingRatioPct: lot.kind === "polished" ? (lot.polishingRatioPct ?? null) : null,
      mill: lot.kind === "polished" ? makerName(lot.code) : null,
      copies: copies ?? bags.count,
      bags: copies ? "one" : bags.source,
      url,
      errorCorrection,
      svg,
    });
  }
  const total = labels.reduce((n, l) => n + l.copies, 0);
  if (total > MAX_LABELS) return { status: "too-many-labels", layout, count: total, max: MAX_LABELS };
  return { status: "ok", layout, labels, notFound: missing };
}

/** The actor's newest lots, to tick on the label page without typing codes. */
export function listLabelCandidates(actor: SessionUser, limit = 30) {
  return listLots(actor, { limit }).items.map((lot) => ({ code: lot.code, kind: lot.kind, variety: lot.variety ?? null, cropYear: lot.cropYear ?? null }));
}

/** Each label as many times as it has copies (one per bag), in order. */
export function expandCopies<T extends { copies: number }>(labels: readonly T[]): T[] {
  return labels.flatMap((l) => Array.from({ length: l.copies }, () => l));
}

/** Splits labels into printed pages: 24 per A4 sheet, or one per page for bag and roll labels. */
export function paginateLabels<T>(labels: readonly T[], layout: LabelLayout): T[][] {
  const perPage = layout === "sheet" ? LABELS_PER_SHEET : 1;
  const pages: T[][] = [];
  for (let i = 0; i < labels.length; i += perPage) pages.push(labels.slice(i, i + perPage));
  return pages;
}

/**
 * The polishing ratio as a label prints it: the fraction below 1 % dropped (NTA labelling
 * standard for sake, ../shared/references.md), so a 60.4 % lot prints "60 %".
 */
export function printedRatioPct(pct: number): number {
  return Math.floor(pct + 1e-9);
}
