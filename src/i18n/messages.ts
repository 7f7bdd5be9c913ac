// use-intl/core has no React in it, so the CLI (seed) can load it outside Next.js.
import { createTranslator } from "use-intl/core";
import attachments from "./messages/en/attachments.json";
import brewing from "./messages/en/brewing.json";
import core from "./messages/en/core.json";
import csv from "./messages/en/csv.json";
import floor from "./messages/en/floor.json";
import graph from "./messages/en/graph.json";
import holds from "./messages/en/holds.json";
import labels from "./messages/en/labels.json";
import products from "./messages/en/products.json";
import ledger from "./messages/en/ledger.json";
import recall from "./messages/en/recall.json";
import registers from "./messages/en/registers.json";
import suppliers from "./messages/en/suppliers.json";
import attachmentsJa from "./messages/ja/attachments.json";
import brewingJa from "./messages/ja/brewing.json";
import coreJa from "./messages/ja/core.json";
import csvJa from "./messages/ja/csv.json";
import floorJa from "./messages/ja/floor.json";
import graphJa from "./messages/ja/graph.json";
import holdsJa from "./messages/ja/holds.json";
import labelsJa from "./messages/ja/labels.json";
import productsJa from "./messages/ja/products.json";
import ledgerJa from "./messages/ja/ledger.json";
import recallJa from "./messages/ja/recall.json";
import registersJa from "./messages/ja/registers.json";
import suppliersJa from "./messages/ja/suppliers.json";
import { DATE_FORMATS } from "./dates";
import type { Locale } from "./locale";

/**
 * The catalogues, English and Japanese, kept in one file per area so that work on one area does not
 * touch another's strings. Each file holds top-level namespaces; no two files share one.
 */
const en = { ...core, ...ledger, ...labels, ...csv, ...attachments, ...brewing, ...floor, ...recall, ...graph, ...holds, ...suppliers, ...products, ...registers };

/** The Japanese catalogue: the same files and keys (src/i18n/catalogue-parity.test.ts), terms from glossary.json. */
const ja = { ...coreJa, ...ledgerJa, ...labelsJa, ...csvJa, ...attachmentsJa, ...brewingJa, ...floorJa, ...recallJa, ...graphJa, ...holdsJa, ...suppliersJa, ...productsJa, ...registersJa } as unknown as Messages;

export type Messages = typeof en;
const CATALOGUES: Record<Locale, Messages> = { ja, en };

export function loadMessages(locale: Locale): Messages {
  return CATALOGUES[locale];
}

const translators = new Map<Locale, ReturnType<typeof createTranslator<Messages>>>();

/** A translator usable outside React (route handlers, e-mail, the seed); one per locale, reused. */
export function translator(locale: Locale) {
  let found = translators.get(locale);
  if (!found) translators.set(locale, (found = createTranslator({ locale, messages: loadMessages(locale), formats: { dateTime: DATE_FORMATS[locale] } })));
  return found;
}
