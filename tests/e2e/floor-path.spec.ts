import jsQR from "jsqr";
import { PNG } from "pngjs";
import { expect, test, type Page } from "@playwright/test";
import { signInAndLand } from "./helpers";

test.use({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });

/** Fills a floor screen, submits it, and returns the codes of the lots it made. */
async function record(page: Page, action: string, lot: string, values: Record<string, string>, select: Record<string, string> = {}) {
  await page.goto(`/floor/${action}?lot=${lot}`);
  const form = page.getByTestId("floor-form");
  for (const [label, value] of Object.entries(select)) await form.getByLabel(label, { exact: true }).selectOption(value);
  for (const [label, value] of Object.entries(values)) await form.getByLabel(label, { exact: true }).fill(value);
  await form.getByRole("button").last().click();
  const result = page.getByTestId("floor-result");
  await expect(result).toBeVisible();
  return result.locator(".code-chip").allTextContents();
}

test("one tank's whole path on a phone: soak, steam, split, koji, starter, three additions, press, bottle", async ({ page }) => {
  test.setTimeout(120_000);
  await signInAndLand(page, "brewer@example.com");

  const [soakedKoji] = await record(page, "soak", "P26-0005", { "Dry rice taken (kg)": "60", "Drained weight after soaking (kg)": "80", "Soak time (minutes)": "9", "Water temperature (°C)": "10" }, { "Rice for": "koji" });
  const [soakedMash] = await record(page, "soak", "P26-0005", { "Dry rice taken (kg)": "240", "Drained weight after soaking (kg)": "310", "Soak time (minutes)": "40", "Water temperature (°C)": "10" }, { "Rice for": "mash" });

  await page.goto(`/floor/steam?lot=${soakedKoji}`);
  await expect(page.getByTestId("caution-steam")).toBeVisible();
  const [steamedKoji] = await record(page, "steam", soakedKoji!, { "Steamed weight (kg)": "84", "Steaming time (minutes)": "50" });
  const [steamedMash] = await record(page, "steam", soakedMash!, { "Steamed weight (kg)": "330", "Steaming time (minutes)": "55" });

  const [forStarter, first, middle, final] = await record(page, "split", steamedMash!, {
    "For the starter (kg)": "30",
    "For the first addition (kg)": "60",
    "For the middle addition (kg)": "90",
    "For the final addition (kg)": "150",
  });

  await page.goto(`/floor/koji-check?lot=${steamedKoji}`);
  await expect(page.getByTestId("caution-koji")).toBeVisible();
  await record(page, "koji-check", steamedKoji!, { "Temperature (°C)": "34" }, { Checkpoint: "bringingIn" });
  await record(page, "koji-check", steamedKoji!, { "Temperature (°C)": "30.5" }, { Checkpoint: "inoculation" });
  const [koji] = await record(page, "koji", steamedKoji!, { "Koji out (kg)": "72", "Spores used (g)": "20" });

  const [starter] = await record(page, "starter", forStarter!, { "Koji lot": koji!, "Koji (kg)": "12", "Water (L)": "35" });

  await page.goto(`/floor/add?lot=${starter}`);
  await expect(page.getByTestId("caution-tank")).toBeVisible();
  // The first addition picks its tank from the register (seeded: Tank 5, empty).
  const [tank] = await record(page, "add", starter!, { "Koji lot": koji!, "Koji (kg)": "15", "Steamed rice lot": first!, "Steamed rice (kg)": "60", "Water (L)": "70" }, { Tank: "tank-5" });
  await record(page, "add", middle!, { "Tank lot": tank!, "Koji lot": koji!, "Koji (kg)": "20", "Water (L)": "120" }, { Addition: "middle" });
  await record(page, "add", final!, { "Tank lot": tank!, "Koji lot": koji!, "Koji (kg)": "25", "Water (L)": "200" }, { Addition: "final" });

  const tankLot = await (await page.request.get(`/api/lots/${tank}`)).json();
  // Starter 77 (12 + 30 + 35) + 15 + 60 + 70, then 20 + 90 + 120, then 25 + 150 + 200 kg.
  expect(tankLot.onHand).toBe(827);
  const [sake] = await record(page, "press", tank!, { "Sake out (L)": "500", "Lees (kg)": "120" });

  await page.goto(`/floor/bottle?lot=${sake}`);
  const form = page.getByTestId("floor-form");
  await form.getByLabel("Bottles filled").fill("100");
  await form.getByLabel("GTIN on the label").fill("4006381333932");
  await form.getByRole("button", { name: "Record bottling" }).click();
  await expect(page.getByTestId("floor-error")).toContainText("check digit");
  await form.getByLabel("GTIN on the label").fill("4006381333931");
  await form.getByRole("button", { name: "Record bottling" }).click();
  await expect(page.getByTestId("floor-result").locator(".code-chip").first()).toBeVisible();
  const bottled = (await page.getByTestId("floor-result").locator(".code-chip").allTextContents())[0]!;
  expect(bottled).toMatch(/^BT26-\d{4}$/);

  // The bottle's label decodes (independent decoder: jsQR) to its GS1 Digital Link URI.
  const png = PNG.sync.read(await (await page.request.get(`/api/lots/${bottled}/label.png`)).body());
  const decoded = jsQR(new Uint8ClampedArray(png.data), png.width, png.height);
  expect(decoded?.data).toBe(`http://localhost:${process.env.E2E_PORT || 3100}/01/04006381333931/10/${bottled}`);
});

test("an over-draw on the floor shows the 409 message and records nothing", async ({ page }) => {
  await signInAndLand(page, "brewer@example.com");
  const before = await (await page.request.get("/api/lots/P26-0002")).json();
  await page.goto("/floor/soak?lot=P26-0002");
  const form = page.getByTestId("floor-form");
  await form.getByLabel("Dry rice taken (kg)").fill(String(before.onHand + 1));
  await form.getByLabel("Drained weight after soaking (kg)").fill("9999");
  await form.getByLabel("Soak time (minutes)").fill("10");
  await form.getByLabel("Water temperature (°C)").fill("10");
  await form.getByRole("button", { name: "Record soak" }).click();
  await expect(page.getByTestId("floor-error")).toContainText(`has only ${before.onHand} kg on hand`);
  expect((await (await page.request.get("/api/lots/P26-0002")).json()).onHand).toBe(before.onHand);
});

test("an out-of-band absorption shows its warning before and after saving", async ({ page }) => {
  await signInAndLand(page, "brewer@example.com");
  await page.goto("/floor/soak?lot=P26-0002");
  const form = page.getByTestId("floor-form");
  await form.getByLabel("Rice for").selectOption("mash");
  await form.getByLabel("Dry rice taken (kg)").fill("10");
  await form.getByLabel("Drained weight after soaking (kg)").fill("14");
  await expect(page.getByTestId("absorption-preview")).toHaveText("Water absorption 40 % (band 25–30 %)");
  await form.getByLabel("Soak time (minutes)").fill("30");
  await form.getByLabel("Water temperature (°C)").fill("10");
  await form.getByRole("button", { name: "Record soak" }).click();
  await expect(page.getByTestId("floor-result").getByRole("alert")).toHaveText("Water absorption 40 % is outside the target band 25–30 %.");
});
