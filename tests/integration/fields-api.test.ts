import { describe, expect, it } from "vitest";
import { GET as listFields, POST as createField } from "../../app/api/fields/route";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

describe("fields (paddies)", () => {
  it("shows a grower only their own fields", async () => {
    const cookie = await signInAs("grower@example.com");
    const res = await call(listFields, jsonRequest("/api/fields", { cookie }));
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
    expect(res.body.items.every((f: { growerId: string }) => f.growerId === "grower-ikeda")).toBe(true);
  });

  it("registers a field for the grower themself, whatever growerId they send", async () => {
    const cookie = await signInAs("grower2@example.com");
    const created = await call(createField, jsonRequest("/api/fields", { cookie, body: { name: "Willow Strip", region: "Hyogo", areaHa: 0.45, growerId: "grower-ikeda" } }));
    expect(created.status).toBe(403);
    const own = await call(createField, jsonRequest("/api/fields", { cookie, body: { name: "Willow Strip", region: "Hyogo", areaHa: 0.45 } }));
    expect(own.status).toBe(201);
    const mine = await call(listFields, jsonRequest("/api/fields", { cookie }));
    expect(mine.body.items.find((f: { id: string }) => f.id === own.body.id)).toMatchObject({ name: "Willow Strip", areaHa: 0.45, growerId: "grower-nakase" });
  });

  it("lets the admin register on any grower's behalf", async () => {
    const cookie = await signInAs("admin@example.com");
    const res = await call(createField, jsonRequest("/api/fields", { cookie, body: { name: "Lower Weir", region: "Okayama", areaHa: 2, growerId: "grower-coop" } }));
    expect(res.status).toBe(201);
  });

  it("refuses bad input with field errors and changes nothing", async () => {
    const cookie = await signInAs("grower@example.com");
    const before = await tableDigests();
    for (const body of [{ name: "", region: "Hyogo", areaHa: 1 }, { name: "X", region: "Hyogo", areaHa: -1 }, { name: "X", region: "Hyogo", areaHa: "NaN" }, { name: "X".repeat(500), region: "Hyogo", areaHa: 1 }]) {
      const res = await call(createField, jsonRequest("/api/fields", { cookie, body }));
      expect(res.status).toBe(422);
      expect(Object.keys(res.body.error.fields).length).toBeGreaterThan(0);
    }
    expect(await tableDigests()).toEqual(before);
  });

  it("is closed to the miller", async () => {
    const cookie = await signInAs("miller@example.com");
    expect((await call(listFields, jsonRequest("/api/fields", { cookie }))).status).toBe(403);
  });
});
