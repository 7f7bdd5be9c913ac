// Accept-Language is read as RFC 9110 §12.5.4 (with §12.4.2's quality values) defines it: a list
// of language ranges, each optionally weighted "q=" from 0 to 1 (default 1); q=0 means "not
// acceptable"; the highest weight wins, and among equal weights the order given. Ranges are
// matched on their primary subtag (RFC 4647 §3.3.2 lookup falls back from "ja-JP" to "ja").
import { describe, expect, it } from "vitest";
import { DEFAULT_LOCALE, isLocale, pickLocale } from "./locale";

describe("pickLocale: which language a person sees", () => {
  it("with nothing to go on, Japanese (issue 14: Japanese first)", () => {
    expect(DEFAULT_LOCALE).toBe("ja");
    expect(pickLocale(undefined, null)).toBe("ja");
    expect(pickLocale(undefined, "")).toBe("ja");
    expect(pickLocale(undefined, "*")).toBe("ja");
    expect(pickLocale(undefined, "fr-FR, de;q=0.8")).toBe("ja");
  });

  it("takes the highest q-weight, not the first listed (RFC 9110 §12.4.2, §12.5.4)", () => {
    expect(pickLocale(undefined, "en;q=0.5, ja;q=0.9")).toBe("ja");
    expect(pickLocale(undefined, "ja;q=0.2, en-US;q=0.8")).toBe("en");
    expect(pickLocale(undefined, "fr, en;q=0.7, ja;q=0.3")).toBe("en");
  });

  it("keeps the listed order among equal weights; a missing q is 1", () => {
    expect(pickLocale(undefined, "en-US, ja")).toBe("en");
    expect(pickLocale(undefined, "ja-JP, en")).toBe("ja");
    expect(pickLocale(undefined, "en;q=0.8, ja")).toBe("ja");
  });

  it("never chooses a range weighted q=0, which RFC 9110 §12.4.2 calls not acceptable", () => {
    expect(pickLocale(undefined, "en;q=0, ja;q=0.1")).toBe("ja");
    expect(pickLocale(undefined, "ja;q=0, en;q=0.1")).toBe("en");
  });

  it("matches regional ranges on their language (RFC 4647 §3.3.2), case-insensitively (RFC 5646 §2.1.1)", () => {
    expect(pickLocale(undefined, "EN-gb")).toBe("en");
    expect(pickLocale(undefined, "ja-Jpan-JP")).toBe("ja");
  });

  it("a browser's cookie (the switch of someone signed out) wins over Accept-Language", () => {
    expect(pickLocale("en", "ja")).toBe("en");
    expect(pickLocale("ja", "en-US,en;q=0.9")).toBe("ja");
  });

  it("the person's own setting wins over the cookie and the browser; null follows them", () => {
    expect(pickLocale("ja", "ja", "en")).toBe("en");
    expect(pickLocale("en", "en", "ja")).toBe("ja");
    expect(pickLocale("en", "ja", null)).toBe("en");
  });

  it("ignores values that are not one of the app's languages", () => {
    expect(pickLocale("fr", "en", "de")).toBe("en");
    expect(pickLocale("", "garbage;;q=abc, en;q=0.5", "")).toBe("en");
    expect(isLocale("JA")).toBe(false);
    expect(isLocale("ja")).toBe(true);
  });
});
