import { expect, test } from "@playwright/test";
import { DEMO_PASSWORD, registerHarvestOnForm, signInAndLand, signOut } from "./helpers";

// Figures as people type them on a Japanese keyboard: full-width digits fold to ASCII under
// NFKC (Unicode UAX #15); "," groups thousands in CLDR's ja and en number symbols.

test("a grower registers a harvest typed as 1,260 kg with full-width figures; it is stored as 1260", async ({ page }) => {
  await signInAndLand(page, "grower@example.com");
  const { code } = await registerHarvestOnForm(page, { field: { index: 0 }, variety: "Yamada Nishiki", cropYear: "２０２６", brownKg: "1,260", moisturePct: "１４．８", grade: "1", bags: "４２" });
  const response = await page.request.get(`/api/lots/${code}`);
  expect(response.status()).toBe(200);
  const lot = (await response.json()) as { quantity: number; onHand: number; cropYear: number; attributes: Record<string, unknown> };
  expect(lot).toMatchObject({ quantity: 1260, onHand: 1260, cropYear: 2026 });
  expect(lot.attributes).toMatchObject({ bags: 42 });

  // Groups of three only (common practice): "1,26" is no number, and the form says so beside the field.
  const form = page.getByTestId("harvest-form");
  await form.getByLabel("Brown rice (kg)").fill("1,26");
  await form.getByRole("button", { name: "Register harvest" }).click();
  await expect(form.getByText("Enter a number, e.g. 1,260 or 13.5.")).toBeVisible();
});

test.describe("on a phone", () => {
  test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

  test("a moisture reading typed with full-width digits (１３.５) is recorded as 13.5", async ({ page }) => {
    const LOT = "P26-0002";
    await signInAndLand(page, "brewer@example.com");
    await page.goto(`/scan?code=${LOT}`);
    const card = page.getByTestId("floor-lot-card");
    await expect(card.getByTestId("lot-code")).toHaveText(LOT);
    await card.getByLabel("Moisture (%)").fill("１３.５");
    await card.getByRole("button", { name: "Record moisture" }).click();
    await expect(card.getByTestId("record-moisture").getByRole("status")).toHaveText(`Moisture 13.5 % recorded for ${LOT}.`);
    const { items } = (await (await page.request.get(`/api/lots/${LOT}/events`)).json()) as { items: { step: string; measurements: { name: string; value: number }[] }[] };
    expect(items.some((e) => e.step === "measuring" && e.measurements.some((m) => m.name === "moisturePct" && m.value === 13.5))).toBe(true);
  });
});

test.describe("a floor form on a phone", () => {
  test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

  test("says which figure is no number before sending, and records full-width figures", async ({ page }) => {
    const LOT = "P26-0002";
    await signInAndLand(page, "brewer@example.com");
    const before = (await (await page.request.get(`/api/lots/${LOT}`)).json()) as { onHand: number };
    await page.goto(`/floor/soak?lot=${LOT}`);
    const form = page.getByTestId("floor-form");
    await form.getByLabel("Dry rice taken (kg)").fill("1,26");
    await form.getByLabel("Drained weight after soaking (kg)").fill("１.３");
    await form.getByRole("button", { name: "Record soak" }).click();
    await expect(page.getByTestId("floor-error")).toContainText("Enter a number, e.g. 1,260 or 13.5.");
    expect(((await (await page.request.get(`/api/lots/${LOT}`)).json()) as { onHand: number }).onHand).toBe(before.onHand);

    await form.getByLabel("Dry rice taken (kg)").fill("１");
    await form.getByLabel("Soak time (minutes)").fill("３０");
    await form.getByLabel("Water temperature (°C)").fill("１０");
    await form.getByRole("button", { name: "Record soak" }).click();
    await expect(page.getByTestId("floor-form")).toHaveCount(0);
    await expect.poll(async () => ((await (await page.request.get(`/api/lots/${LOT}`)).json()) as { onHand: number }).onHand).toBeCloseTo(before.onHand - 1, 6);
  });
});

test("the admin moves the brewery to another time zone and the times on screen move with it", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  const lotPageTime = async () => {
    await page.goto("/lots/H26-0001");
    const time = page.getByTestId("event-timeline").locator("time[datetime]").first();
    await expect(time).toBeVisible();
    return { at: new Date((await time.getAttribute("datetime"))!), shown: (await time.textContent())!.trim() };
  };
  // The reference: ECMA-402 Intl in the test's own Node, with offsets from the IANA tz database.
  const expected = (at: Date, timeZone: string) =>
    new Intl.DateTimeFormat("en", { year: "numeric", month: "short", day: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZone }).format(at);

  const tokyo = await lotPageTime();
  expect(tokyo.shown).toBe(expected(tokyo.at, "Asia/Tokyo"));

  const saveZone = async (zone: string) => {
    await page.goto("/admin/settings");
    const form = page.getByTestId("settings-form");
    await form.getByLabel("Time zone (IANA name)").fill(zone);
    await form.getByRole("button", { name: "Save settings" }).click();
    return form;
  };
  // A zone the IANA list lacks: a clear message beside the field, nothing saved.
  const refused = await saveZone("Asia/Osaka");
  await expect(refused.getByText("Choose a time zone from the list (e.g. Asia/Tokyo).")).toBeVisible();
  expect((await lotPageTime()).shown).toBe(tokyo.shown);

  const saved = await saveZone("America/New_York");
  await expect(saved.getByTestId("form-message")).toHaveText(/Settings saved/);
  const newYork = await lotPageTime();
  expect(newYork.shown).toBe(expected(tokyo.at, "America/New_York"));
  expect(newYork.shown).not.toBe(tokyo.shown);

  // Back to the default, for the specs that follow.
  await saveZone("Asia/Tokyo");
  expect((await lotPageTime()).shown).toBe(tokyo.shown);
  await signOut(page);
});

test.describe("in Japanese", () => {
  test.use({ locale: "ja-JP" });

  test("times on the lot page are written year first, 2026/10/03 14:05, on the brewery's clock", async ({ page }) => {
    await page.goto("/sign-in");
    await expect(page.locator("html")).toHaveAttribute("lang", "ja");
    await page.locator('input[name="email"]').fill("admin@example.com");
    await page.locator('input[name="password"]').fill(DEMO_PASSWORD);
    await page.locator('input[name="password"]').press("Enter");
    await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
    await page.goto("/lots/H26-0001");
    const time = page.getByTestId("event-timeline").locator("time[datetime]").first();
    const at = new Date((await time.getAttribute("datetime"))!);
    // Reference: ECMA-402 Intl with CLDR's ja patterns, in Asia/Tokyo (IANA: UTC+9, no DST).
    const expected = new Intl.DateTimeFormat("ja", { year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZone: "Asia/Tokyo" }).format(at);
    expect(expected).toMatch(/^\d{4}\/\d{2}\/\d{2} \d{2}:\d{2}$/);
    await expect(time).toHaveText(expected);
  });
});
