import "server-only";
import type { DbOrTx } from "@/db/client";
import { isValidGtin, toGtin14 } from "@/domain/gtin";
import type { Translate } from "@/lib/validation/field-errors";
import { claimsForLot } from "../trace/claims";
import type { FieldErrors } from "../platform/errors";
import { findProduct, type Product } from "./products";

type Checked = { product: Product | null; attributes: Record<string, unknown>; warnings: string[] };

/**
 * The product a bottling names: the bottle's GTIN and size must be the product's, and the
 * category its label claims is held against the claims of the sake bottled (NTA labelling
 * standard, src/domain/categories.ts). A claim the records do not support is a warning, not a
 * refusal: the records may lag the paperwork, and the labelling decision is the brewery's.
 */
export function checkBottlingProduct(tx: DbOrTx, spec: Record<string, unknown>, source: { id: number; code: string; kind: string }, t: Translate, errors: FieldErrors): Checked {
  if (spec.product === undefined || spec.product === null || spec.product === "") return { product: null, attributes: {}, warnings: [] };
  const product = findProduct(tx, Number(spec.product));
  const fail = (field: string, message: string) => (errors[field] ??= []).push(message);
  if (!product) {
    fail("outputs.0.product", t("validation.unknownProduct"));
    return { product: null, attributes: {}, warnings: [] };
  }
  if (typeof spec.gtin === "string" && isValidGtin(spec.gtin) && toGtin14(spec.gtin) !== product.gtin) fail("outputs.0.gtin", t("products.gtinNotProducts", { gtin: product.gtin }));
  if (Number(spec.bottleMl) !== product.bottleMl) fail("outputs.0.bottleMl", t("products.sizeNotProducts", { ml: product.bottleMl }));
  const warnings: string[] = [];
  let claimSupported: boolean | null = null;
  if (product.category && ["tank", "sake", "blend", "bottled"].includes(source.kind)) {
    const verdict = claimsForLot(source, t).categories.find((c) => c.name === product.category);
    claimSupported = verdict?.eligible ?? false;
    if (!claimSupported) warnings.push(t("products.claimNotSupported", { category: product.category, reasons: (verdict?.reasons ?? []).join(" ") }));
  }
  return {
    product,
    attributes: { productId: product.id, productName: product.name, category: product.category, claimSupported },
    warnings,
  };
}
