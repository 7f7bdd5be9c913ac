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
