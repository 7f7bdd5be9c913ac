import { readFile } from "node:fs/promises";
import { expect, test, type Page } from "@playwright/test";
import { readPdfText } from "../support/pdf-read";

/** Signs in through the API (the form's labels are in the page's language); the context keeps the cookie. */
async function signInByApi(page: Page, email: string) {
  const res = await page.request.post("/api/auth/sign-in", { data: { email, password: "grainline-demo" } });
  expect(res.status()).toBe(200);
}

/** The seeded blend bottling (GTIN 9506000134376): 1,800 kg of Hyogo rice and 500 kg of Okayama rice behind it. */
async function blendBottlingCode(page: Page): Promise<string> {
  await signInByApi(page, "admin@example.com");
  const bottled = await (await page.request.get("/api/lots?kind=bottled&limit=50")).json();
  const code = bottled.items.find((l: { attributes: { gtin?: string } }) => l.attributes.gtin === "9506000134376").code as string;
  await page.context().clearCookies();
  return code;
}

/** The admin opens a supplier's account and downloads its first statement; pdf.js reads the text. */
async function statementText(page: Page, partyId: string): Promise<string> {
  await signInByApi(page, "admin@example.com");
  await page.goto(`/suppliers/${partyId}`);
  const download = page.waitForEvent("download");
  await page.getByTestId("statements-table").locator('a[href$="statement.pdf"]').first().click();
  return readPdfText(await readFile(await (await download).path()));
}

test.describe("a browser that reads Japanese", () => {
  test.use({ locale: "ja-JP" });

  test("the public bottle page gives the rice origin in Japanese, prefectures by weight", async ({ page }) => {
    const code = await blendBottlingCode(page);
    expect((await page.goto(`/01/09506000134376/10/${code}`))?.status()).toBe(200);
    // MAFF rice traceability act: prefectures in descending order of weight, here in kanji with 産.
    await expect(page.getByTestId("prov-origin")).toContainText("兵庫県産、岡山県産");
    await expect(page.getByTestId("public-bottle")).not.toContainText("Where the rice in this bottle came from");
  });

  test("a statement downloads as a Japanese 仕入明細書 with the supplier's registration number", async ({ page }) => {
    const text = await statementText(page, "grower-coop");
    expect(text).toContain("仕入明細書");
    expect(text).toMatch(/登録番号\nT0000000000303/);
    expect(text).toContain("※");
    expect(text).toContain("※は軽減税率対象");
    expect(text).toMatch(/8 % 対象/);
    expect(text.replaceAll("\n", "")).toContain("ご確認");
    expect(text).toMatch(/\d{4}\/\d{2}\/\d{2}/);
  });
});

test.describe("a browser that reads English", () => {
  test.use({ locale: "en-US" });

  test("the public bottle page and the statement stay English", async ({ page }) => {
    const code = await blendBottlingCode(page);
    await page.goto(`/01/09506000134376/10/${code}`);
    await expect(page.getByTestId("prov-origin")).toContainText("Hyogo, Okayama");
    const text = await statementText(page, "grower-coop");
    expect(text).toMatch(/Statement S-\d{4}-\d{4}/);
    expect(text).toMatch(/Registration number\nT0000000000303/);
    expect(text).toContain("Subtotal 8 %*");
    expect(text).not.toContain("仕入明細書");
  });
});
