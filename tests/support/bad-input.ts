// fast-check arbitraries for input an endpoint must refuse. Each slot of a request body has a small
// model of what the contract (../shared/api.md and the zod schemas' documented limits) accepts;
// generated values are filtered through it, so every value produced is one the server must refuse.
import fc from "fast-check";

export const INJECTIONS = [
  "' OR 1=1 --",
  "'; DROP TABLE lots; --",
  '" OR ""="',
  "1; SELECT * FROM users",
  "<script>alert(1)</script>",
  '"><img src=x onerror=alert(1)>',
  "=cmd|' /C calc'!A0", // OWASP, "CSV Injection"
  "=HYPERLINK(\"http://example.invalid\")",
  "@SUM(1+1)",
  "${7*7}",
  "{{7*7}}",
  "../../../etc/passwd",
  "%00",
  "\u202Egnp.exe", // RIGHT-TO-LEFT OVERRIDE (Unicode bidi control)
  "a\u0000b", // NUL
  "🍶🌾🍚",
  "𠮷野屋", // a character outside the BMP (surrogate pair)
  "e\u0301\u0301\u0301", // stacked combining marks
  "\uFEFFbom",
  "__proto__",
] as const;

/** Text that is allowed but hostile: the server must store or refuse it, never choke on it. */
export const hostileText = fc.oneof(fc.constantFrom(...INJECTIONS), fc.string({ unit: "grapheme", maxLength: 24 }), fc.string({ unit: "binary", maxLength: 24 }));

/** Units for overlong strings: none is whitespace, so trimming cannot bring one back under a limit. */
const longUnit = fc.constantFrom("a", "\u202E", "🍶", "\u0000", "'", "<", "ー", "e\u0301", "=");
const overlong = (max: number) => fc.string({ unit: longUnit, minLength: max + 1, maxLength: max + 64 });

export type Slot =
  /** A JSON number. `coerced`: the schema runs z.coerce.number(), so only values that coerce to nothing valid are generated. */
  | { kind: "number"; min: number; max: number; minExclusive?: boolean; int?: boolean; coerced?: boolean; optional?: boolean }
  /** A trimmed string of at most `max` characters (at least one when `required`). */
  | { kind: "text"; max: number; required?: boolean }
  /** One of `values` (compared after `normalise`). */
  | { kind: "enum"; values: readonly unknown[]; normalise?: (v: string) => string; universe?: readonly unknown[] }
  /** A string naming something that exists and that this user may name. */
  | { kind: "ref"; known: () => Iterable<string>; normalise?: (v: string) => string; blankOk?: boolean }
  /** An ISO-8601 date-time with offset; `day`: a calendar date (YYYY-MM-DD), `blankOk` when it may be left empty. */
  | { kind: "datetime" }
  | { kind: "day"; blankOk?: boolean }
  /** A cell of a CSV import holding a decimal as typed (1,260, full-width digits; no exponent, no hex), in range. */
  | { kind: "csv-number"; min: number; max: number; minExclusive?: boolean; int?: boolean }
  /** Only `value` is right (a password, a whole lot's quantity). */
  | { kind: "exactly"; value: unknown; normalise?: (v: string) => string }
  /** Anything at all here is refused (a key this request must not carry). */
  | { kind: "forbidden" }
  /** Values refused by a rule the models above do not cover, listed by hand. */
  | { kind: "custom"; values: fc.Arbitrary<unknown> };

const PLAIN_DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;
const inRange = (n: number, s: { min: number; max: number; minExclusive?: boolean; int?: boolean }) =>
  Number.isFinite(n) && (s.minExclusive ? n > s.min : n >= s.min) && n <= s.max && (!s.int || Number.isInteger(n));
const isDay = (v: string) => /^\d{4}-\d{2}-\d{2}$/.test(v) && !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v);

/** Whether the contract accepts this (JSON round-tripped) value in the slot. */
export function accepts(slot: Slot, v: unknown): boolean {
  switch (slot.kind) {
    case "number":
      if (slot.coerced) {
        if (v === "" || v === null) return Boolean(slot.optional);
        return (typeof v === "number" || typeof v === "string") && inRange(Number(v), slot);
      }
      return typeof v === "number" && inRange(v, slot);
    case "text":
      return typeof v === "string" && v.trim().length <= slot.max && (!slot.required || v.trim().length > 0);
    case "enum":
      return slot.values.some((x) => x === v || (typeof v === "string" && slot.normalise?.(v) === x));
    case "ref": {
      if (slot.blankOk && (v === "" || v === null)) return true;
      if (typeof v !== "string") return false;
      const known = new Set(slot.known());
      return known.has(v) || known.has(slot.normalise?.(v) ?? v);
    }
    case "datetime":
      return typeof v === "string" && /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/.test(v) && isDay(v.slice(0, 10));
    case "day":
      return typeof v === "string" && ((slot.blankOk && v.trim() === "") || isDay(v.trim()));
    case "csv-number":
      return typeof v === "string" && PLAIN_DECIMAL.test(v.trim()) && inRange(Number(v.trim()), slot);
    case "exactly":
      return v === slot.value || (typeof v === "string" && slot.normalise?.(v) === slot.value);
    case "forbidden":
      return false;
    case "custom":
      return false;
  }
}

const roundTrip = (v: unknown) => JSON.parse(JSON.stringify(v) ?? "null") as unknown;
const anyJson = fc.jsonValue({ maxDepth: 2 });
const wrongTypes = fc.oneof(fc.boolean(), fc.constant(null), fc.integer(), fc.double(), fc.array(anyJson, { maxLength: 3 }), fc.dictionary(fc.string({ maxLength: 6 }), anyJson, { maxKeys: 3 }));
/** Out-of-range numbers: below, above, and the usual suspects (MAX_VALUE, 2^53 + 1, 1e21 which JSON writes in exponent form). */
function outOfRange(s: { min: number; max: number; minExclusive?: boolean; int?: boolean }) {
  const arbs: fc.Arbitrary<number>[] = [fc.constantFrom(1e308, -1e308, Number.MAX_VALUE, 2 ** 53 + 1, 1e21, -1, -0.0001, 0)];
  if (Number.isFinite(s.min)) {
    arbs.push(fc.double({ max: s.min, maxExcluded: !s.minExclusive, noNaN: true, noDefaultInfinity: true }));
    // Just below the minimum: the right type and size, so the checks behind the schema see it too.
    arbs.push(fc.double({ min: s.min - Math.abs(s.min) - 1, max: s.min, maxExcluded: !s.minExclusive, noNaN: true }));
  }
  if (s.max < Number.MAX_VALUE) {
    arbs.push(fc.double({ min: s.max, minExcluded: true, noNaN: true, noDefaultInfinity: true }));
    arbs.push(fc.double({ min: s.max, max: s.max * 2 + 1, minExcluded: true, noNaN: true }));
  }
  if (s.int && Number.isFinite(s.min) && Number.isFinite(s.max)) arbs.push(fc.double({ min: s.min, max: s.max, noNaN: true }).filter((x) => !Number.isInteger(x)));
  return fc.oneof(...arbs);
}
const badDateTimes = fc.constantFrom("2026-02-30T12:00:00Z", "2026-13-01T00:00:00Z", "2026-10-01", "2026-10-01T12:00:00", "2026-10-01 12:00:00Z", "yesterday", "", "9999999-01-01T00:00:00Z", "2026-10-01T25:00:00Z", "0000-00-00T00:00:00Z");
// 2026/10/02, 2026-1-2 and 2026年10月2日 are days as people type them (src/domain/typed-input.ts): these are not.
const badDays = fc.constantFrom("2026-02-30", "2025-02-29", "2026-13-01", "26-10-02", "2026/02/30", "02.10.2026", "2026-10-02T00:00", "yesterday", "2026-1-32", "+2026-10-02", "2026年13月1日", "2026/10-02");
const badDecimals = fc.constantFrom("NaN", "Infinity", "-Infinity", "1e3", "1E3", "0x10", "0b1", "1_000", "１，２", "1,5", "1,2345", ",100", "", " ", "-", ".", "5.5.5", "99999999999999999999", "-5", "0");

/** Values the slot must refuse: mostly the right type with a wrong value, so the checks behind the schema are reached too. */
export function invalidFor(slot: Slot, stringsOnly = false): fc.Arbitrary<unknown> {
  const w = (weight: number, arbitrary: fc.Arbitrary<unknown>) => ({ weight, arbitrary });
  const types = stringsOnly ? 0 : 1;
  let candidates: fc.Arbitrary<unknown>;
  switch (slot.kind) {
    case "number":
      candidates = slot.coerced
        ? fc.oneof(w(4, outOfRange(slot)), w(1, fc.constantFrom(...INJECTIONS, "NaN", "Infinity", "1e999", "five")), w(1, fc.string({ maxLength: 8 })), w(1, fc.dictionary(fc.string({ maxLength: 4 }), anyJson, { maxKeys: 2 })), w(1, fc.constant(null)))
        : fc.oneof(w(4, outOfRange(slot)), w(1, wrongTypes), w(1, fc.constantFrom(NaN, Infinity, -Infinity)), w(1, fc.string({ maxLength: 8 })));
      break;
    case "text":
      candidates = fc.oneof(w(3, overlong(slot.max)), w(types, wrongTypes), w(slot.required ? 1 : 0, fc.constantFrom("", " ", "\t\n ", "\u3000", "\u00a0")));
      break;
    case "enum":
    case "ref":
    case "exactly":
      candidates = fc.oneof(
        // Another value the schema knows (another step, kind, role) that this request still must refuse.
        w(slot.kind === "enum" && slot.universe ? 4 : 0, fc.constantFrom(...((slot.kind === "enum" && slot.universe) || [null]))),w(2, fc.constantFrom(...INJECTIONS)), w(2, fc.string({ maxLength: 12 })), w(1, overlong(64)), w(types, wrongTypes), w(2, fc.constantFrom("ZZ99-0001", "no-such-thing", "H26-9999", "grower-nakase", "field-nakase-river", "P26-0002", "H26-0001")));
      break;
    case "datetime":
      candidates = fc.oneof(w(3, badDateTimes), w(1, fc.constantFrom(...INJECTIONS)), w(types, wrongTypes));
      break;
    case "day":
      candidates = fc.oneof(w(3, badDays), w(1, fc.constantFrom(...INJECTIONS)));
      break;
    case "csv-number":
      candidates = fc.oneof(w(2, badDecimals), w(1, fc.constantFrom(...INJECTIONS)), w(3, outOfRange(slot).map(String)));
      break;
    case "forbidden":
      candidates = anyJson;
      break;
    case "custom":
      candidates = slot.values;
      break;
  }
  return candidates.filter((v) => !accepts(slot, roundTrip(v)) && (!stringsOnly || typeof v === "string"));
}

export type Path = readonly (string | number)[];
export type BodyCase = {
  /** A body the endpoint accepts as it stands (the test checks that once, after the fuzzing). */
  base: Record<string, unknown>;
  /** `cell`: a CSV cell, always a string in the request; its corruptions are strings too, so the row checks are reached. */
  slots: { path: Path; slot: Slot; required?: boolean; cell?: boolean }[];
  /** The schema refuses unknown keys. */
  strict?: boolean;
  /** String slots to fill with hostile (but allowed) text beside the corruption. */
  text?: Path[];
};

/** A request body as sent: raw text (undefined: no body at all) or form fields, with a content type. */
export type Attempt = { what: string; raw?: string; form?: [string, string | File][]; contentType?: string; headers?: Record<string, string> };

function setAt(target: Record<string, unknown>, path: Path, value: unknown): void {
  let node = target as Record<string | number, unknown>;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
  node[path[path.length - 1]!] = value;
}
function deleteAt(target: Record<string, unknown>, path: Path): void {
  let node = target as Record<string | number, unknown>;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
  if (Array.isArray(node)) node.splice(Number(path[path.length - 1]), 1);
  else delete node[path[path.length - 1]!];
}

const RAW_MARK = "@@raw@@";
/** Number tokens JSON does not have (or has, as 1e999, only to overflow to Infinity). */
const RAW_NUMBERS = fc.constantFrom("NaN", "Infinity", "-Infinity", "1e999", "-1e999", "0x10", ".5", "01", "+5", "1_000", "5.", "- 5");
const JSON_TYPES = fc.constantFrom("application/json", "application/json", "text/plain", "application/x-www-form-urlencoded", "application/json; charset=utf-16", "application/xml", undefined);
const BROKEN_BODIES = fc.constantFrom(undefined, "", " ", "null", "true", "[]", '"text"', "42", "{", "}", '{"a":}', "NaN", "Infinity", "\u0000", "{\"a\":1}garbage", "[".repeat(20_000) + "]".repeat(20_000));

/** Bodies that must be refused: one to three slots corrupted, a required key dropped, an unknown key, a raw token, or no JSON at all. */
export function badJsonBody(c: BodyCase): fc.Arbitrary<Attempt> {
  const n = c.slots.length;
  const withText = (body: Record<string, unknown>, paths: Path[]) =>
    fc.tuple(...paths.map((path) => fc.option(hostileText, { nil: undefined }).map((text) => ({ path, text })))).map((fills) => {
      for (const { path, text } of fills) if (text !== undefined) setAt(body, path, text);
      return body;
    });
  // Mostly one corruption at a time, so that each reaches the check meant for it.
  const picks = (count: number) => fc.uniqueArray(fc.integer({ min: 0, max: n - 1 }), { minLength: Math.min(count, n), maxLength: Math.min(count, n) });
  const corrupted = fc
    .oneof({ weight: 8, arbitrary: picks(1) }, { weight: 2, arbitrary: picks(2) }, { weight: 1, arbitrary: picks(3) })
    .chain((chosen) => fc.tuple(...chosen.map((i) => invalidFor(c.slots[i]!.slot, c.slots[i]!.cell).map((value) => ({ ...c.slots[i]!, value })))))
    .chain((changes) => {
      const body = structuredClone(c.base);
      for (const { path, value } of changes) setAt(body, path, value);
      const untouched = (c.text ?? []).filter((p) => !changes.some((ch) => ch.path.join(".") === p.join(".")));
      return withText(body, untouched).map((b) => ({ body: b, what: changes.map((ch) => `${ch.path.join(".")}=${JSON.stringify(ch.value)?.slice(0, 80)}`).join(", ") }));
    });
  const dropped = fc.constantFrom(...c.slots.filter((s) => s.required)).map((s) => {
    const body = structuredClone(c.base);
    deleteAt(body, s.path);
    return { body, what: `without ${s.path.join(".")}` };
  });
  const unknownKey = fc.tuple(fc.string({ minLength: 1, maxLength: 12 }).filter((k) => !(k in c.base) && k !== "__proto__"), anyJson).map(([key, value]) => ({ body: { ...structuredClone(c.base), [key]: value }, what: `unknown key ${JSON.stringify(key)}` }));
  const numberSlots = c.slots.filter((s) => s.slot.kind === "number");
  const rawToken = fc.tuple(fc.constantFrom(...(numberSlots.length ? numberSlots : c.slots)), RAW_NUMBERS).map(([s, token]) => {
    const body = structuredClone(c.base);
    setAt(body, s.path, RAW_MARK);
    return { raw: JSON.stringify(body).replace(`"${RAW_MARK}"`, token), what: `${s.path.join(".")}=${token} (raw)` };
  });
  const asJson = (arb: fc.Arbitrary<{ body: Record<string, unknown>; what: string }>) =>
    fc.tuple(arb, fc.oneof({ weight: 4, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) })).map(([{ body, what }, pollute]) => ({
      // A "__proto__" key in the JSON text becomes an own property, never the prototype (ECMA-262 JSON.parse).
      raw: pollute ? JSON.stringify(body).replace(/^\{(?!\})/, '{"__proto__":{"polluted":"yes"},') : JSON.stringify(body),
      what: pollute ? `${what} + __proto__` : what,
    }));
  const multipart = fc.constant({ form: Object.entries(c.base).map(([k, v]) => [k, typeof v === "string" ? v : JSON.stringify(v)] as [string, string]), what: "multipart form where JSON is expected" });
  const json = fc.oneof(
    { weight: 12, arbitrary: asJson(corrupted) },
    { weight: c.slots.some((s) => s.required) ? 1 : 0, arbitrary: asJson(dropped) },
    { weight: c.strict ? 1 : 0, arbitrary: asJson(unknownKey) },
    { weight: 2, arbitrary: rawToken },
    { weight: 2, arbitrary: BROKEN_BODIES.map((raw) => ({ raw, what: `body ${JSON.stringify(raw?.slice(0, 20))}${raw && raw.length > 20 ? "…" : ""}` })) },
  );
  return fc.oneof(
    { weight: 9, arbitrary: fc.tuple(json, JSON_TYPES).map(([a, contentType]): Attempt => ({ ...a, contentType, what: `${a.what} as ${contentType ?? "the default content type"}` })) },
    { weight: 1, arbitrary: multipart },
  );
}

/** An Idempotency-Key header now and then: printable ASCII, sometimes longer than the 200 the server keeps. */
export const maybeIdempotencyKey: fc.Arbitrary<Record<string, string>> = fc
  .option(fc.stringMatching(/^[\x21-\x7e]{1,260}$/), { nil: undefined })
  .map((key): Record<string, string> => (key ? { "idempotency-key": key } : {}));
