/**
 * Composition of lots over their sources. Every lot carries "content": the amount of the
 * thing whose shares we trace — brown rice for harvest lots, dry polished rice for rice
 * from the mill onward, litres for sake. Water taken up in soaking and steaming adds
 * weight but no content, so shares stay on the dry basis (../shared/product.md, "The model").
 * A transformation mixes its inputs in proportion to the content each one brought, and
 * passes that same mix to every output (a split hands each portion the same composition).
 */

export type Draw = { lotId: number; content: number };
export type Portion = { lotId: number; content: number };
export type Edge = { parentLotId: number; childLotId: number; weight: number };

/** Content carried by drawing `quantity` from a lot that is a uniform mix of what went in. */
export function contentOfDraw(quantity: number, lot: { quantityIn: number; contentIn: number }): number {
  if (lot.quantityIn <= 0) return 0;
  return (quantity * lot.contentIn) / lot.quantityIn;
}

/**
 * How the content of an event's outputs is shared out when the outputs carry the inputs'
 * own content on (soaking, steaming, splitting, koji, starter, additions): the total is
 * conserved and each output takes a part in proportion to its weight.
 */
export function carryContent(totalIn: number, outputQuantities: number[]): number[] {
  const totalOut = outputQuantities.reduce((a, b) => a + b, 0);
  if (totalOut <= 0) return outputQuantities.map(() => 0);
  return outputQuantities.map((q) => (totalIn * q) / totalOut);
}

/**
 * The lineage edges of one event: each output receives from each input a weight equal to
 * its own content times that input's share of the event's inputs.
 */
export function edgesOf(inputs: Draw[], outputs: Portion[]): Edge[] {
  const totalIn = inputs.reduce((a, d) => a + d.content, 0);
  if (totalIn <= 0) return [];
  const edges: Edge[] = [];
  for (const out of outputs) {
    for (const input of inputs) {
      if (input.content === 0) continue;
      edges.push({ parentLotId: input.lotId, childLotId: out.lotId, weight: (out.content * input.content) / totalIn });
    }
  }
  return edges;
}

/** Shares of a lot's content by parent, from its edges and its content_in. */
export function sharesFromEdges(edges: { parentLotId: number; weight: number }[], contentIn: number): Map<number, number> {
  const shares = new Map<number, number>();
  if (contentIn <= 0) return shares;
  for (const e of edges) shares.set(e.parentLotId, (shares.get(e.parentLotId) ?? 0) + e.weight / contentIn);
  for (const [k, v] of shares) if (Math.abs(v) < 1e-12) shares.delete(k);
  return shares;
}

/**
 * Backward composition over a graph held in memory: the share of each source lot (lots
 * with no parents) in `lotId`. Used by tests and small computations; the server does the
 * same walk in SQL.
 */
export function composition(
  lotId: number,
  parentsOf: (id: number) => { parentLotId: number; weight: number }[],
  contentInOf: (id: number) => number,
): Map<number, number> {
  const result = new Map<number, number>();
  const walk = (id: number, fraction: number) => {
    const parents = parentsOf(id);
    if (parents.length === 0) {
      result.set(id, (result.get(id) ?? 0) + fraction);
      return;
    }
    for (const [parent, share] of sharesFromEdges(parents, contentInOf(id))) walk(parent, fraction * share);
  };
  walk(lotId, 1);
  return result;
}

export type SourceAmounts = Map<number, number>;
export type CompositionDelta = { lotId: number; sourceLotId: number; amount: number };

/**
 * Composition carried by one event: each output's content is shared over the harvest lots
 * behind the inputs, in proportion to what each input brought and to that input's own
 * composition (amounts over its content_in).
 */
export function propagateComposition(
  inputs: { content: number; contentIn: number; sources: SourceAmounts }[],
  outputs: Portion[],
): CompositionDelta[] {
  const totalIn = inputs.reduce((a, i) => a + i.content, 0);
  if (totalIn <= 0) return [];
  const mix = new Map<number, number>();
  for (const input of inputs) {
    if (input.content === 0 || input.contentIn <= 0) continue;
    for (const [source, amount] of input.sources) {
      mix.set(source, (mix.get(source) ?? 0) + (input.content / totalIn) * (amount / input.contentIn));
    }
  }
  const deltas: CompositionDelta[] = [];
  for (const out of outputs) {
    for (const [source, share] of mix) if (share !== 0) deltas.push({ lotId: out.lotId, sourceLotId: source, amount: out.content * share });
  }
  return deltas;
}
