import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

describe("message catalogue files", () => {
  it("never define the same top-level namespace twice", () => {
    const dir = path.join(import.meta.dirname, "messages/en");
    const seen = new Map<string, string>();
    for (const file of readdirSync(dir)) {
      for (const ns of Object.keys(JSON.parse(readFileSync(path.join(dir, file), "utf8")))) {
        expect(seen.get(ns), `${ns} in ${file}`).toBeUndefined();
        seen.set(ns, file);
      }
    }
    expect(seen.size).toBeGreaterThan(10);
  });

  it("have no dots inside keys (next-intl reads dots as nesting)", () => {
    const dir = path.join(import.meta.dirname, "messages/en");
    const walk = (o: unknown, at: string): void => {
      if (o && typeof o === "object") for (const [k, v] of Object.entries(o)) { expect(k.includes("."), `${at}.${k}`).toBe(false); walk(v, `${at}.${k}`); }
    };
    for (const file of readdirSync(dir)) walk(JSON.parse(readFileSync(path.join(dir, file), "utf8")), file);
  });
});

describe("error messages", () => {
  it("every catalogue key the code names for an error is in the English catalogue", () => {
    const root = path.join(import.meta.dirname, "../..");
    const en = Object.assign({}, ...readdirSync(path.join(import.meta.dirname, "messages/en")).map((f) => JSON.parse(readFileSync(path.join(import.meta.dirname, "messages/en", f), "utf8")))) as { errors: Record<string, string> };
    const named = new Set<string>();
    const walk = (dir: string): void => {
      for (const entry of readdirSync(dir, { withFileTypes: true })) {
        const file = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(file);
        else if (/\.tsx?$/.test(entry.name) && !/\.test\.tsx?$/.test(entry.name)) for (const m of readFileSync(file, "utf8").matchAll(/"errors\.([A-Za-z_]+)"/g)) named.add(m[1]!);
      }
    };
    walk(path.join(root, "src"));
    walk(path.join(root, "app"));
    expect(named.size).toBeGreaterThan(25);
    for (const key of named) expect(en.errors[key], `errors.${key}`).toBeTypeOf("string");
    // An AppError without a key of its own is worded by its code.
    for (const code of ["unauthenticated", "forbidden", "not_found", "conflict", "invalid", "rate_limited", "too_large", "internal"]) expect(en.errors[code], code).toBeTypeOf("string");
  });
});
