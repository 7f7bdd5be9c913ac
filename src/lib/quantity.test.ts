import { createTranslator } from "use-intl/core";
import { describe, expect, it } from "vitest";
import { loadMessages } from "@/i18n/messages";
import { formatAmount, quantityText } from "./quantity";

const translate = (locale: "en" | "ja") => {
  const tr = createTranslator({ locale, messages: loadMessages(locale) });
  return (key: string, values?: Record<string, string | number>) => tr(key as never, values as never);
};

describe("amounts never read -0", () => {
  // ECMA-402 (Intl.NumberFormat v3) signDisplay "negative": no sign on zero or negative zero.
  it("a negative zero and a negative value rounding to zero read 0", () => {
    for (const locale of ["en", "ja"]) {
      expect(formatAmount(locale, -0)).toBe("0");
      expect(formatAmount(locale, -0.004, 2)).toBe("0");
      expect(formatAmount(locale, -0.04, 1)).toBe("0");
    }
    expect(quantityText(translate("en"), "en", -0, "kg")).toBe("0 kg");
    expect(quantityText(translate("en"), "en", -0.004, "kg", 2)).toBe("0 kg");
  });

  it("a real negative keeps its sign, and thousands are grouped as the locale groups them", () => {
    expect(formatAmount("en", -1.26, 2)).toBe("-1.26");
    // CLDR: en and ja both group thousands with a comma.
    expect(quantityText(translate("en"), "en", 1260.04, "kg")).toBe("1,260 kg");
    expect(quantityText(translate("ja"), "ja", 1260.04, "kg")).toBe("1,260 kg");
  });
});

describe("counts with their nouns (ICU plural, CLDR plural rules)", () => {
  const en = translate("en");
  const ja = translate("ja");
  it("English: one bottle, 800 bottles, one bag, 3 bags", () => {
    expect(quantityText(en, "en", 1, "bottle")).toBe("1 bottle");
    expect(quantityText(en, "en", 800, "bottle")).toBe("800 bottles");
    expect(quantityText(en, "en", 1, "bag")).toBe("1 bag");
    expect(quantityText(en, "en", 3, "bag")).toBe("3 bags");
    expect(quantityText(en, "en", 0, "bottle")).toBe("0 bottles");
  });

  it("Japanese has no plural form: the counter follows the number (本 for bottles, 袋 for bags)", () => {
    expect(quantityText(ja, "ja", 800, "bottle")).toBe("800本");
    expect(quantityText(ja, "ja", 1, "bottle")).toBe("1本");
    expect(quantityText(ja, "ja", 3, "bag")).toBe("3袋");
  });

  it("catalogue counts: lots, input lots, characters", () => {
    expect(en("holds.holdAllIntro", { count: 1 })).toContain("(1 lot)");
    expect(en("holds.holdAllIntro", { count: 3 })).toContain("(3 lots)");
    expect(en("validation.needsInputs", { count: 1 })).toBe("This step needs at least 1 input lot.");
    expect(en("validation.needsInputs", { count: 2 })).toBe("This step needs at least 2 input lots.");
    expect(en("validation.tooShort", { count: 1 })).toBe("Use at least 1 character.");
    expect(en("validation.tooShort", { count: 8 })).toBe("Use at least 8 characters.");
  });

  it("on-hand errors count bottles and keep weights as written", () => {
    expect(en("validation.overdraw", { onHand: 1, unit: "bottle" })).toBe("Only 1 bottle on hand.");
    expect(en("errors.overdraw", { code: "B26-0001", onHand: "800", unit: "bottle" })).toBe("Lot B26-0001 has only 800 bottles on hand.");
    expect(en("validation.overdraw", { onHand: 13, unit: "kg" })).toBe("Only 13 kg on hand.");
    expect(ja("validation.overdraw", { onHand: 800, unit: "bottle" })).toBe("在庫は 800本 だけです。");
    expect(en("shipments.recorded", { amount: quantityText(en, "en", 24, "bottle"), buyer: "Minato" })).toBe("Shipment of 24 bottles to Minato recorded.");
  });
});
