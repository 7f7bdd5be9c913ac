import { describe, expect, it } from "vitest";
import { PREFECTURES, findPrefecture, romajiKey } from "./prefectures";

// ISO 3166-2:JP (from memory of the ISO Online Browsing Platform's entries): JP-01 北海道
// Hokkaido, JP-13 東京都 Tokyo, JP-15 新潟県 Niigata, JP-26 京都府 Kyoto, JP-27 大阪府 Osaka,
// JP-28 兵庫県 Hyogo, JP-33 岡山県 Okayama, JP-39 高知県 Kochi, JP-47 沖縄県 Okinawa.
const ISO_ENTRIES: [string, string, string][] = [
  ["JP-01", "Hokkaido", "北海道"],
  ["JP-13", "Tokyo", "東京都"],
  ["JP-15", "Niigata", "新潟県"],
  ["JP-26", "Kyoto", "京都府"],
  ["JP-27", "Osaka", "大阪府"],
  ["JP-28", "Hyogo", "兵庫県"],
  ["JP-33", "Okayama", "岡山県"],
  ["JP-39", "Kochi", "高知県"],
  ["JP-47", "Okinawa", "沖縄県"],
];

describe("prefectures (ISO 3166-2:JP)", () => {
  it("holds the 47 codes once each, every name found again by itself", () => {
    expect(PREFECTURES).toHaveLength(47);
    expect(new Set(PREFECTURES.map((p) => p.code)).size).toBe(47);
    expect(new Set(PREFECTURES.map((p) => romajiKey(p.en))).size).toBe(47);
    for (const p of PREFECTURES) {
      expect(findPrefecture(p.en)).toBe(p);
      expect(findPrefecture(p.ja)).toBe(p);
    }
  });

  it.each(ISO_ENTRIES)("%s is %s, %s", (code, en, ja) => {
    expect(findPrefecture(en)).toEqual({ code, en, ja });
  });

  it("reads the ways a region is typed: macrons, circumflexes, long vowels, suffixes, Kunrei spelling, kanji without 県", () => {
    for (const typed of ["Hyōgo", "Hyôgo", "HYOGO", "Hyougo", "Hyogo-ken", "Hyogo Prefecture", " hyogo ", "兵庫"]) expect(findPrefecture(typed)?.code).toBe("JP-28");
    expect(findPrefecture("Oosaka-fu")?.code).toBe("JP-27");
    expect(findPrefecture("Tokyo-to")?.code).toBe("JP-13");
    expect(findPrefecture("Hukusima")?.code).toBe("JP-07");
    expect(findPrefecture("Tiba")?.code).toBe("JP-12");
    expect(findPrefecture("Kôti")?.code).toBe("JP-39");
  });

  it("finds nothing for a country or a place that is not a prefecture", () => {
    for (const typed of ["California", "USA", "", "Asagiri Valley", "Kyotoo Valley"]) expect(findPrefecture(typed)).toBeNull();
  });
});
