// The glossary is the one place the trade's Japanese words are decided (issue 14 item 1). Where an
// English message names a glossary term, its Japanese message must use that term's Japanese. The
// terms themselves come from the sources glossary.json's "about" names (NTA labelling standard,
// MAFF's brown-rice inspection standard; the brewing words are common practice).
import { describe, expect, it } from "vitest";
import glossary from "./glossary.json";
import { catalogueFiles, flatten, literalText, parseMessage, readCatalogue } from "./catalogue-walk";

type Term = { en: string; ja: string; note?: string };
const TERMS: Term[] = glossary.terms;

/**
 * Terms whose note says the English word has another sense in the catalogue, so a plain match
 * proves nothing: "field" is also a form field, "brewer"/"sales" name roles (the people are other
 * words), a "bottle" is a count (本) or the object (瓶), "steam" as a button is 蒸す, a money receipt is 領収書.
 */
const SENSE_DIFFERS = /\bnot\b|the role|the verb|as a count|money receipt/;

/** Key paths where a term's English is not the trade word, each with why. */
const ALLOWED: Record<string, string> = {
  "nav.languageNames.en": "the name of the English language, written in English in both catalogues",
  "errors.crossOrigin": "a web origin (RFC 6454), not the rice's origin",
  "csv.records.intro": "the Rice Traceability Act's own record items: 品名 (product name), 産地 …",
  "csv.records.columns.product": "the Rice Traceability Act's record item 品名",
  "recall.downloadEpcis": "GS1 EPCIS names its records イベント (the standard's own word), not a ledger event",
  "suppliers.statement.maker": "the brewery as the buyer of rice (買手 under the qualified-invoice rules), not a sake buyer (販売先)",
  "suppliers.statement.checkNote": "the brewery as the buyer of rice (買手), not a sake buyer (販売先)",
};

/** Other forms of a term that its glossary note itself gives (the grades 1等 … 規格外, mash additions 仕込み) or its okurigana form. */
const ALSO: Record<string, string[]> = {
  grade: ["等", "規格外"],
  addition: ["仕込"],
  import: ["取り込"],
  draw: ["払い出"],
};

/**
 * A term whose English is also an everyday word is matched only in its trade sense: a lot "on
 * hold", not a tank that "holds" mash or a hand that holds a QR code to the camera.
 */
const TRADE_SENSE: Record<string, RegExp> = {
  hold: /\bon hold\b|\bholds? and releases?\b/gi,
};

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
// Longest first, so "polishing ratio" is taken before "polishing", and "koji rice" before "koji".
const CHECKED = TERMS.filter((t) => !(t.note && SENSE_DIFFERS.test(t.note)))
  .sort((a, b) => b.en.length - a.en.length)
  .map((t) => ({ ...t, pattern: TRADE_SENSE[t.en] ?? new RegExp(`\\b${escape(t.en)}(?:s|es|ed|ing)?\\b`, "gi") }));

/** The glossary terms an English message names, each counted once; a longer term hides the shorter ones inside it. */
export function termsIn(english: string): Term[] {
  let rest = english;
  const found: Term[] = [];
  for (const term of CHECKED) {
    if (term.pattern.test(rest)) found.push(term);
    term.pattern.lastIndex = 0;
    rest = rest.replace(term.pattern, " ");
  }
  return found;
}

describe("glossary.json", () => {
  it("gives every term its English and Japanese, each English term once", () => {
    expect(TERMS.length).toBeGreaterThan(50);
    for (const t of TERMS) {
      expect(t.en.trim(), JSON.stringify(t)).not.toBe("");
      expect(t.ja, JSON.stringify(t)).toMatch(/[\u3040-\u30ff\u4e00-\u9fff]/);
    }
    const names = TERMS.map((t) => t.en.toLowerCase());
    expect(names.filter((n, i) => names.indexOf(n) !== i)).toEqual([]);
  });

  it("matches whole words, longest term first (the matcher the catalogue check below uses)", () => {
    expect(termsIn("The polishing ratio of this lot").map((t) => t.en)).toEqual(["polishing ratio", "lot"]);
    expect(termsIn("Koji rice for the mash").map((t) => t.en)).toEqual(["koji rice", "mash"]);
    expect(termsIn("Lots soaked today").map((t) => t.en)).toEqual(["soak", "lot"]);
    expect(termsIn("Allotment and pilots")).toEqual([]);
    expect(termsIn("The tank still holds mash").map((t) => t.en)).toEqual(["mash", "tank"]);
    expect(termsIn("Lot {code} is on hold").map((t) => t.en)).toEqual(["hold", "lot"]);
  });
});

describe("Japanese messages use the glossary's term wherever the English names it", () => {
  for (const file of catalogueFiles()) {
    it(file, () => {
      const en = flatten(readCatalogue("en", file));
      const ja = flatten(readCatalogue("ja", file));
      const misses: string[] = [];
      for (const [key, value] of en) {
        const japanese = ja.get(key);
        if (typeof value !== "string" || typeof japanese !== "string" || key in ALLOWED) continue;
        for (const term of termsIn(literalText(parseMessage(value)))) {
          if (![term.ja, ...(ALSO[term.en] ?? [])].some((word) => japanese.includes(word))) misses.push(`${key}: "${term.en}" → ${term.ja} missing in "${japanese}"`);
        }
      }
      expect(misses).toEqual([]);
    });
  }
});
