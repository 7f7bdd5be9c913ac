import { describe, expect, it } from "vitest";
import { carryContent, composition, contentOfDraw, edgesOf, type Edge } from "./composition";

// Hand-computed scenarios. The mixing rule is the one in ../shared/product.md ("The model"):
// inputs mix in proportion to their rice-equivalent, a split passes the same composition on,
// water adds weight but no rice.

function graph(edges: Edge[], contentIn: Record<number, number>) {
  return {
    parentsOf: (id: number) => edges.filter((e) => e.childLotId === id),
    contentInOf: (id: number) => contentIn[id] ?? 0,
  };
}

describe("merge at polishing", () => {
  it("shares the polished lot and the bran by brown weight drawn", () => {
    // Harvest 1: 600 kg brown, harvest 2: 400 kg brown → 700 kg polished (lot 10), 250 kg bran (lot 11).
    const edges = edgesOf(
      [{ lotId: 1, content: 600 }, { lotId: 2, content: 400 }],
      [{ lotId: 10, content: 700 }, { lotId: 11, content: 250 }],
    );
    expect(edges).toEqual([
      { parentLotId: 1, childLotId: 10, weight: 420 },
      { parentLotId: 2, childLotId: 10, weight: 280 },
      { parentLotId: 1, childLotId: 11, weight: 150 },
      { parentLotId: 2, childLotId: 11, weight: 100 },
    ]);
    const g = graph(edges, { 10: 700, 11: 250 });
    expect(Object.fromEntries(composition(10, g.parentsOf, g.contentInOf))).toEqual({ 1: 0.6, 2: 0.4 });
    expect(Object.fromEntries(composition(11, g.parentsOf, g.contentInOf))).toEqual({ 1: 0.6, 2: 0.4 });
  });
});

describe("water does not count", () => {
  it("keeps the dry basis through soaking and steaming", () => {
    // 100 kg polished (content 100) soaks to 130 kg, steams to 140 kg: still 100 kg of rice.
    const soaked = { quantityIn: 130, contentIn: 100 };
    expect(contentOfDraw(130, soaked)).toBe(100);
    const steamed = { quantityIn: 140, contentIn: 100 };
    // Half the steamed rice is half the rice.
    expect(contentOfDraw(70, steamed)).toBe(50);
  });
});

describe("a split of steamed rice", () => {
  it("gives every portion the same composition, content in proportion to weight", () => {
    // Steamed lot 20 (140 kg, 100 kg rice; 30 % from harvest 1, 70 % from harvest 2) → 35 kg koji portion, 105 kg mash portion.
    expect(carryContent(100, [35, 105])).toEqual([25, 75]);
    const edges: Edge[] = [
      { parentLotId: 1, childLotId: 20, weight: 30 },
      { parentLotId: 2, childLotId: 20, weight: 70 },
      ...edgesOf([{ lotId: 20, content: 100 }], [{ lotId: 21, content: 25 }, { lotId: 22, content: 75 }]),
    ];
    const g = graph(edges, { 20: 100, 21: 25, 22: 75 });
    for (const portion of [21, 22]) {
      const shares = composition(portion, g.parentsOf, g.contentInOf);
      expect(shares.get(1)).toBeCloseTo(0.3, 12);
      expect(shares.get(2)).toBeCloseTo(0.7, 12);
    }
  });
});

describe("outputs accumulating into one lot", () => {
  it("weighs three additions into one tank by the rice each brought", () => {
    // Tank 30: first addition 20 kg rice from polished lot 1, middle 40 kg from lot 2, final 80 kg from lot 1.
    const edges = [
      ...edgesOf([{ lotId: 1, content: 20 }], [{ lotId: 30, content: 20 }]),
      ...edgesOf([{ lotId: 2, content: 40 }], [{ lotId: 30, content: 40 }]),
      ...edgesOf([{ lotId: 1, content: 80 }], [{ lotId: 30, content: 80 }]),
    ];
    const g = graph(edges, { 30: 140 });
    const shares = composition(30, g.parentsOf, g.contentInOf);
    expect(shares.get(1)).toBeCloseTo(100 / 140, 12);
    expect(shares.get(2)).toBeCloseTo(40 / 140, 12);
  });

  it("cancels a reversed event exactly", () => {
    const added = edgesOf([{ lotId: 2, content: 40 }], [{ lotId: 30, content: 40 }]);
    const reversed = added.map((e) => ({ ...e, weight: -e.weight }));
    const edges = [...edgesOf([{ lotId: 1, content: 20 }], [{ lotId: 30, content: 20 }]), ...added, ...reversed];
    const g = graph(edges, { 30: 20 });
    expect(Object.fromEntries(composition(30, g.parentsOf, g.contentInOf))).toEqual({ 1: 1 });
  });
});

describe("composition carried forward by events", async () => {
  const { propagateComposition } = await import("./composition");
  it("gives the same shares as walking the edges (merge, split, blend)", () => {
    // Polished lot 10 from harvests 1 (600 kg brown) and 2 (400 kg): 700 kg polished.
    const polished = propagateComposition(
      [
        { content: 600, contentIn: 1000, sources: new Map([[1, 1000]]) },
        { content: 400, contentIn: 400, sources: new Map([[2, 400]]) },
      ],
      [{ lotId: 10, content: 700 }],
    );
    expect(polished).toEqual([{ lotId: 10, sourceLotId: 1, amount: 420 }, { lotId: 10, sourceLotId: 2, amount: 280 }]);
    // A blend by volume: 40 L of sake A (all harvest 1) and 60 L of sake B (half 1, half 2).
    const blend = propagateComposition(
      [
        { content: 40, contentIn: 100, sources: new Map([[1, 100]]) },
        { content: 60, contentIn: 200, sources: new Map([[1, 100], [2, 100]]) },
      ],
      [{ lotId: 30, content: 100 }],
    );
    expect(Object.fromEntries(blend.map((d) => [d.sourceLotId, d.amount]))).toEqual({ 1: 70, 2: 30 });
  });
});
