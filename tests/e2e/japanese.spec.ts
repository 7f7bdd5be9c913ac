// Issue 14: the main floor flow once in Japanese — sign-in, a lot's scan card on a phone, a soak,
// the provenance card — found by the Japanese catalogue's own words (read from its files, never
// retyped), and the language switch: a visitor's cookie, a signed-in person's own setting.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { DEMO_PASSWORD } from "./helpers";

const catalogue = (locale: string) => {
  const dir = path.join(import.meta.dirname, "../../src/i18n/messages", locale);
  return Object.assign({}, ...readdirSync(dir).map((f) => JSON.parse(readFileSync(path.join(dir, f), "utf8")))) as Record<string, unknown>;
};
const lookup = (messages: Record<string, unknown>) => (key: string): string => {
  const value = key.split(".").reduce<unknown>((node, part) => (node as Record<string, unknown> | undefined)?.[part], messages);
  if (typeof value !== "string") throw new Error(`no message ${key}`);
  return value;
};
const ja = lookup(catalogue("ja"));
const en = lookup(catalogue("en"));
// Hiragana, Katakana, CJK ideographs (Unicode blocks U+3040–30FF, U+4E00–9FFF).
const JAPANESE = /[\u3040-\u30ff\u4e00-\u9fff]/;

test.use({ locale: "ja-JP" });

async function signInInJapanese(page: Page, email: string) {
  await page.goto("/sign-in");
  await expect(page.locator("html")).toHaveAttribute("lang", "ja");
  await expect(page.getByRole("heading", { name: ja("auth.signInTitle") })).toBeVisible();
  await page.getByLabel(ja("auth.email")).fill(email);
  await page.getByLabel(ja("auth.password")).fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: ja("auth.signIn"), exact: true }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

test.describe("on a phone", () => {
  test.use({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });

  test("sign in, a lot's scan card, a soak and its provenance card, all in Japanese", async ({ page }) => {
    test.setTimeout(90_000);
    await signInInJapanese(page, "brewer@example.com");
    // The polished lot the brewery holds most of (the seed's rice from the mill).
    const list = await (await page.request.get("/api/lots?kind=polished&partyId=brewery-kirinoha&sort=onHand&dir=desc&limit=1")).json();
    const polished = list.items[0].code as string;

    await page.goto(`/scan?code=${polished}`);
    const card = page.getByTestId("floor-lot-card");
    for (const key of ["floorScan.card.kind", "floorScan.card.onHand", "floorScan.card.nextStep"]) await expect(card, key).toContainText(ja(key));
    await expect(card).toContainText(ja("lot.kinds.polished"));

    await page.goto(`/floor/soak?lot=${polished}`);
    const form = page.getByTestId("floor-form");
    await form.getByLabel(ja("floorForms.soak.dryKg"), { exact: true }).fill("10");
    await form.getByLabel(ja("floorForms.soak.drainedKg"), { exact: true }).fill("13");
    await form.getByLabel(ja("floorForms.soak.soakMinutes"), { exact: true }).fill("12");
    await form.getByLabel(ja("floorForms.soak.waterTempC"), { exact: true }).fill("10");
    await form.getByRole("button", { name: ja("floorForms.soak.submit") }).click();
    const result = page.getByTestId("floor-result");
    await expect(result.locator(".code-chip").first()).toBeVisible();
    await expect(result.getByRole("alert")).toHaveCount(0);
    const soaked = (await result.locator(".code-chip").allTextContents())[0]!;
    expect(soaked).not.toBe(polished);

    await page.goto(`/provenance?code=${soaked}`);
    const provenance = page.getByTestId("provenance-card");
    await expect(provenance).toContainText(ja("provenance.varieties"));
    await expect(provenance).toContainText(ja("provenance.origin"));
    await expect(page.getByTestId("prov-origin")).toContainText(JAPANESE);
  });
});

test("a visitor's switch on the sign-in page: English, then 日本語 again (the cookie only)", async ({ page }) => {
  await page.goto("/sign-in");
  const languages = page.getByTestId("language-switch");
  await expect(languages.getByRole("button", { name: "日本語" })).toHaveAttribute("aria-pressed", "true");
  await languages.getByRole("button", { name: "English" }).click();
  await expect(page.getByRole("heading", { name: en("auth.signInTitle") })).toBeVisible();
  await expect(page.locator("html")).toHaveAttribute("lang", "en");
  await expect(languages.getByRole("button", { name: "English" })).toHaveAttribute("aria-pressed", "true");
  expect((await page.context().cookies()).find((c) => c.name === "grainline-locale")?.value).toBe("en");
  await languages.getByRole("button", { name: "日本語" }).click();
  await expect(page.getByRole("heading", { name: ja("auth.signInTitle") })).toBeVisible();
});

// Nakase (grower2) ends as she began, following her browser.
test("the user menu's switch stores the person's own setting, which wins over a Japanese browser", async ({ page, browser, baseURL }) => {
  await signInInJapanese(page, "grower2@example.com");
  await expect(page.getByRole("button", { name: ja("nav.signOut") })).toBeVisible();
  await page.getByTestId("language-switch").getByRole("button", { name: "English" }).click();
  await expect(page.getByRole("button", { name: en("nav.signOut") })).toBeVisible();
  await expect(page.locator("html")).toHaveAttribute("lang", "en");

  // A fresh Japanese browser with no language cookie: the stored setting decides, from sign-in on.
  const other = await browser.newContext({ locale: "ja-JP", baseURL });
  const again = await other.newPage();
  await signInInJapanese(again, "grower2@example.com");
  await expect(again.getByRole("button", { name: en("nav.signOut") })).toBeVisible();
  expect((await other.cookies()).find((c) => c.name === "grainline-locale")?.value).toBe("en");

  // Her account page gives the choice back to the browser: Japanese again, and no setting left behind.
  await again.goto("/account");
  const setting = again.getByTestId("language-setting");
  await setting.getByLabel(en("nav.language")).selectOption("");
  await setting.getByRole("button", { name: en("nav.languageSave") }).click();
  await expect(again.getByRole("button", { name: ja("nav.signOut") })).toBeVisible();
  await expect(again.getByTestId("language-setting").getByLabel(ja("nav.language"))).toHaveValue("");
  await other.close();
});
