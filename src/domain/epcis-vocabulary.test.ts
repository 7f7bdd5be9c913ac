import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import {
  ACTION_OF_STEP,
  DISPOSITION_OF_STEP,
  ERROR_REASON_OF_REVERSAL,
  SENSOR_OF_UNIT,
  TRANSFORMATION_STEPS,
  bizStepOf,
  lotClassUri,
  sensorOf,
  timeAtOffset,
  uomOf,
} from "./epcis-vocabulary";

// The published vocabulary, as GS1's own EPCIS 2.0 JSON schema lists it (fixtures/epcis/SOURCE.md).
type Definition = { enum?: string[]; pattern?: string; anyOf?: Definition[]; properties?: Record<string, Definition> };
const schema = JSON.parse(readFileSync(path.resolve("fixtures/epcis/EPCIS-JSON-Schema.json"), "utf8")) as { definitions: Record<string, Definition> };
const defs = schema.definitions;
const enumOf = (name: string) => defs[name]!.anyOf?.find((d) => d.enum)?.enum ?? defs[name]!.enum!;
const otherUri = new RegExp(defs["vocab-other-uri"]!.pattern!);

describe("business steps against the CBV 2.0 list in GS1's schema", () => {
  it("uses the bare CBV term for registration, receipts, shipments and measurements", () => {
    expect(bizStepOf("registering")).toBe("commissioning");
    expect(bizStepOf("receiving")).toBe("receiving");
    expect(bizStepOf("shipping")).toBe("shipping");
    expect(bizStepOf("measuring")).toBe("sensor_reporting");
    for (const step of ["registering", "receiving", "shipping", "measuring"]) expect(enumOf("bizStep")).toContain(bizStepOf(step));
  });

  it("gives every transformation a URI of our own, since CBV 2.0 has no such step", () => {
    // Not even a generic one: "transforming" is not a CBV 2.0 business step.
    expect(enumOf("bizStep")).not.toContain("transforming");
    expect(bizStepOf("koji-making")).toBe("https://grainline.invalid/bizstep/koji-making");
    for (const step of TRANSFORMATION_STEPS) {
      const uri = bizStepOf(step);
      expect(enumOf("bizStep")).not.toContain(uri);
      expect(new URL(uri).protocol).toBe("https:");
      expect(uri).toMatch(otherUri);
    }
  });

  it("uses only actions, dispositions and error reasons the schema lists", () => {
    for (const action of Object.values(ACTION_OF_STEP)) expect(defs.action!.enum).toContain(action);
    for (const disposition of Object.values(DISPOSITION_OF_STEP)) expect(enumOf("disposition")).toContain(disposition);
    expect(enumOf("error-reason")).toContain(ERROR_REASON_OF_REVERSAL);
    for (const sensor of Object.values(SENSOR_OF_UNIT)) expect(enumOf("measurementType")).toContain(sensor.type);
  });
});

describe("units (UN/ECE Recommendation 20)", () => {
  it("maps kilograms, litres and bottles to KGM, LTR and H87", () => {
    expect([uomOf("kg"), uomOf("L"), uomOf("bottle")]).toEqual(["KGM", "LTR", "H87"]);
    for (const unit of ["kg", "L", "bottle"]) expect(uomOf(unit)).toMatch(new RegExp(defs.uom!.pattern!));
    // Rec 20: CEL degree Celsius, MIN minute, GRM gram.
    expect(SENSOR_OF_UNIT["°C"]).toEqual({ type: "Temperature", uom: "CEL" });
    expect(SENSOR_OF_UNIT.g).toEqual({ type: "Mass", uom: "GRM" });
  });

  it("refuses a unit it has no code for rather than guessing", () => {
    expect(() => uomOf("bag")).toThrow(RangeError);
  });

  it("exports readings as sensor reports, but not targets or units without a code", () => {
    expect(sensorOf({ name: "kojiTempFinish", unit: "°C" })).toEqual({ type: "Temperature", uom: "CEL" });
    expect(sensorOf({ name: "soakMinutes", unit: "min" })).toEqual({ type: "Time", uom: "MIN" });
    expect(sensorOf({ name: "targetPolishingRatioPct", unit: "%" })).toBeNull();
    expect(sensorOf({ name: "acidity", unit: "mL" })).toBeNull();
  });
});

describe("class-level identifiers", () => {
  it("names a bottling with a GTIN by its GS1 Digital Link URI, padded to GTIN-14", () => {
    // GTIN 9506000134352: GS1's example range (check digit 2, see gtin.test.ts).
    expect(lotClassUri("BT25-0003", "9506000134352")).toBe("https://id.gs1.org/01/09506000134352/10/BT25-0003");
  });

  it("names other lots, and GTINs that fail the check digit, by our own scheme, percent-encoded", () => {
    expect(lotClassUri("H24-0001")).toBe("https://id.grainline.invalid/lot/H24-0001");
    expect(lotClassUri("BT25-0003", "9506000134353")).toBe("https://id.grainline.invalid/lot/BT25-0003");
    expect(lotClassUri("A/B 1")).toBe("https://id.grainline.invalid/lot/A%2FB%201");
  });
});

describe("times with their offset (ISO 8601)", () => {
  const offsetPattern = new RegExp((defs.Event!.properties!.eventTimeZoneOffset as Definition).pattern!);

  it("writes the instant in Japan's time with +09:00, across midnight and year end", () => {
    expect(timeAtOffset(new Date("2025-03-20T05:00:00Z"))).toBe("2025-03-20T14:00:00.000+09:00");
    expect(timeAtOffset(new Date("2024-12-31T20:30:00Z"))).toBe("2025-01-01T05:30:00.000+09:00");
    expect(new Date(timeAtOffset(new Date("2024-12-31T20:30:00Z"))).toISOString()).toBe("2024-12-31T20:30:00.000Z");
    expect("+09:00").toMatch(offsetPattern);
  });

  it("handles western offsets and refuses malformed ones", () => {
    expect(timeAtOffset(new Date("2025-01-01T03:00:00Z"), "-05:00")).toBe("2024-12-31T22:00:00.000-05:00");
    expect(() => timeAtOffset(new Date(), "+9:00")).toThrow(RangeError);
  });
});
