import { describe, expect, it } from "vitest";
import { isInvoiceNumber, normaliseInvoiceNumber } from "./invoice-number";

// Format: "T" followed by 13 digits (NTA, qualified invoice system; the NTA's sample
// invoices print T1234567890123 — from memory).
describe("registered invoice numbers", () => {
  it("accepts T and 13 digits", () => {
    expect(isInvoiceNumber("T1234567890123")).toBe(true);
  });

  it("refuses other lengths, a missing T and letters among the digits", () => {
    for (const bad of ["T123456789012", "T12345678901234", "1234567890123", "X1234567890123", "T12345678901a3", ""]) {
      expect(isInvoiceNumber(bad), bad).toBe(false);
    }
  });

  it("drops the spaces and hyphens people type, and takes a lower-case t", () => {
    expect(normaliseInvoiceNumber("t 1234-5678-90123")).toBe("T1234567890123");
    expect(isInvoiceNumber(normaliseInvoiceNumber("T1234 5678 90123"))).toBe(true);
  });
});
