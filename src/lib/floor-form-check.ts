import type { z } from "zod";
import { parseTypedNumber } from "@/domain/typed-input";
import { eventSchema } from "@/lib/validation/events";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";

/**
 * Ties a floor form's fields to the event body it builds, so that errors about the body
 * (`inputs.0.quantity`, from zod here or from the server) are shown beside the field the
 * brewer typed, and required fields are known before anything is sent. Nothing is declared
 * twice: a field's place in the body is found by changing it and seeing what changes, and
 * whether it is required by asking the same zod schema the server parses with.
 */
export type FormValues = Record<string, string>;
export type FormField = { name: string; type: string };
type Build = (values: FormValues) => unknown;

// Stand-in values that pass the schema; the datetime is local, as an <input type=datetime-local> gives.
const STAND_IN: Record<string, string> = { number: "4321.5", code: "ZZ99-9999", text: "ZZ", datetime: "2026-01-02T03:04" };
const CHANGED: Record<string, string> = { number: "1234.25", code: "YY98-8888", text: "YY", datetime: "2025-05-06T07:08" };
const typed = (fields: readonly FormField[]) => fields.filter((f) => f.type in STAND_IN);

/** The body as the server receives it: JSON drops undefined and turns NaN into null. */
const wire = (body: unknown): unknown => JSON.parse(JSON.stringify(body) ?? "null");
const safely = (build: Build, values: FormValues): unknown => {
  try {
    return build(values);
  } catch {
    return null; // a stand-in the form cannot take (e.g. a date) says nothing about the field
  }
};

function leaves(value: unknown, path: string, out: Map<string, string>): Map<string, string> {
  if (value !== null && typeof value === "object") {
    for (const [key, inner] of Object.entries(value)) leaves(inner, path ? `${path}.${key}` : key, out);
  } else out.set(path, JSON.stringify(value));
  return out;
}

/** Which fields each leaf of the body comes from, judged from filled stand-in values. */
export function fieldPaths(build: Build, values: FormValues, fields: readonly FormField[]): Map<string, string[]> {
  const base = { ...values, ...Object.fromEntries(typed(fields).map((f) => [f.name, STAND_IN[f.type]!])) };
  const before = leaves(wire(safely(build, base)), "", new Map());
  const owners = new Map<string, string[]>();
  for (const f of typed(fields)) {
    const after = leaves(wire(safely(build, { ...base, [f.name]: CHANGED[f.type]! })), "", new Map());
    for (const path of new Set([...before.keys(), ...after.keys()])) {
      if (before.get(path) !== after.get(path)) owners.set(path, [...(owners.get(path) ?? []), f.name]);
    }
  }
  return owners;
}

/** zod 4 reports a failed union at the union's path; the branch that came closest says what is wrong. */
function flatten(issues: readonly z.core.$ZodIssue[]): z.core.$ZodIssue[] {
  return issues.flatMap((issue) => {
    if (issue.code !== "invalid_union" || !issue.errors.length) return [issue];
    const best = [...issue.errors].sort((a, b) => a.length - b.length)[0]!;
    return flatten(best.map((inner) => ({ ...inner, path: [...issue.path, ...inner.path] })));
  });
}

const issuesOf = (body: unknown) => {
  const parsed = eventSchema.safeParse(wire(body));
  return parsed.success ? [] : flatten(parsed.error.issues);
};

/** Fields whose blank makes the schema refuse a body it otherwise takes: marked before sending. */
export function requiredFields(build: Build, values: FormValues, fields: readonly FormField[]): Set<string> {
  const base = { ...values, ...Object.fromEntries(typed(fields).map((f) => [f.name, STAND_IN[f.type]!])) };
  const baseline = issuesOf(safely(build, base)).length;
  return new Set(typed(fields).filter((f) => issuesOf(safely(build, { ...base, [f.name]: "" })).length > baseline).map((f) => f.name));
}

/**
 * Errors keyed by body path (`inputs.0.quantity`) → keyed by form field. A path several
 * fields feed (a sum) goes to none of them; what no field owns stays under "_" for the
 * message above the form.
 */
export function errorsByField(errors: Record<string, string[]>, owners: Map<string, string[]>): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const [path, messages] of Object.entries(errors)) {
    const exact = owners.get(path);
    const under = [...owners.entries()].filter(([p]) => p.startsWith(`${path}.`)).flatMap(([, names]) => names);
    const names = exact ?? (new Set(under).size === 1 ? [under[0]!] : []);
    const key = names.length === 1 ? names[0]! : "_";
    out[key] = [...(out[key] ?? []), ...messages];
  }
  return out;
}

/**
 * Number fields whose text is no number as people write it ("1,26", "abc"), keyed by the body
 * path the field feeds. Checked before the schema: a field that does not parse is sent as null,
 * which the schema could only call missing.
 */
export function unreadNumbers(fields: readonly FormField[], values: FormValues, owners: Map<string, string[]>, t: Translate): Record<string, string[]> | null {
  const out: Record<string, string[]> = {};
  for (const f of fields) {
    const text = values[f.name] ?? "";
    if (f.type !== "number" || text.trim() === "" || parseTypedNumber(text) !== null) continue;
    const path = [...owners].find(([, names]) => names.length === 1 && names[0] === f.name)?.[0] ?? f.name;
    out[path] = [t("validation.number")];
  }
  return Object.keys(out).length ? out : null;
}

/** The same check the server makes first, done on the phone: field errors, or null when the body parses. */
export function checkOffline(body: unknown, t: Translate): Record<string, string[]> | null {
  const issues = issuesOf(body);
  return issues.length ? fieldErrorsFrom({ issues } as unknown as z.ZodError, t) : null;
}
