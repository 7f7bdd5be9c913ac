import { expect, test } from "@playwright/test";
import { signInAndLand } from "./helpers";

test("responses carry the security headers", async ({ request }) => {
  for (const path of ["/sign-in", "/api/me", "/01/09506000134352/10/NOPE"]) {
    const res = await request.get(path);
    const h = res.headers();
    expect(h["content-security-policy"], path).toContain("frame-ancestors 'none'");
    expect(h["content-security-policy"], path).toContain("default-src 'self'");
    expect(h["x-content-type-options"], path).toBe("nosniff");
    expect(h["referrer-policy"], path).toBe("strict-origin-when-cross-origin");
    expect(h["x-frame-options"], path).toBe("DENY");
  }
});

test("stored text with script in it renders as text, never runs", async ({ page }) => {
  let dialogs = 0;
  page.on("dialog", async (d) => {
    dialogs++;
    await d.dismiss();
  });
  await signInAndLand(page, "admin@example.com");
  await page.goto("/admin/parties");
  const name = `<script>alert("x")</script><img src=x onerror=alert(1)> Buyer ${Date.now()}`;
  const form = page.locator("form").filter({ has: page.getByRole("button", { name: "Save party" }) });
  await form.getByLabel("Kind").selectOption("buyer");
  await form.getByLabel("Name", { exact: true }).fill(name);
  await form.getByRole("button", { name: "Save party" }).click();
  await expect(page.getByTestId("form-message")).toHaveText("Party saved.");
  await page.reload();
  await expect(page.getByTestId("parties-table")).toContainText('<script>alert("x")</script>');
  expect(await page.locator("img[src=x]").count()).toBe(0);
  expect(dialogs).toBe(0);
});

test("200 concurrent draws from one lot: accepted draws never exceed what it had, and exactly those are recorded", async ({ page }) => {
  test.setTimeout(120_000);
  await signInAndLand(page, "grower@example.com");
  const harvest = await (await page.request.post("/api/harvests", { data: { fieldId: "field-ikeda-cedar", variety: "Omachi", cropYear: 2026, brownKg: 150, moisturePct: 14.2, grade: "2", bags: 3 } })).json();
  // A receipt needs the sender's word: the grower dispatches the lot to the mill first.
  expect((await page.request.post("/api/events", { data: { step: "shipping", inputs: [{ lot: harvest.code, quantity: 150 }], counterpartyId: "mill-shirotae", referenceDoc: "DS-E2E-150" } })).status()).toBe(201);
  await page.request.post("/api/auth/sign-out");
  await signInAndLand(page, "miller@example.com");
  expect((await page.request.post("/api/events", { data: { step: "receiving", inputs: [{ lot: harvest.code, quantity: 150 }] } })).status()).toBe(201);

  // Each request draws 1 kg; 200 requests race for 150 kg.
  const draws = await Promise.all(
    Array.from({ length: 200 }, () =>
      page.request.post("/api/events", { data: { step: "polishing", inputs: [{ lot: harvest.code, quantity: 1 }], outputs: [{ kind: "polished", quantity: 0.7 }], measurements: [{ name: "targetPolishingRatioPct", value: 70, unit: "%" }] } }),
    ),
  );
  const statuses = draws.map((r) => r.status());
  expect(statuses.every((s) => s === 201 || s === 409)).toBe(true);
  const accepted = statuses.filter((s) => s === 201).length;
  expect(accepted).toBe(150);
  const lot = await (await page.request.get(`/api/lots/${harvest.code}`)).json();
  expect(lot.onHand).toBeCloseTo(0, 9);
  const events = (await (await page.request.get(`/api/lots/${harvest.code}/events`)).json()).items;
  expect(events.filter((e: { step: string }) => e.step === "polishing")).toHaveLength(accepted);
});

// RFC 3986 §2.1: a percent-escape is "%" and two hexadecimal digits. Next's router answered
// these with a bare 500; the production server's front door (src/server/platform/front-door.ts) says 400.
test("a path with a broken percent-escape gets 400 with the security headers", async ({ request }) => {
  for (const path of ["/lots/%E0%A4%A", "/api/lots/%zz", "/01/%/10/x"]) {
    const res = await request.get(path);
    expect(res.status(), path).toBe(400);
    expect(res.headers()["content-security-policy"], path).toContain("frame-ancestors 'none'");
    expect(res.headers()["x-content-type-options"], path).toBe("nosniff");
  }
});

// RFC 9110 §15.5.14: 413 Content Too Large. The declared length is judged before any byte of
// the body is read: the answer comes while the client still holds the body back.
test("a request declaring a 2 MB body gets 413 with the security headers, unread", async ({ baseURL }) => {
  const { request: send } = await import("node:http");
  for (const path of ["/api/events", "/api/fields", "/sign-in"]) {
    const answer = await new Promise<{ status: number; headers: Record<string, unknown> }>((resolve, reject) => {
      const req = send(`${baseURL}${path}`, { method: "POST", headers: { "content-type": "application/json", "content-length": String(2 * 1024 * 1024) } }, (res) => {
        resolve({ status: res.statusCode!, headers: res.headers });
        req.destroy();
      });
      req.on("error", reject);
      req.flushHeaders();
    });
    expect(answer.status, path).toBe(413);
    expect(answer.headers["content-security-policy"], path).toContain("frame-ancestors 'none'");
  }
});
