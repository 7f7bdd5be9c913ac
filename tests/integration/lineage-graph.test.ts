import { describe, expect, it } from "vitest";
import { composition } from "@/domain/composition";
import { STAGE_ORDER, stageCounts, type LineageGraph } from "@/domain/lineage-layout";
import { getSqlite } from "@/server/platform/db";
import { AppError } from "@/server/platform/errors";
import { lineageGraph } from "@/server/trace/lineage-graph";
import { DEMO_USERS } from "@/server/records/seed";
import type { SessionUser } from "@/server/accounts/session";
import { traceBackward } from "@/server/trace/trace";
import { call, jsonRequest, signInAs } from "../support/api";

// Figures from the seeded 2024–25 season (src/server/records/seed-brewing.ts): P24 run one polished
// 1500 kg of the Terrace Paddy harvest and 500 kg of the North Basin harvest; Tank 1 took
// 600 kg of that rice, a fifth of it as koji; 800 bottles of 720 mL came from its sake.
// Shares follow the mixing rule of ../shared/product.md ("The model").
const actor = (email: string) => DEMO_USERS.find((u) => u.email === email)! as SessionUser;
const sales = actor("sales@example.com");
const codeOf = (query: string) => (getSqlite().prepare(query).get() as { code: string }).code;
const bottled = () => codeOf("select code from lots where kind = 'bottled' order by id limit 1");
/** grower2's own 2024 harvest from River Flat. */
const own = () => codeOf("select code from lots where kind = 'harvest' and field_id = 'field-nakase-river' and crop_year = 2024");
const byCode = (g: LineageGraph, code: string) => g.nodes.find((n) => n.code === code)!;
const into = (g: LineageGraph, id: string) => g.edges.filter((e) => e.target === id);

describe("the lineage graph of a bottling, as sales sees it", () => {
  it("reaches back through sake, tank and polished rice to the harvest lots and their paddies", () => {
    const g = lineageGraph(sales, bottled());
    const kinds = (kind: string) => g.nodes.filter((n) => n.kind === kind);
    expect(g.truncated).toBe(false);
    expect(g.nodes.find((n) => n.id === g.rootId)!.kind).toBe("bottled");
    expect(kinds("tank").map((n) => n.label)).toEqual(["Tank 1"]);
    expect(kinds("sake")).toHaveLength(1);
    expect(kinds("polished").map((n) => n.detail)).toEqual(["50 %"]);
    expect(kinds("harvest").map((n) => n.detail).sort()).toEqual(["Yamada Nishiki · 1", "Yamada Nishiki · tokuto"]);
    expect(kinds("field").map((n) => n.label).sort()).toEqual(["North Basin", "Terrace Paddy"]);
    expect(g.nodes.every((n) => n.visible)).toBe(true);
  });

  it("has shares summing to 1 into every node that has parents", () => {
    const g = lineageGraph(sales, bottled());
    const children = new Set(g.edges.map((e) => e.target));
    expect(children.size).toBe(g.nodes.length - 2); // all but the two paddies
    for (const child of children) expect(Math.abs(into(g, child).reduce((a, e) => a + e.share!, 0) - 1)).toBeLessThan(1e-9);
    const polished = g.nodes.find((n) => n.kind === "polished")!;
    const fromHarvest = Object.fromEntries(into(g, polished.id).map((e) => [g.nodes.find((n) => n.id === e.source)!.detail, e.share]));
    expect(fromHarvest["Yamada Nishiki · 1"]).toBeCloseTo(0.75, 12);
    expect(fromHarvest["Yamada Nishiki · tokuto"]).toBeCloseTo(0.25, 12);
  });

  it("composes, edge by edge, to the composition index that the backward trace reads", () => {
    const code = bottled();
    const g = lineageGraph(sales, code);
    const lotEdges = g.edges.filter((e) => !e.source.startsWith("field-"));
    const ids = new Map(g.nodes.map((n, i) => [n.id, i]));
    const walked = composition(ids.get(g.rootId)!, (i) => lotEdges.filter((e) => ids.get(e.target) === i).map((e) => ({ parentLotId: ids.get(e.source)!, weight: e.share! })), () => 1);
    const fromIndex = traceBackward(sales, code).sources;
    expect(walked.size).toBe(fromIndex.length);
    for (const s of fromIndex) expect(walked.get(ids.get(byCode(g, s.code).id)!)).toBeCloseTo(s.share, 9);
  });

  it("puts the koji fifth into the tank, directly and through the starter, and 576 L of sake into the bottles", () => {
    const g = lineageGraph(sales, bottled());
    const tank = g.nodes.find((n) => n.kind === "tank")!;
    const [koji, starter] = [g.nodes.find((n) => n.kind === "koji")!, g.nodes.find((n) => n.kind === "starter")!];
    const share = (s: string, t: string) => g.edges.find((e) => e.source === s && e.target === t)!.share!;
    expect(share(koji.id, tank.id) + share(starter.id, tank.id) * share(koji.id, starter.id)).toBeCloseTo(0.2, 6);
    const bottling = into(g, g.rootId);
    expect(bottling).toHaveLength(1);
    expect(bottling[0]).toMatchObject({ unit: "L", share: 1 });
    expect(bottling[0]!.quantity).toBeCloseTo(800 * 0.72, 9);
  });

  it("splits what was drawn from a lot over the lots it went into", () => {
    const code = codeOf("select code from lots where kind = 'polished' order by id limit 1");
    const g = lineageGraph(sales, code);
    const out = g.edges.filter((e) => e.source === g.rootId);
    expect(out).toHaveLength(2); // the koji soak and the mash soak of Tank 1
    expect(out.map((e) => e.quantity).sort((a, b) => a! - b!)).toEqual([120, 480]);
  });
});

describe("what another grower sees", () => {
  const grower2 = actor("grower2@example.com");

  it("shows the rest of the flow as anonymous nodes with no code, quantity or paddy", () => {
    const g = lineageGraph(grower2, own());
    const visible = g.nodes.filter((n) => n.visible);
    expect(visible.map((n) => n.code ?? n.label)).toEqual([own(), "River Flat"]);
    const hidden = g.nodes.filter((n) => !n.visible);
    expect(hidden.length).toBe(lineageGraph(sales, own()).nodes.length - 3); // less own lot, own paddy and the co-op's paddy
    for (const n of hidden) expect(n).toMatchObject({ code: null, label: null, quantity: null, onHand: null });
    // The co-op's 500 kg of North Basin rice went into the same polishing run: 500 / 2300 of it.
    const mixedIn = hidden.filter((n) => n.kind === "harvest");
    expect(mixedIn).toHaveLength(1);
    const edge = g.edges.find((e) => e.source === mixedIn[0]!.id && g.nodes.find((n) => n.id === e.target)!.kind === "polished")!;
    expect(edge.share).toBeCloseTo(500 / 2300, 12);
    expect(edge.quantity).toBeNull();
  });

  it("leaks no other lot's code, internal id or paddy in the whole answer", () => {
    const text = JSON.stringify(lineageGraph(grower2, own()));
    const codes = (getSqlite().prepare("select code from lots").all() as { code: string }[]).map((r) => r.code).filter((c) => c !== own());
    expect(codes.filter((c) => text.includes(c))).toEqual([]);
    const rootId = lineageGraph(sales, own()).rootId;
    expect(new Set(text.match(/"lot-\d+"/g))).toEqual(new Set([`"${rootId}"`]));
    expect(text).not.toContain("North Basin");
  });

  it("answers not found for a bottling the grower may not see", () => {
    expect(() => lineageGraph(grower2, bottled())).toThrowError(AppError);
    try {
      lineageGraph(grower2, bottled());
    } catch (error) {
      expect((error as AppError).status).toBe(404);
    }
  });
});

describe("corrections and size", () => {
  it("drops a polishing run that was reversed (seed-season.ts: 590 kg corrected, 540 kg recorded again)", () => {
    const code = codeOf("select code from lots where kind = 'harvest' and field_id = 'field-nakase-shrine' and crop_year = 2026");
    const g = lineageGraph(actor("admin@example.com"), code);
    expect(g.nodes.filter((n) => n.kind === "polished").map((n) => n.quantity)).toEqual([540]);
    expect(g.nodes.filter((n) => n.kind === "bran").map((n) => n.quantity)).toEqual([340]);
  });

  it("stops at maxNodes, keeping the lot itself and only edges between kept nodes", () => {
    const g = lineageGraph(sales, codeOf("select code from lots where kind = 'polished' order by id limit 1 offset 1"), { maxNodes: 12 });
    expect(g.truncated).toBe(true);
    expect(g.nodes.length).toBe(12);
    const ids = new Set(g.nodes.map((n) => n.id));
    expect(ids.has(g.rootId)).toBe(true);
    expect(g.edges.every((e) => ids.has(e.source) && ids.has(e.target))).toBe(true);
  });
});

describe("GET /api/lots/{code}/lineage, asked by the graph page on the first unfolding", () => {
  it("answers the page's graph, as the viewer may see it, and its stage counts match the nodes", async () => {
    const { GET } = await import("../../app/api/lots/[code]/lineage/route");
    for (const [email, code] of [["sales@example.com", bottled()], ["grower2@example.com", own()]] as const) {
      const cookie = await signInAs(email);
      const res = await call(GET, jsonRequest(`/api/lots/${encodeURIComponent(code)}/lineage`, { cookie }), { code });
      expect(res.status).toBe(200);
      const g = lineageGraph(actor(email), code);
      expect(res.body).toEqual(JSON.parse(JSON.stringify(g)));
      const counts = stageCounts(g.nodes);
      expect(counts.reduce((a, [, n]) => a + n, 0)).toBe(g.nodes.length);
      for (const [kind, n] of counts) expect(g.nodes.filter((x) => x.kind === kind)).toHaveLength(n);
      expect(counts.map(([kind]) => kind)).toEqual(STAGE_ORDER.filter((k) => g.nodes.some((x) => x.kind === k)));
    }
  });

  it("answers 404 in the error shape for a lot the viewer may not see, an unknown or hostile code, and 401 without a session", async () => {
    const { GET } = await import("../../app/api/lots/[code]/lineage/route");
    const cookie = await signInAs("grower2@example.com");
    for (const code of [bottled(), "NO-SUCH-1", "'; drop table lots; --", "../../etc/passwd", "🍶".repeat(300), ""]) {
      const res = await call(GET, jsonRequest(`/api/lots/${encodeURIComponent(code)}/lineage`, { cookie }), { code });
      expect(res.status, code).toBe(404);
      expect(res.body.error.code).toBeTypeOf("string");
    }
    expect((await call(GET, jsonRequest(`/api/lots/${bottled()}/lineage`), { code: bottled() })).status).toBe(401);
  });
});
