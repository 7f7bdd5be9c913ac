import { z } from "zod";
import { createTranslator } from "use-intl/core";
import { describe, expect, it } from "vitest";
import { loadMessages } from "@/i18n/messages";
import { fieldErrorsFrom } from "./field-errors";

const t = (key: string, values?: Record<string, string | number>) => (values ? `${key} ${JSON.stringify(values)}` : key);

describe("field errors from zod issues", () => {
  it("tells a missing field from one of the wrong type", () => {
    const schema = z.object({ brownKg: z.number(), variety: z.string(), grade: z.enum(["1", "2"]) });
    const result = schema.safeParse({ variety: 12, grade: "premium" });
    expect(result.success).toBe(false);
    expect(fieldErrorsFrom(result.error!, t)).toEqual({
      brownKg: ["validation.required"],
      variety: ["validation.types.string"],
      grade: ['validation.oneOf {"options":"1, 2"}'],
    });
  });
});

/**
 * One case per issue code zod 4 raises (zod's issue list, zod.dev "Issues" / $ZodIssue), fed
 * through the mapping and the real catalogue. None may come out as zod's English, a raw key or
 * an unfilled {placeholder}.
 */
const CASES: [string, z.ZodType, unknown][] = [
  ["invalid_type int", z.number().int(), 1.5],
  ["invalid_type NaN", z.number(), NaN],
  ["invalid_type string", z.string(), 12],
  ["invalid_type boolean", z.boolean(), "yes"],
  ["invalid_type array", z.array(z.string()), "x"],
  ["invalid_type object", z.object({ a: z.string() }), 3],
  ["missing", z.object({ a: z.number() }), {}],
  ["too_small inclusive", z.number().min(0), -1],
  ["too_small exclusive", z.number().positive(), 0],
  ["too_big inclusive", z.number().max(10), 11],
  ["too_big exclusive", z.number().lt(5), 5],
  ["too_small string", z.string().min(3), "ab"],
  ["too_big string", z.string().max(2), "abc"],
  ["exact length", z.string().length(3), "ab"],
  ["too_small array", z.array(z.string()).min(2), ["a"]],
  ["too_big array", z.array(z.string()).max(1), ["a", "b"]],
  ["too_small date", z.date().min(new Date("2026-01-01")), new Date("2025-12-31")],
  ["invalid_format email", z.string().email(), "x"],
  ["invalid_format date", z.iso.date(), "03/10/2026"],
  ["invalid_format regex", z.string().regex(/^P\d+$/), "x"],
  ["invalid_format url", z.string().url(), "x"],
  ["not_multiple_of", z.number().multipleOf(5), 3],
  ["invalid_value", z.enum(["first", "middle", "final"]), "fourth"],
  ["unrecognized_keys", z.strictObject({ a: z.string() }), { a: "x", b: 1 }],
  ["invalid_union", z.union([z.string(), z.number()]), true],
  ["custom", z.string().refine(() => false), "x"],
];

// zod's own wording (its en locale): none of it may reach a person.
const ZOD_ENGLISH = /Invalid input|\bexpected (a |an |number|string|int|array|object|boolean|date)|received|Too (small|big)|>=|<=|>\d|<\d|must be an? (int|string|number)|Invalid (string|number|ISO|email|URL)|Unrecognized key/;

const locales = (["en", "ja"] as const).filter((l) => "validation" in loadMessages(l));

describe.each(locales)("zod issues worded for people (%s)", (locale) => {
  const tr = createTranslator({ locale, messages: loadMessages(locale) });
  const translate = (key: string, values?: Record<string, string | number>) => tr(key as never, values as never);

  it.each(CASES)("%s", (_name, schema, value) => {
    const result = schema.safeParse(value);
    expect(result.success).toBe(false);
    for (const message of Object.values(fieldErrorsFrom(result.error!, translate)).flat()) {
      expect(message).not.toMatch(ZOD_ENGLISH);
      expect(message).not.toMatch(/^validation\.|\{[a-z]+\}/);
      expect(message.length).toBeGreaterThan(4);
    }
  });

  it("words a non-integer, a negative and a bound as the catalogue does", () => {
    const form = z.object({ count: z.number().int().min(0) });
    const errors = (v: unknown) => fieldErrorsFrom(form.safeParse({ count: v }).error!, translate).count;
    expect(errors(2.5)).toEqual([translate("validation.wholeNumber")]);
    expect(errors(-1)).toEqual([translate("validation.tooSmall", { minimum: 0 })]);
    if (locale === "en") {
      expect(errors(2.5)![0]).toMatch(/^Enter a whole number/);
      expect(errors(-1)).toEqual(["Enter at least 0."]);
    }
  });
});
