// Event-level attributes are capped: 32 names, 4 KB as stored, flat. Before the caps a
// 10,000-name object of 200-character values (about 2.4 MB) was stored on one event and read
// back on every trace. The figures are the project's own choice (src/lib/validation/events.ts);
// sizes are counted as UTF-8 bytes (RFC 3629), as SQLite stores the JSON text.
import { beforeAll, describe, expect, it } from "vitest";
import { MAX_EVENT_ATTRIBUTE_BYTES, MAX_EVENT_ATTRIBUTES } from "@/lib/validation/events";
import { POST as eventsRoute } from "../../app/api/events/route";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

let brewer: string;
beforeAll(async () => {
  brewer = await signInAs("brewer@example.com");
});

const measuring = (attributes: unknown) => ({
  step: "measuring",
  inputs: [{ lot: "P26-0001", quantity: 0 }],
  measurements: [{ name: "moisturePct", value: 13.1, unit: "%" }],
  attributes,
});
const named = (count: number, value: (i: number) => string | number = () => 1) => Object.fromEntries(Array.from({ length: count }, (_, i) => [`a${i}`, value(i)]));
const post = (body: unknown) => call(eventsRoute, jsonRequest("/api/events", { cookie: brewer, body }));

describe("event attributes", () => {
  it(`takes ${MAX_EVENT_ATTRIBUTES} names within ${MAX_EVENT_ATTRIBUTE_BYTES} bytes and stores them as sent`, async () => {
    const attributes = named(MAX_EVENT_ATTRIBUTES, (i) => `v${i}`);
    const res = await post(measuring(attributes));
    expect(res.status).toBe(201);
    const { getSqlite } = await import("@/server/platform/db");
    const stored = getSqlite().prepare("select attributes from events where id = ?").get(res.body.id) as { attributes: string };
    expect(JSON.parse(stored.attributes)).toMatchObject(attributes);
  });

  const refused: [string, unknown, string][] = [
    ["33 names", named(MAX_EVENT_ATTRIBUTES + 1), "Record at most 32 attributes on one event."],
    ["10,000 names of 200 characters (the attack: 2.4 MB on one event)", named(10_000, () => "x".repeat(200)), "Record at most 32 attributes on one event."],
    // 30 names of 150 characters: under the count, but 30 × (150 + 8) bytes is over 4,096.
    ["30 names over 4 KB in all", named(30, () => "x".repeat(150)), "The attributes take more than 4 KB; shorten the text in them."],
    // "é" is two bytes in UTF-8: 20 × 110 of them is 4,400 bytes in 2,200 characters.
    ["text counted in bytes, not characters", named(20, () => "é".repeat(110)), "The attributes take more than 4 KB; shorten the text in them."],
  ];
  it.each(refused)("%s: 422 at the field, nothing written", async (_name, attributes, message) => {
    const before = await tableDigests();
    const res = await post(measuring(attributes));
    expect(res.status).toBe(422);
    expect(res.body.error.fields.attributes).toContain(message);
    expect(await tableDigests()).toEqual(before);
  });

  it("a nested value is refused: attributes are one level deep", async () => {
    const res = await post(measuring({ addition: { again: { and: "again" } } }));
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.fields)).toEqual(["attributes.addition"]);
  });
});
