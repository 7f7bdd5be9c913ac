import { expect, test, type APIRequestContext } from "@playwright/test";
import { signInAndLand } from "./helpers";

// A polished lot the brewery holds in the demo season; the camera spec uses P26-0003.
const LOT = "P26-0002";

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

type LotEvent = { id: number; step: string; measurements: { name: string; value: number; unit: string }[] };

async function moistureReadings(api: APIRequestContext, value: number): Promise<LotEvent[]> {
  const response = await api.get(`/api/lots/${LOT}/events`);
  expect(response.status()).toBe(200);
  const { items } = (await response.json()) as { items: LotEvent[] };
  return items.filter((e) => e.step === "measuring" && e.measurements.some((m) => m.name === "moisturePct" && m.value === value && m.unit === "%"));
}

test("a moisture reading made offline waits on the phone and is recorded once when back online", async ({ page, context }) => {
  await signInAndLand(page, "brewer@example.com");
  const before = await moistureReadings(page.request, 13.1);
  await page.goto(`/scan?code=${LOT}`);
  const card = page.getByTestId("floor-lot-card");
  await expect(card.getByTestId("lot-code")).toHaveText(LOT);
  await expect(page.getByTestId("queue-panel")).toHaveCount(0);

  await context.setOffline(true);
  await card.getByLabel("Moisture (%)").fill("13.1");
  await card.getByRole("button", { name: "Record moisture" }).click();
  await expect(card.getByTestId("record-moisture").getByRole("status")).toHaveText(/kept on this phone/);
  const panel = page.getByTestId("queue-panel");
  await expect(panel.getByTestId("queue-count")).toHaveText("1 record waiting to be sent");
  await expect(panel).toContainText(`Moisture 13.1 % on ${LOT}`);

  // Back online, the first resend reaches the server but its answer is lost on the way back
  // (a dropped connection): the phone cannot know it was recorded, so it keeps the write.
  const keys: string[] = [];
  let loseAnswer = true;
  await page.route("**/api/events", async (route) => {
    keys.push(route.request().headers()["idempotency-key"] ?? "");
    if (!loseAnswer) return route.continue();
    loseAnswer = false;
    expect((await route.fetch()).status()).toBe(201);
    await route.abort("connectionreset");
  });
  await context.setOffline(false);
  await expect.poll(() => keys.length).toBe(1);
  await expect(panel.getByTestId("queue-count")).toHaveText("1 record waiting to be sent");

  // Two quick taps on "Send now", then a reload (which flushes on load): one record in all.
  await panel.getByRole("button", { name: "Send now" }).dblclick();
  await expect(page.getByTestId("queue-panel")).toHaveCount(0);
  await page.reload();
  await expect(page.getByTestId("floor-lot-card")).toBeVisible();
  await expect(page.getByTestId("queue-panel")).toHaveCount(0);

  expect(keys.length).toBeGreaterThanOrEqual(2);
  expect(new Set(keys).size).toBe(1);
  expect(keys[0]).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  const after = await moistureReadings(page.request, 13.1);
  expect(after.length - before.length).toBe(1);
});

test("an answer from the server is shown, never queued; a write refused on resend waits with its error until discarded", async ({ page, context }) => {
  await signInAndLand(page, "brewer@example.com");
  await page.goto(`/scan?code=${LOT}`);
  const card = page.getByTestId("floor-lot-card");
  const conflict = { error: { code: "conflict", message: "This lot is not held by your party." } };
  let answered = 0;
  await page.route("**/api/events", async (route) => {
    answered += 1;
    await route.fulfill({ status: 409, json: conflict });
  });

  await card.getByLabel("Moisture (%)").fill("12.7");
  await card.getByRole("button", { name: "Record moisture" }).click();
  await expect(card.getByTestId("record-moisture").getByRole("alert")).toHaveText("Not recorded: This lot is not held by your party.");
  await expect(page.getByTestId("queue-panel")).toHaveCount(0);
  expect(answered).toBe(1);

  await context.setOffline(true);
  await card.getByLabel("Moisture (%)").fill("12.8");
  await card.getByRole("button", { name: "Record moisture" }).click();
  const panel = page.getByTestId("queue-panel");
  await expect(panel.getByTestId("queue-count")).toHaveText("1 record waiting to be sent");
  await context.setOffline(false);
  await expect(panel).toContainText("Not accepted: This lot is not held by your party.");
  expect(answered).toBe(2);

  // Kept for the person to read, not retried on every load.
  await page.reload();
  await expect(page.getByTestId("queue-panel")).toContainText("Not accepted");
  expect(answered).toBe(2);
  // Discarding asks first: one tap is not enough.
  await page.getByTestId("queue-panel").getByRole("button", { name: "Discard" }).click();
  await expect(page.getByTestId("queue-panel").getByTestId("queue-count")).toHaveText("1 record waiting to be sent");
  await page.getByTestId("queue-panel").getByRole("button", { name: "Tap again to discard" }).click();
  await expect(page.getByTestId("queue-panel")).toHaveCount(0);
  expect(await moistureReadings(page.request, 12.8)).toHaveLength(0);
});

test("a moisture reading refused on resend opens again in its box, as typed, with the answer; fixed, it is recorded once", async ({ page, context }) => {
  await signInAndLand(page, "brewer@example.com");
  await page.goto(`/scan?code=${LOT}`);
  const card = page.getByTestId("floor-lot-card");
  // The server's answer to the first resend is a refusal (stood in for here); later ones reach it.
  const refusal = { error: { code: "invalid", message: "Some fields need correcting.", fields: { "measurements.0.value": ["Check the reading against the meter."] } } };
  let refused = false;
  await page.route("**/api/events", async (route) => {
    if (refused) return route.continue();
    refused = true;
    await route.fulfill({ status: 422, json: refusal });
  });

  await context.setOffline(true);
  await card.getByLabel("Moisture (%)").fill("13.7");
  await card.getByRole("button", { name: "Record moisture" }).click();
  const panel = page.getByTestId("queue-panel");
  await expect(panel.getByTestId("queue-count")).toHaveText("1 record waiting to be sent");
  await context.setOffline(false);
  await expect(panel).toContainText("Not accepted: Some fields need correcting.");

  await panel.getByRole("link", { name: "Open to fix" }).click();
  const box = page.getByTestId("floor-lot-card").getByTestId("record-moisture");
  await expect(box.getByLabel("Moisture (%)")).toHaveValue("13.7");
  await expect(box.getByRole("alert")).toHaveText("Not recorded: Some fields need correcting. Check the reading against the meter.");
  await box.getByLabel("Moisture (%)").fill("13.6");
  await box.getByRole("button", { name: "Record moisture" }).click();
  await expect(box.getByRole("status")).toHaveText(`Moisture 13.6 % recorded for ${LOT}.`);
  await expect(page.getByTestId("queue-panel")).toHaveCount(0);
  expect(await moistureReadings(page.request, 13.6)).toHaveLength(1);
  expect(await moistureReadings(page.request, 13.7)).toHaveLength(0);
});
