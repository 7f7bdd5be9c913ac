// What people read carries no notes meant for developers, no raw figure names and no counts
// glued to a fixed noun: every catalogue value, English and Japanese, is scanned for them.
import { describe, expect, it } from "vitest";
import { FIGURES } from "@/domain/figures";
import { TYPE } from "@formatjs/icu-messageformat-parser";
import { catalogueFiles, flatten, literalText, parseMessage, readCatalogue } from "./catalogue-walk";
import { LOCALES } from "./locale";

/** Remarks that belong in code comments: where a figure came from, what is left to do. */
const DEVELOPER_NOTES = /from memory|記憶に基づ|check the text|\bTODO\b|\bFIXME\b|\bstub\b|references\.md|shared\/|\bXXX\b|要確認/i;

/**
 * An English count written before a noun that cannot change with it ("{count} bottles", "lot(s)").
 * "per {step} point" is a rate, not a count.
 */
const GLUED_COUNT = /(?<!per )\{\w+\} (bottles?|bags?|lots?|points?|days?|minutes?|codes?|labels?|entries|characters?)\b|\w\(s\)/;

/** A message's top level as text: plural and select blocks (which choose their own nouns) become "§". */
const topLevel = (value: string) =>
  parseMessage(value)
    .map((el) => (el.type === TYPE.literal ? el.value : el.type === TYPE.argument ? `{${el.value}}` : "§"))
    .join("");

/** Values that state what an API field or a CSV column is called must show the name as typed. */
const NAMES_A_FORMAT = new Set(["validation.measurementName", "csv.import.kindHints.harvests"]);

function values(locale: (typeof LOCALES)[number]): [string, string][] {
  return catalogueFiles().flatMap((file) => [...flatten(readCatalogue(locale, file))].flatMap(([k, v]) => (typeof v === "string" ? [[k, v] as [string, string]] : [])));
}

describe.each(LOCALES)("catalogue wording (%s)", (locale) => {
  const all = values(locale);

  it("holds catalogue values to scan", () => {
    expect(all.length).toBeGreaterThan(500);
  });

  it("carries no developer notes", () => {
    expect(all.filter(([, v]) => DEVELOPER_NOTES.test(v)).map(([k]) => k)).toEqual([]);
  });

  it("names no figure by its camelCase key", () => {
    const keys = Object.keys(FIGURES).filter((k) => /[a-z][A-Z]/.test(k));
    const raw = all.filter(([k, v]) => !NAMES_A_FORMAT.has(k) && keys.some((f) => literalText(parseMessage(v)).includes(f)));
    expect(raw.map(([k]) => k)).toEqual([]);
  });

  it.runIf(locale === "en")("glues no count to a noun (ICU plural instead)", () => {
    expect(all.filter(([, v]) => GLUED_COUNT.test(topLevel(v))).map(([k, v]) => `${k}: ${v}`)).toEqual([]);
  });
});

describe("the scan itself", () => {
  it("finds what it looks for", () => {
    expect(DEVELOPER_NOTES.test("Rounding (NTA Q&A — from memory).")).toBe(true);
    expect(DEVELOPER_NOTES.test("初期値は記憶に基づく慣行です。")).toBe(true);
    expect(GLUED_COUNT.test("{count} bottles")).toBe(true);
    expect(GLUED_COUNT.test("at least {count} input lot(s)")).toBe(true);
    expect(GLUED_COUNT.test(topLevel("{count, plural, one {# bottle} other {# bottles}}"))).toBe(false);
    expect(GLUED_COUNT.test(topLevel("{n} lots and {count, plural, one {# bag} other {# bags}}"))).toBe(true);
  });
});
