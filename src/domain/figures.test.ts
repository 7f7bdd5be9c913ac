import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { loadMessages } from "@/i18n/messages";
import { FIGURES, figureUnit, humaniseFigure } from "./figures";

const root = path.resolve(import.meta.dirname, "../..");
const source = (file: string) => readFileSync(path.join(root, file), "utf8");

/** Measurement names as the writers send them: ms("x", …), m("x", …), { name: "x", value … }, ["x", f.…]. */
const MEASUREMENT_WRITERS = ["app/(floor)/floor/[action]/components.tsx", "app/(office)/mill/components.tsx", "src/components/floor/record-moisture.tsx", "src/server/records/seed-brewing.ts"];
const MEASUREMENT_PATTERNS = [/\bms\("(\w+)"/g, /\bm\("(\w+)",/g, /name: "(\w+)", value/g, /\["(\w+)", f\./g];

/** Attribute objects the server writes on events: where each file opens one ("result.attributes = {"). */
const ATTRIBUTE_WRITERS: [string, RegExp][] = [
  ["src/server/floor/floor-steps.ts", /result\.attributes = \{/g],
  ["src/server/ledger/polishing-runs.ts", /\battributes: \{/g],
  ["src/server/ledger/bottling-product.ts", /\battributes: \{/g],
  ["src/server/ledger/receipts.ts", /attributes: JSON\.stringify\(\{/g],
  ["src/server/ledger/harvests.ts", /\battributes = JSON\.stringify\(\{/g],
];
/** Ids and nested structures: shown by their own panels (band charts, portions, koji checks), never as one figure. */
const NOT_FIGURES = new Set(["dispatch", "productId", "band", "bandCheck", "portions", "kojiChecks"]);

/** The top-level keys of the object literal opening at `from` ("key:" or shorthand; spreads skipped). */
function topLevelKeys(text: string, from: number): string[] {
  const keys: string[] = [];
  let depth = 0;
  let entry = "";
  for (let i = from; i < text.length; i++) {
    const c = text[i]!;
    if ("([{".includes(c)) depth++;
    if (")]}".includes(c)) depth--;
    if (depth === 0 || (depth === 1 && c === ",")) {
      const m = /^\s*(\w+)\s*(?::|$)/.exec(entry.replace(/^[{,]/, ""));
      if (m) keys.push(m[1]!);
      entry = "";
      if (depth === 0) return keys;
    }
    if (depth >= 1) entry += c;
  }
  return keys;
}

function writtenKeys(): Set<string> {
  const keys = new Set<string>();
  for (const file of MEASUREMENT_WRITERS) for (const re of MEASUREMENT_PATTERNS) for (const m of source(file).matchAll(re)) keys.add(m[1]!);
  for (const [file, re] of ATTRIBUTE_WRITERS) {
    const text = source(file);
    for (const m of text.matchAll(re)) for (const k of topLevelKeys(text, m.index! + m[0].length - 1)) if (!NOT_FIGURES.has(k)) keys.add(k);
  }
  // Koji temperatures are named by kojiMeasurementName (brewing.ts) from the checkpoint list.
  for (const c of ["BringingIn", "Inoculation", "Rebreaking", "Mounding", "Finish"]) keys.add(`kojiTemp${c}`);
  return keys;
}

describe("figure labels", () => {
  const keys = writtenKeys();

  it("finds the writers' keys (the scan itself works)", () => {
    for (const k of ["moisturePct", "targetPolishingRatioPct", "soakMinutes", "mashTempC", "absorptionPct", "riceKg", "litresOut", "bottles", "productName", "truePolishingRatioPct", "slipQuantity", "shortfall", "bags", "claimSupported"]) expect(keys).toContain(k);
  });

  it("every key a writer puts on an event is in the map", () => {
    expect([...keys].filter((k) => !(k in FIGURES))).toEqual([]);
  });

  // Japanese labels land with the translated ledger catalogue; until then only English is held.
  const locales = (["en", "ja"] as const).filter((l) => "lotPage" in loadMessages(l));
  it.each(locales)("every figure in the map has a %s label", (locale) => {
    const labels = (loadMessages(locale) as unknown as { lotPage: { figures: Record<string, string> } }).lotPage.figures;
    const missing = Object.keys(FIGURES).filter((k) => typeof labels?.[k] !== "string" || labels[k]!.trim() === "" || labels[k] === k);
    expect(missing).toEqual([]);
  });

  it("an unknown key reads as words, its unit taken from its ending", () => {
    expect(humaniseFigure("moistureStepPct")).toBe("Moisture step");
    expect(humaniseFigure("brixDegree")).toBe("Brix degree");
    expect(humaniseFigure("yeastTempC")).toBe("Yeast temp");
    expect(humaniseFigure("x")).toBe("X");
    expect(figureUnit("moistureStepPct")).toBe("%");
    expect(figureUnit("pressMinutes")).toBe("min");
    expect(figureUnit("brixDegree", "°Bx")).toBe("°Bx");
    expect(figureUnit("moisturePct", "percent")).toBe("%");
    for (const k of ["waterAbsorptionPct", "targetPolishingRatioPct", "kojiTempFinish"]) expect(humaniseFigure(k)).not.toMatch(/[a-z][A-Z]/);
  });
});
