import { describe, expect, it } from "vitest";
import { assignLayers, collapseStages, defaultCollapsed, readingOrder, STAGE_ORDER, type LineageGraph, type LineageNode, type StageKind } from "./lineage-layout";
import { firstView, layoutStages } from "./lineage-placement";

// A small brew in the shape of ../shared/product.md ("The model"): a paddy, two harvest lots
// polished together, a koji soak and a mash soak, the mash rice steamed and split into a
// starter portion and two additions, one tank, its sake and a bottling. Shares are made up
// but sum to 1 into every lot, as the ledger's do.
const node = (id: string, kind: StageKind, quantity = 10): LineageNode => ({ id, code: id.toUpperCase(), kind, label: id, detail: null, quantity, unit: "kg", onHand: 0, visible: true });
const NODES: LineageNode[] = [
  node("f1", "field"), node("h1", "harvest"), node("h2", "harvest"), node("p1", "polished"), node("sk1", "soaked", 20), node("sk2", "soaked", 80),
  node("st1", "steamed"), node("st2", "steamed"), node("sp1", "steamed"), node("sp2", "steamed"), node("sp3", "steamed"),
  node("k1", "koji"), node("y1", "starter"), node("t1", "tank"), node("s1", "sake"), node("b1", "bottled"),
];
const E: [string, string, number, number?][] = [
  ["f1", "h1", 1], ["h1", "p1", 0.6], ["h2", "p1", 0.4], ["p1", "sk1", 1, 20], ["p1", "sk2", 1, 80], ["sk1", "st1", 1], ["sk2", "st2", 1],
  ["st1", "k1", 1], ["st2", "sp1", 1], ["st2", "sp2", 1], ["st2", "sp3", 1], ["sp1", "y1", 0.7], ["k1", "y1", 0.3],
  ["k1", "t1", 0.2], ["y1", "t1", 0.1], ["sp2", "t1", 0.25, 25], ["sp3", "t1", 0.45, 45], ["t1", "s1", 1], ["s1", "b1", 1],
];
const graph = (rootId = "b1"): LineageGraph => ({ rootId, truncated: false, nodes: NODES, edges: E.map(([source, target, share, quantity = 1]) => ({ source, target, share, quantity, unit: "kg" })) });
const sharesInto = (edges: { target: string; share: number | null }[], id: string) => edges.filter((e) => e.target === id).reduce((a, e) => a + e.share!, 0);

describe("assignLayers", () => {
  it("places each stage in its column, a split after its parent, and a bottling after its sake", () => {
    const layers = Object.fromEntries(assignLayers(NODES, graph().edges));
    expect(layers).toEqual({ f1: 0, h1: 1, h2: 1, p1: 2, sk1: 3, sk2: 3, st1: 4, st2: 4, sp1: 5, sp2: 5, sp3: 5, k1: 6, y1: 7, t1: 8, s1: 9, b1: 11 });
  });

  it("always increases along an edge, even where kinds come out of stage order", () => {
    const odd: LineageNode[] = [node("b", "blend"), node("b2", "blend"), node("x", "bottled")];
    const layers = assignLayers(odd, [{ source: "b", target: "b2" }, { source: "b2", target: "x" }]);
    expect(layers.get("b2")! - layers.get("b")!).toBe(1);
    expect(layers.get("x")!).toBeGreaterThan(layers.get("b2")!);
  });

  it("orders the stages paddy to bottle", () => {
    expect(STAGE_ORDER.slice(0, 3)).toEqual(["field", "harvest", "polished"]);
    expect(STAGE_ORDER.at(-1)).toBe("bottled");
  });
});

describe("collapseStages", () => {
  it("leaves the graph as it is when nothing is folded", () => {
    const g = collapseStages(graph(), new Set());
    expect(g.nodes).toHaveLength(16);
    expect(g.edges).toHaveLength(19);
  });

  it("folds soaked and steamed rice into one node per layer and rewires the edges", () => {
    const g = collapseStages(graph(), new Set(["soaked", "steamed"]));
    expect(g.nodes).toHaveLength(12);
    expect(g.edges).toHaveLength(14);
    const groups = g.nodes.filter((n) => n.count > 1).map((n) => [n.id, n.count, n.members.length]);
    expect(groups).toEqual([["group:soaked:3", 2, 2], ["group:steamed:4", 2, 2], ["group:steamed:5", 3, 3]]);
    expect(g.nodes.find((n) => n.id === "group:soaked:3")).toMatchObject({ code: null, label: null, quantity: 100 });
    expect(g.edges.some((e) => e.source === e.target)).toBe(false);
    // Into single lots the shares still sum to 1; the two additions carry 0.25 + 0.45 together.
    for (const id of ["y1", "t1", "k1", "p1"]) expect(sharesInto(g.edges, id)).toBeCloseTo(1, 12);
    expect(g.edges.find((e) => e.id === "group:steamed:5->t1")).toMatchObject({ share: 0.7, quantity: 70 });
    // Into a folded node a share has no single denominator; the quantities add up instead.
    expect(g.edges.find((e) => e.id === "p1->group:soaked:3")).toMatchObject({ share: null, quantity: 100 });
  });

  it("never folds the current lot, and drops edges that would loop on a folded node", () => {
    const g = collapseStages(graph("sp2"), new Set(STAGE_ORDER));
    expect(g.nodes.find((n) => n.id === "sp2")).toMatchObject({ current: true, count: 1, code: "SP2" });
    expect(g.nodes.find((n) => n.id === "group:steamed:5")!.members).toEqual(["sp1", "sp3"]);
    expect(g.edges.some((e) => e.source === e.target)).toBe(false);
    // Pairs share a kind and a layer at harvest, soak, steam and the split (less the current lot).
    expect(g.nodes).toHaveLength(16 - 4);
    expect(g.nodes.filter((n) => n.count === 2).map((n) => n.id)).toEqual(["group:harvest:1", "group:soaked:3", "group:steamed:4", "group:steamed:5"]);
  });

  it("draws a folded node as hidden only when every lot in it is hidden", () => {
    const hide = (ids: string[]): LineageGraph => ({ ...graph(), nodes: NODES.map((n) => (ids.includes(n.id) ? { ...n, code: null, label: null, quantity: null, visible: false } : n)) });
    const folded = (g: LineageGraph) => collapseStages(g, new Set(["soaked", "steamed"])).nodes.filter((n) => n.count > 1);
    expect(folded(hide(["sk1", "sk2", "st1"])).map((n) => [n.id, n.visible, n.quantity])).toEqual([["group:soaked:3", false, null], ["group:steamed:4", true, null], ["group:steamed:5", true, 30]]);
  });

  it("keeps ranks increasing along every edge after folding", () => {
    const g = collapseStages(graph(), new Set(["soaked", "steamed", "koji"]));
    const layer = new Map(g.nodes.map((n) => [n.id, n.layer]));
    for (const e of g.edges) expect(layer.get(e.target)!).toBeGreaterThan(layer.get(e.source)!);
  });
});

describe("layoutStages", () => {
  it("draws left to right: every edge ends to the right of where it starts", () => {
    for (const folded of [new Set<StageKind>(), new Set<StageKind>(["soaked", "steamed"]), new Set<StageKind>(STAGE_ORDER)]) {
      const placed = layoutStages(collapseStages(graph(), folded));
      const at = new Map(placed.nodes.map((n) => [n.id, n]));
      for (const e of placed.edges) expect(at.get(e.target)!.x).toBeGreaterThan(at.get(e.source)!.x + at.get(e.source)!.width);
      expect(placed.width).toBeGreaterThan(0);
    }
  });

  it("lines up the lots of one layer in one column", () => {
    const placed = layoutStages(collapseStages(graph(), new Set()));
    const centre = (id: string) => { const n = placed.nodes.find((x) => x.id === id)!; return n.x + n.width / 2; };
    expect(centre("sp1")).toBe(centre("sp3"));
    expect(centre("h1")).toBe(centre("h2"));
    expect(centre("t1")).toBeGreaterThan(centre("y1"));
  });
});

describe("defaultCollapsed", () => {
  it("folds every stage, and only above 60 nodes", () => {
    expect([...defaultCollapsed(60)]).toEqual([]);
    expect([...defaultCollapsed(61)]).toEqual(STAGE_ORDER);
  });
});

describe("firstView", () => {
  // The fixture's 16 lots repeated in five brews, as a large blend's lineage repeats its steps.
  const large = (): LineageGraph => {
    const copy = (n: number) => (id: string) => (n === 0 ? id : `${id}-${n}`);
    const brews = [0, 1, 2, 3, 4].map(copy);
    return {
      rootId: "b1", truncated: false,
      nodes: brews.flatMap((c) => NODES.map((n) => ({ ...n, id: c(n.id) }))),
      edges: brews.flatMap((c) => graph().edges.map((e) => ({ ...e, source: c(e.source), target: c(e.target) }))),
    };
  };

  it("draws a small lineage lot by lot", () => {
    const view = firstView(graph());
    expect(view.folded).toEqual([]);
    expect(view.placed.nodes).toHaveLength(16);
    expect(view.placed.overview).toBe(false);
  });

  it("draws a large lineage as one column per stage and step, with the current lot on its own", () => {
    const view = firstView(large());
    expect(view.placed.overview).toBe(true);
    expect(view.placed.nodes.map((n) => [n.kind, n.count])).toEqual([
      ["field", 5], ["harvest", 10], ["polished", 5], ["soaked", 10], ["steamed", 10], ["steamed", 15], ["koji", 5], ["starter", 5], ["tank", 5], ["sake", 5], ["bottled", 1], ["bottled", 4],
    ]);
    expect(view.placed.nodes.find((n) => n.current)).toMatchObject({ id: "b1", count: 1 });
    // Twelve columns close together fit a 1,200 px canvas at 0.6 and more.
    expect(1200 / view.placed.width).toBeGreaterThanOrEqual(0.6);
  });
});

describe("readingOrder", () => {
  it("lists paddies first and bottles last, each lot with what it was made from", () => {
    const items = readingOrder(graph());
    expect(items.map((i) => i.node.id)).toEqual(["f1", "h1", "h2", "p1", "sk1", "sk2", "st1", "st2", "sp1", "sp2", "sp3", "k1", "y1", "t1", "s1", "b1"]);
    expect(items.at(-1)).toMatchObject({ current: true, layer: 11 });
    expect(items.find((i) => i.node.id === "t1")!.from.map((f) => f.source.id)).toEqual(["k1", "y1", "sp2", "sp3"]);
    expect(items[0]!.from).toEqual([]);
  });
});
