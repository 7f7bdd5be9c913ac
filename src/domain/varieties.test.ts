import { describe, expect, it } from "vitest";
import { DEFAULT_VARIETIES, listedVariety, varietyShares } from "./varieties";

describe("the variety list", () => {
  // Names as registered varieties are commonly romanised (common practice; from memory).
  it("holds the sake-rice and table-rice names", () => {
    const names = DEFAULT_VARIETIES.map((v) => v.name);
    expect(names).toEqual(expect.arrayContaining(["Yamada Nishiki", "Omachi", "Gohyakumangoku", "Miyama Nishiki", "Hattan Nishiki", "Koshihikari"]));
    expect(DEFAULT_VARIETIES.find((v) => v.name === "Koshihikari")!.kind).toBe("table");
  });

  it("matches a typed name without case or extra spaces, and nothing else", () => {
    expect(listedVariety(DEFAULT_VARIETIES, "  yamada   NISHIKI ")).toBe("Yamada Nishiki");
    expect(listedVariety(DEFAULT_VARIETIES, "Yamada")).toBeNull();
    expect(listedVariety(DEFAULT_VARIETIES, "")).toBeNull();
  });
});

describe("variety shares of a mix", () => {
  // Worked by hand: 1500 kg Yamada Nishiki and 500 kg Omachi → 75 % and 25 %.
  it("weighs each input by the rice it brought", () => {
    expect(varietyShares([{ content: 1500, variety: "Yamada Nishiki" }, { content: 500, variety: "Omachi" }])).toEqual([
      { variety: "Yamada Nishiki", share: 0.75 },
      { variety: "Omachi", share: 0.25 },
    ]);
  });

  it("passes a mixed input's own shares on pro rata", () => {
    // 100 kg of a 60/40 mix and 100 kg of Omachi: Yamada 30 %, Omachi 70 %.
    const mixed = [{ variety: "Yamada Nishiki", share: 0.6 }, { variety: "Omachi", share: 0.4 }];
    expect(varietyShares([{ content: 100, variety: null, varieties: mixed }, { content: 100, variety: "Omachi" }])).toEqual([
      { variety: "Omachi", share: 0.7 },
      { variety: "Yamada Nishiki", share: 0.3 },
    ]);
  });

  it("is empty when nothing was drawn", () => {
    expect(varietyShares([{ content: 0, variety: "Omachi" }])).toEqual([]);
  });
});
