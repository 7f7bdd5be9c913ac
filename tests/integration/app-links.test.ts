import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { expect, it } from "vitest";

// Links go through src/components/app-link.tsx, which does not prefetch (why: its comment, and
// tests/e2e/office-links.spec.ts); a file taking next/link directly would bring prefetching back.
const root = path.resolve(import.meta.dirname, "../..");

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? sources(full) : /\.(ts|tsx)$/.test(name) ? [full] : [];
  });
}

it("no page or component imports next/link but the app's own link", () => {
  const direct = [...sources(path.join(root, "app")), ...sources(path.join(root, "src"))]
    .filter((file) => /from\s+"next\/link"/.test(readFileSync(file, "utf8")))
    .map((file) => path.relative(root, file));
  expect(direct).toEqual(["src/components/app-link.tsx"]);
});
