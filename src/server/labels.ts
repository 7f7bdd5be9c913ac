import "server-only";
import QRCode from "qrcode";
import { readableMask } from "./qr-readable";
import { labelUrl, MAX_LABEL_CODES } from "@/domain/label-url";
import { notFound } from "./errors";
import { findLot, listLots } from "./lots";
import type { SessionUser } from "./session";

export type LabelLayout = "sheet" | "bag";
export type ErrorCorrection = "M" | "Q";

// ISO/IEC 18004 asks for a light margin (quiet zone) of 4 modules on every side.
export const QUIET_ZONE_MODULES = 4;
// GS1 General Specifications §5.12.3.1: the smallest QR module (X-dimension) is 0.396 mm.
export const MIN_MODULE_MM = 0.396;
/** Printed width of the QR symbol, quiet zone included: a 70 × 37 mm sheet label less 2 mm edges; most of a 100 mm bag label. */
export const QR_WIDTH_MM: Record<LabelLayout, number> = { sheet: 33, bag: 80 };
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
  return raw === "bag" ? "bag" : "sheet";
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
  url: string;
  errorCorrection: ErrorCorrection;
  svg: string;
};

export type LabelSheet =
  | { status: "ok"; layout: LabelLayout; labels: LabelView[]; notFound: string[] }
  | { status: "too-many"; layout: LabelLayout; count: number; max: number };

/** Labels for the codes the actor may see; the others come back as "not found" and are not printed. */
export async function buildLabelSheet(actor: SessionUser, codes: readonly string[], layout: LabelLayout, origin: string): Promise<LabelSheet> {
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
      url,
      errorCorrection,
      svg,
    });
  }
  return { status: "ok", layout, labels, notFound: missing };
}

/** The actor's newest lots, to tick on the label page without typing codes. */
export function listLabelCandidates(actor: SessionUser, limit = 30) {
  return listLots(actor, { limit }).items.map((lot) => ({ code: lot.code, kind: lot.kind, variety: lot.variety ?? null, cropYear: lot.cropYear ?? null }));
}

/** Splits labels into printed pages: 24 per A4 sheet, or one per page for bags. */
export function paginateLabels<T>(labels: readonly T[], layout: LabelLayout): T[][] {
  const perPage = layout === "bag" ? 1 : LABELS_PER_SHEET;
  const pages: T[][] = [];
  for (let i = 0; i < labels.length; i += perPage) pages.push(labels.slice(i, i + perPage));
  return pages;
}
