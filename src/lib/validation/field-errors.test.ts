import { z } from "zod";
import { describe, expect, it } from "vitest";
import { fieldErrorsFrom } from "./field-errors";

const t = (key: string, values?: Record<string, string | number>) => (values ? `${key} ${JSON.stringify(values)}` : key);

describe("field errors from zod issues", () => {
  it("tells a missing field from one of the wrong type", () => {
    const schema = z.object({ brownKg: z.number(), variety: z.string(), grade: z.enum(["1", "2"]) });
    const result = schema.safeParse({ variety: 12, grade: "premium" });
    expect(result.success).toBe(false);
    expect(fieldErrorsFrom(result.error!, t)).toEqual({
      brownKg: ["validation.required"],
      variety: ['validation.invalidType {"expected":"string"}'],
      grade: ['validation.oneOf {"options":"1, 2"}'],
    });
  });
});
