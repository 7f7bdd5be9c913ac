import { expect, test, type Browser, type Page } from "@playwright/test";
import { signInAndLand, signOut } from "./helpers";

// Issue 13, items 1, 5 and 7, on a phone. Figures: water absorption = (drained − dry) ÷ dry × 100
// (Nada brewers' research association glossary, ../shared/references.md); default bands are trade
// practice from memory (koji 30–35 %, mash 25–30 %).
test.use({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });

const result = (page: Page) => page.getByTestId("floor-result");

/** The miller's own session, through the API (the mill's steps are not on the brewer's phone). */
async function asMiller(browser: Browser, baseURL: string) {
  const context = await browser.newContext({ baseURL });
  const post = async (url: string, data: unknown) => {
    const res = await context.request.post(url, { data, headers: { origin: baseURL } });
    expect(res.status(), await res.text()).toBeLessThan(300);
    return res.json();
  };
  await post("/api/auth/sign-in", { email: "miller@example.com", password: "grainline-demo" });
  return { post, close: () => context.close() };
}

test("a mixed soak, timed; steaming and the split are each one tap away, and every portion says what it is for", async ({ page }) => {
  test.setTimeout(90_000);
  await signInAndLand(page, "brewer@example.com");
  await page.goto("/floor/soak?lot=P26-0001");
  const form = page.getByTestId("floor-form");
  // Soaking no longer forces one use for the whole lot.
  await expect(form.getByLabel("Rice for")).toHaveValue("mixed");
  await expect(form.getByLabel("Rice for").locator("option:checked")).toHaveText("Mixed (decided at the split)");

  // The timer keeps its start on the phone: a locked screen (here a reload) loses nothing.
  await page.getByRole("button", { name: "Start soak timer" }).click();
  await expect(page.getByTestId("soak-elapsed")).toContainText("Soaking: 0 min");
  await page.evaluate(() => localStorage.setItem("grainline:soak-timer:P26-0001", String(Date.now() - 450_000)));
  await page.reload();
  await expect(page.getByTestId("soak-elapsed")).toContainText("Soaking: 7 min 3");
  await page.getByRole("button", { name: "Stop and fill the soak time" }).click();
  // 7 min 30 s (give or take the seconds the reload took) is 7.5 minutes.
  await expect(form.getByLabel("Soak time (minutes)")).toHaveValue(/^7\.5\d?$/);

  await form.getByLabel("Dry rice taken (kg)").fill("100");
  await form.getByLabel("Drained weight after soaking (kg)").fill("132");
  // 32 %: inside the span of every use's band (25–35 %), though above the mash band.
  await expect(page.getByTestId("absorption-preview")).toHaveText("Water absorption 32 % (band 25–35 %)");
  await form.getByLabel("Water temperature (°C)").fill("10");
  await form.getByRole("button", { name: "Record soak" }).click();
  await expect(result(page).getByRole("alert")).toHaveCount(0);

  // The next likely step of the new lot is one tap away, and the tap is a client navigation
  // (FloorLink), not a full page load: a mark left on the window survives it.
  await page.evaluate(() => ((window as unknown as { floorMark: number }).floorMark = 1));
  await result(page).getByRole("link", { name: "Next: Steam" }).click();
  await expect(page).toHaveURL(/\/floor\/steam\?lot=SK26-\d{4}$/);
  expect(await page.evaluate(() => (window as unknown as { floorMark?: number }).floorMark)).toBe(1);
  // The caution is one line; its details open on a tap.
  const caution = page.getByTestId("caution-steam");
  await expect(caution).toContainText("Steam and hot rice burn");
  await expect(caution.getByText("Keep face and hands clear")).toBeHidden();
  await caution.getByText("Details").click();
  await expect(caution.getByText("Keep face and hands clear")).toBeVisible();
  expect((await caution.boundingBox())!.height).toBeGreaterThan(60);

  const steam = page.getByTestId("floor-form");
  await steam.getByLabel("Steamed weight (kg)").fill("140");
  await steam.getByLabel("Steaming time (minutes)").fill("50");
  await steam.getByRole("button", { name: "Record steaming" }).click();
  await result(page).getByRole("link", { name: "Next: Split steamed rice" }).click();
  await expect(page).toHaveURL(/\/floor\/split\?lot=ST26-\d{4}$/);

  const split = page.getByTestId("floor-form");
  await split.getByLabel("For koji (kg)").fill("30");
  await split.getByLabel("For the starter (kg)").fill("10");
  await split.getByLabel("For the first addition (kg)").fill("20");
  await split.getByLabel("For the middle addition (kg)").fill("30");
  await split.getByLabel("For the final addition (kg)").fill("50");
  await split.getByRole("button", { name: "Record split" }).click();
  const outputs = result(page).getByTestId("floor-output");
  await expect(outputs).toHaveCount(5);
  await expect(outputs.getByTestId("output-purpose")).toHaveText(["For koji", "For the starter", "For the first addition", "For the middle addition", "For the final addition"]);
  const codes = await outputs.locator(".code-chip").allTextContents();
  for (const [n, code] of codes.entries()) {
    await expect(outputs.nth(n).getByRole("link", { name: "Label" })).toHaveAttribute("href", `/labels?codes=${code}&layout=bag`);
  }
  await expect(outputs.nth(0).getByRole("link", { name: "Next: Koji temperature check" })).toBeVisible();
  await expect(outputs.nth(2).getByRole("link", { name: "Next: Add to a tank" })).toBeVisible();

  // Scanned later, a portion offers its use first and the split again.
  await page.goto(`/scan?code=${codes[2]}`);
  await expect(page.getByTestId("lot-portion")).toHaveText("For the first addition");
  const actions = page.getByTestId("floor-lot-card").getByRole("navigation").getByRole("link");
  await expect(actions).toHaveText(["Add to a tank", "Split steamed rice"]);

  await page.goto(`/labels?codes=${codes[0]}&layout=bag`);
  await expect(page.getByText(codes[0]!).first()).toBeVisible();
});

test("the card offers no steps on a lot the brewery does not hold: it says where the lot is", async ({ page, browser, baseURL }) => {
  const miller = await asMiller(browser, baseURL!);
  const run = await miller.post("/api/events", {
    step: "polishing",
    inputs: [{ lot: "H26-0006", quantity: 100 }],
    outputs: [{ kind: "polished", quantity: 60 }, { kind: "bran", quantity: 39 }],
    measurements: [{ name: "targetPolishingRatioPct", value: 60, unit: "%" }],
  });
  const polished = run.outputs.find((o: { kind: string }) => o.kind === "polished").code as string;

  await signInAndLand(page, "brewer@example.com");
  await page.goto(`/scan?code=${polished}`);
  const card = page.getByTestId("floor-lot-card");
  await expect(card.getByTestId("lot-whereabouts")).toHaveText("Held by Shirotae Polishing Works: only they record steps on this lot.");
  // Before: Soak was offered (and the moisture form shown) on the mill's lot.
  await expect(card.getByRole("link", { name: "Soak" })).toHaveCount(0);
  await expect(card.getByRole("button", { name: "Record moisture" })).toHaveCount(0);
  await page.goto(`/floor/soak?lot=${polished}`);
  await expect(page.getByTestId("lot-whereabouts")).toContainText("Held by Shirotae Polishing Works");
  await expect(page.getByTestId("floor-form")).toHaveCount(0);

  // The office records on any party's behalf (lots:act-any), so its card offers the step.
  await signOut(page);
  await signInAndLand(page, "admin@example.com");
  await page.goto(`/scan?code=${polished}`);
  await expect(card.getByRole("link", { name: "Soak" })).toBeVisible();
  await expect(card.getByTestId("lot-whereabouts")).toHaveCount(0);

  await miller.post("/api/events", { step: "shipping", inputs: [{ lot: polished, quantity: 60 }], counterpartyId: "brewery-kirinoha", referenceDoc: "SH-F1-01" });
  await miller.close();
  await page.goto(`/scan?code=${polished}`);
  await expect(card.getByTestId("lot-whereabouts")).toHaveText("On its way to Kirinoha Brewery: nothing is recorded on this lot until it is received.");
  await expect(card.getByRole("navigation").getByRole("link")).toHaveCount(0);
});

test("the brewer's phone menu reaches Receive and Brew days", async ({ page }) => {
  await signInAndLand(page, "brewer@example.com");
  await expect(page).toHaveURL(/\/scan$/);
  const menu = page.getByRole("navigation", { name: "Floor menu" });
  await menu.getByRole("link", { name: "Receive" }).click();
  await expect(page).toHaveURL(/\/receive$/);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await page.goto("/scan");
  await menu.getByRole("link", { name: "Brew days" }).click();
  await expect(page).toHaveURL(/\/brew-days$/);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
});
