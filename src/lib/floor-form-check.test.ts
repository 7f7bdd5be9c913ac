import { describe, expect, it } from "vitest";
import { checkOffline, errorsByField, fieldPaths, requiredFields, unreadNumbers, type FormValues } from "./floor-form-check";

// Stand-ins shaped like the floor's soak and starter forms (app/(floor)/floor/[action]/components.tsx):
// the body is the event of ../shared/api.md, which the server parses with eventSchema.
const n = (s: string | undefined) => (s && s.trim() !== "" ? Number(s) : NaN);
const soakFields = [{ name: "use", type: "select" }, { name: "dryKg", type: "number" }, { name: "drainedKg", type: "number" }, { name: "soakMinutes", type: "number" }];
const soak = (v: FormValues) => ({
  step: "soaking",
  inputs: [{ lot: "P26-0002", quantity: n(v.dryKg) }],
  outputs: [{ kind: "soaked", quantity: n(v.drainedKg), use: v.use }],
  measurements: Number.isFinite(n(v.soakMinutes)) ? [{ name: "soakMinutes", value: n(v.soakMinutes), unit: "min" }] : [],
});
const starterFields = [{ name: "kojiCode", type: "code" }, { name: "kojiKg", type: "number" }, { name: "waterL", type: "number" }];
const starter = (v: FormValues) => ({
  step: "starter",
  inputs: [{ lot: (v.kojiCode ?? "").trim().toUpperCase(), quantity: n(v.kojiKg) }],
  outputs: [{ kind: "starter", quantity: [n(v.kojiKg), n(v.waterL)].filter(Number.isFinite).reduce((a, b) => a + b, 0) }],
});
const t = (key: string) => key;

describe("a floor form's fields and the event they build", () => {
  it("finds which field each part of the body comes from; a sum of several fields belongs to none alone", () => {
    const owners = fieldPaths(starter, {}, starterFields);
    expect(owners.get("inputs.0.lot")).toEqual(["kojiCode"]);
    expect(owners.get("inputs.0.quantity")).toEqual(["kojiKg"]);
    expect(owners.get("outputs.0.quantity")).toEqual(["kojiKg", "waterL"]);
  });

  it("marks as required exactly the fields whose blank the schema refuses (an optional measurement is left out)", () => {
    expect([...requiredFields(soak, { use: "koji" }, soakFields)].sort()).toEqual(["drainedKg", "dryKg"]);
    expect([...requiredFields(starter, {}, starterFields)].sort()).toEqual(["kojiCode", "kojiKg"]);
  });

  it("puts the server's errors beside the field typed; what no single field owns goes above the form", () => {
    const owners = fieldPaths(starter, {}, starterFields);
    // The server's 409 on an over-draw names inputs.{n}.quantity (src/server/ledger/events.ts).
    expect(errorsByField({ "inputs.0.quantity": ["Only 12 kg on hand."], "outputs.0.quantity": ["too much"], inputs: ["needs 2"] }, owners)).toEqual({
      kojiKg: ["Only 12 kg on hand."],
      _: ["too much", "needs 2"],
    });
  });

  it("refuses offline what the server's schema would refuse, with the path of the field", () => {
    const errors = checkOffline(soak({ use: "koji", dryKg: "60", drainedKg: "" }), t);
    expect(errors).not.toBeNull();
    expect(errorsByField(errors!, fieldPaths(soak, { use: "koji" }, soakFields))).toEqual({ drainedKg: ["validation.required"] });
    expect(checkOffline(soak({ use: "koji", dryKg: "60", drainedKg: "80" }), t)).toBeNull();
  });

  it("judges the body as the server receives it: JSON drops undefined attributes instead of refusing them", () => {
    expect(checkOffline({ step: "mash-addition", inputs: [{ lot: "K26-0001", quantity: 5 }], outputs: [{ kind: "tank", quantity: 5, tankName: undefined }] }, t)).toBeNull();
  });

  it("names a number field whose text is no number people write (\"1,26\"), beside that field; full-width and grouped figures pass", () => {
    const owners = fieldPaths(starter, {}, starterFields);
    // Groups of three after the first (common practice); full width folded by NFKC (Unicode UAX #15).
    const slips = unreadNumbers(starterFields, { kojiCode: "K26-0001", kojiKg: "1,26", waterL: "abc" }, owners, t);
    expect(slips).toEqual({ "inputs.0.quantity": ["validation.number"], waterL: ["validation.number"] });
    expect(errorsByField(slips!, owners)).toEqual({ kojiKg: ["validation.number"], _: ["validation.number"] });
    expect(unreadNumbers(starterFields, { kojiCode: "K26-0001", kojiKg: "１，２６０", waterL: "１３．５" }, owners, t)).toBeNull();
  });
});
