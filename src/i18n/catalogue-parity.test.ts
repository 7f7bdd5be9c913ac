// Issue 14's acceptance check: "a test fails if any key is missing in either language". Every
// catalogue file has the same key paths in English and Japanese, each key names the same
// {placeholders}, and every value parses and formats with intl-messageformat (FormatJS's ICU
// MessageFormat implementation, an independent library; the syntax is ICU's MessageFormat,
// unicode-org.github.io/icu/userguide/format_parse/messages) in its own locale.
import IntlMessageFormat from "intl-messageformat";
import { describe, expect, it } from "vitest";
import { argumentsOf, catalogueFiles, flatten, parseMessage, readCatalogue } from "./catalogue-walk";
import { LOCALES } from "./locale";

const sorted = (names: Iterable<string>) => [...names].sort();

/** A value of the kind each argument takes: a number for plurals, a date for dates, an option for selects. */
function sampleValues(args: Map<string, string>): Record<string, unknown> {
  const values: Record<string, unknown> = {};
  for (const [name, kind] of args) {
    if (kind === "number") values[name] = 3;
    else if (kind === "date") values[name] = new Date(Date.UTC(2026, 9, 3, 3, 0));
    else if (kind === "tag") values[name] = (chunks: unknown[]) => chunks.join("");
    else if (kind.startsWith("select:")) values[name] = kind.slice(7);
    else values[name] = "X";
  }
  return values;
}

describe("the Japanese and English catalogues are whole, file by file", () => {
  it("has a Japanese file for every English one", () => {
    expect(catalogueFiles().length).toBe(13);
    for (const file of catalogueFiles()) expect(() => readCatalogue("ja", file), file).not.toThrow();
  });

  for (const file of catalogueFiles()) {
    it(`${file}: the same key paths in en and ja`, () => {
      const en = flatten(readCatalogue("en", file));
      const ja = flatten(readCatalogue("ja", file));
      expect(en.size).toBeGreaterThan(0);
      expect({ missingInJa: sorted([...en.keys()].filter((k) => !ja.has(k))), onlyInJa: sorted([...ja.keys()].filter((k) => !en.has(k))) }).toEqual({ missingInJa: [], onlyInJa: [] });
    });

    it(`${file}: each key names the same {placeholders} in both languages`, () => {
      const en = flatten(readCatalogue("en", file));
      const ja = flatten(readCatalogue("ja", file));
      const differ: string[] = [];
      for (const [key, value] of en) {
        const other = ja.get(key);
        if (typeof value !== "string" || typeof other !== "string") continue;
        const [a, b] = [sorted(argumentsOf(parseMessage(value)).keys()), sorted(argumentsOf(parseMessage(other)).keys())];
        if (a.join() !== b.join()) differ.push(`${key}: en {${a.join(", ")}} ja {${b.join(", ")}}`);
      }
      expect(differ).toEqual([]);
    });

    for (const locale of LOCALES) {
      it(`${file}: every ${locale} value is a string that parses and formats in ${locale}`, () => {
        const broken: string[] = [];
        for (const [key, value] of flatten(readCatalogue(locale, file))) {
          if (typeof value !== "string") {
            broken.push(`${key}: not a string`);
            continue;
          }
          try {
            const message = new IntlMessageFormat(value, locale);
            const out = message.format(sampleValues(argumentsOf(parseMessage(value))));
            if (value.trim() && !String(Array.isArray(out) ? out.join("") : out).trim()) broken.push(`${key}: formats to nothing`);
          } catch (error) {
            broken.push(`${key}: ${(error as Error).message}`);
          }
        }
        expect(broken).toEqual([]);
      });
    }
  }
});
