import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

// The data-access layer is grouped by aggregate (DEVELOPERS.md, "Rooms of src/server"); a module
// that imports its own importer, even for a type, is a sign two rooms have grown into each other.
const root = path.resolve(import.meta.dirname, "../..");
const serverDir = path.join(root, "src/server");
const ROOMS = ["ledger", "floor", "trace", "suppliers", "accounts", "platform", "records"];

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) return sourceFiles(full);
    return /\.(ts|mjs)$/.test(name) && !name.endsWith(".test.ts") ? [full] : [];
  });
}

/** Every specifier a module names: `from "…"` (values and types alike), `import "…"` and `import("…")`. */
function specifiers(text: string): string[] {
  const found: string[] = [];
  for (const m of text.matchAll(/\bfrom\s+"([^"]+)"|\bimport\s*\(?\s*"([^"]+)"/g)) found.push(m[1] ?? m[2] ?? "");
  return found;
}

/** The src/server file a specifier names, or null when it points elsewhere. */
function resolve(from: string, spec: string): string | null {
  const base = spec.startsWith("@/server/") ? path.join(root, "src", spec.slice(2)) : spec.startsWith(".") ? path.resolve(path.dirname(from), spec) : null;
  if (!base || !base.startsWith(serverDir + path.sep)) return null;
  for (const candidate of [base, `${base}.ts`, `${base}.mjs`, path.join(base, "index.ts")]) {
    if (existsSync(candidate) && statSync(candidate).isFile()) return candidate;
  }
  throw new Error(`${path.relative(root, from)} imports ${spec}, which does not exist`);
}

function importGraph() {
  const graph = new Map<string, string[]>();
  for (const file of sourceFiles(serverDir)) {
    const targets = specifiers(readFileSync(file, "utf8")).map((s) => resolve(file, s)).filter((t): t is string => t !== null);
    graph.set(file, [...new Set(targets)]);
  }
  return graph;
}

/** Strongly connected components of more than one module, or of one that imports itself (Tarjan, 1972). */
function cycles(graph: Map<string, string[]>): string[][] {
  let next = 0;
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const found: string[][] = [];
  const visit = (v: string) => {
    index.set(v, next);
    low.set(v, next++);
    stack.push(v);
    onStack.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!index.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, index.get(w)!));
    }
    if (low.get(v) === index.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        component.push(path.relative(root, w));
      } while (w !== v);
      if (component.length > 1 || (graph.get(v) ?? []).includes(v)) found.push(component.sort());
    }
  };
  for (const v of graph.keys()) if (!index.has(v)) visit(v);
  return found;
}

describe("the modules of src/server", () => {
  it("import each other without a circle, type-only imports included", () => {
    const graph = importGraph();
    expect(graph.size).toBeGreaterThan(80);
    expect(graph.get(path.join(serverDir, "ledger/events.ts"))).toContain(path.join(serverDir, "floor/floor-steps.ts"));
    expect(cycles(graph)).toEqual([]);
  });

  it("finds a circle when there is one", () => {
    const a = path.join(serverDir, "a.ts");
    const b = path.join(serverDir, "b.ts");
    const c = path.join(serverDir, "c.ts");
    expect(cycles(new Map([[a, [b]], [b, [a, c]], [c, []]]))).toEqual([["src/server/a.ts", "src/server/b.ts"]]);
  });

  it("each live in one of the rooms, none loose in src/server itself", () => {
    const loose = readdirSync(serverDir).filter((name) => !ROOMS.includes(name) && name !== "README.md");
    expect(loose).toEqual([]);
    for (const room of ROOMS) expect(readdirSync(path.join(serverDir, room)).length).toBeGreaterThan(0);
  });
});
