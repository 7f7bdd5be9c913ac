import { expect, test } from "@playwright/test";
import { signInAndLand } from "./helpers";

test("sales types a bottle code and gets the provenance answer, sheet and all", async ({ page }) => {
  await signInAndLand(page, "sales@example.com");
  const bottled = await (await page.request.get("/api/lots?kind=bottled&limit=50&sort=code&dir=asc")).json();
  const blend = bottled.items.find((l: { attributes: { gtin?: string } }) => l.attributes.gtin === "9506000134376");
  await page.getByLabel("Type the code").fill(blend.code);
  await page.getByRole("button", { name: "Find" }).click();
  const card = page.getByTestId("provenance-card");
  await expect(card.getByTestId("prov-origin")).toContainText("Hyogo, Okayama");
  await expect(card.getByTestId("prov-growers")).toContainText("Growers who asked not to be named");
  await expect(card.getByTestId("prov-growers")).toContainText("Upper Asagiri Growers' Cooperative");
  await expect(card.getByTestId("prov-categories")).toContainText("None of the premium categories");
  const download = page.waitForEvent("download");
  await page.getByRole("link", { name: "Provenance sheet (PDF)" }).click();
  expect((await download).suggestedFilename()).toBe(`grainline-provenance-${blend.code}.pdf`);
});

test("the public bottle page opens without signing in and shows no prices or contact details", async ({ browser }) => {
  const admin = await browser.newContext();
  const adminPage = await admin.newPage();
  await signInAndLand(adminPage, "admin@example.com");
  const bottled = await (await adminPage.request.get("/api/lots?kind=bottled&limit=50")).json();
  const jd = bottled.items.find((l: { attributes: { gtin?: string } }) => l.attributes.gtin === "9506000134352");
  await admin.close();

  const visitor = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await visitor.newPage();
  const res = await page.goto(`/01/09506000134352/10/${jd.code}`);
  expect(res?.status()).toBe(200);
  await expect(page.getByTestId("public-bottle")).toContainText("Where the rice in this bottle came from");
  await expect(page.getByTestId("prov-categories")).toContainText("junmai daiginjo");
  await expect(page.getByTestId("prov-origin")).toContainText("Hyogo, Okayama");
  const html = await page.content();
  // No e-mail address, no phone number, no yen figure anywhere in the page.
  expect(html).not.toMatch(/[\w.+-]+@[\w-]+\.[\w.]+/);
  expect(html).not.toMatch(/\+81|\b0\d{1,4}-\d{1,4}-\d{3,4}\b/);
  expect(html).not.toMatch(/¥|\byen\b|JPY/i);

  const missing = await page.goto("/01/09506000134352/10/BT99-9999");
  expect(missing?.status()).toBe(404);
  await expect(page.getByText("We could not find this bottling.")).toBeVisible();
  await visitor.close();
});
