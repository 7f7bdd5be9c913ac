import { expect, test, type Page } from "@playwright/test";
import { signInAndLand } from "./helpers";

// GTINs in GS1's example range (prefix 950, as the seed uses), check digits by GS1 General
// Specifications §7.9 worked by hand: 950600013491 → 3×(1+4+1+0+6+5) + (9+3+0+0+0+9) = 72 → 8.
const JUNMAI_GINJO_GTIN = "9506000134918";

/** The seed's sake lots in the order they were pressed: Tank 1, Tank 2, Tank 3. */
async function sakeLots(page: Page): Promise<string[]> {
  const body = await (await page.request.get("/api/lots?kind=sake&sort=createdAt&dir=asc&limit=10")).json();
  return body.items.map((l: { code: string }) => l.code);
}

test.describe("products", () => {
  test("the office registers a product; on the phone a bottling picks it, and a claim the sake does not earn is warned of on the bottling and the card", async ({ browser }) => {
    const office = await browser.newContext();
    const admin = await office.newPage();
    await signInAndLand(admin, "admin@example.com");
    await admin.getByRole("link", { name: "Products", exact: true }).click();
    const form = admin.getByTestId("product-form");
    await form.getByLabel("Brand name").fill("Asagiri Junmai Ginjo");
    await form.getByLabel("Category claimed").selectOption("junmai ginjo");
    await form.getByLabel("Bottle size (mL)").fill("720");
    // A wrong check digit first: refused beside the field, nothing registered.
    await form.getByLabel("GTIN / JAN").fill("9506000134919");
    await form.getByRole("button", { name: "Register product" }).click();
    await expect(form.locator(".field-error")).toContainText("check digit");
    // What was typed is still there to fix.
    await expect(form.getByLabel("Category claimed")).toHaveValue("junmai ginjo");
    await expect(form.getByLabel("Brand name")).toHaveValue("Asagiri Junmai Ginjo");
    await form.getByLabel("GTIN / JAN").fill(JUNMAI_GINJO_GTIN);
    await form.getByRole("button", { name: "Register product" }).click();
    await expect(admin.getByTestId("products-table")).toContainText(`0${JUNMAI_GINJO_GTIN}`);
    // Tank 3: 60 % rice without the ginjo method, with brewing alcohol added — not junmai ginjo.
    const tank3Sake = (await sakeLots(admin))[2]!;

    const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const brewer = await phone.newPage();
    await signInAndLand(brewer, "brewer@example.com");
    await brewer.goto(`/scan?code=${tank3Sake}`);
    await brewer.getByRole("link", { name: "Bottle", exact: true }).first().click();
    const bottling = brewer.getByTestId("floor-form");
    const picker = bottling.getByLabel("Product", { exact: true });
    // Awaited: the bottling page may still be loading after the tap.
    await expect(picker.locator("option").filter({ hasText: "Asagiri Junmai Ginjo · junmai ginjo · 720 mL" })).toHaveCount(1);
    await picker.selectOption({ label: "Asagiri Junmai Ginjo · junmai ginjo · 720 mL" });
    // Picking the product filled its GTIN.
    await expect(bottling.getByLabel("GTIN on the label")).toHaveValue(`0${JUNMAI_GINJO_GTIN}`);
    await bottling.getByLabel("Bottles filled").fill("50");
    await bottling.getByRole("button", { name: "Record bottling" }).click();
    const result = brewer.getByTestId("floor-result");
    await expect(result.getByRole("alert").filter({ hasText: "claims junmai ginjo" })).toBeVisible();
    await expect(result).toContainText("Grainline supplies records, not legal advice");
    const bottled = (await result.locator(".code-chip").allTextContents())[0]!;

    // The office card names the product and warns; search finds it by brand name and by JAN.
    await admin.goto(`/provenance?code=${bottled}`);
    await expect(admin.getByTestId("prov-product")).toContainText("Asagiri Junmai Ginjo");
    await expect(admin.getByTestId("claim-warning")).toContainText("junmai ginjo");
    for (const q of ["asagiri junmai", JUNMAI_GINJO_GTIN]) {
      await admin.getByRole("searchbox").fill(q);
      await admin.getByRole("searchbox").press("Enter");
      await expect(admin.getByTestId("search-bottlings")).toContainText(bottled);
    }
    await expect(admin.getByTestId("search-products")).toContainText("Asagiri Junmai Ginjo");

    // The public page names the product but not a category the records do not support.
    const visitor = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await visitor.newPage();
    await page.goto(`/01/0${JUNMAI_GINJO_GTIN}/10/${bottled}`);
    await expect(page.getByTestId("prov-product")).toContainText("Asagiri Junmai Ginjo · 720 mL");
    await expect(page.getByTestId("prov-product")).not.toContainText("junmai ginjo ·");
    await Promise.all([office.close(), phone.close(), visitor.close()]);
  });
});

test.describe("search everywhere", () => {
  test("the header search finds a lot code typed without its hyphen, a JAN, a tank, a grower and a field, each with a link", async ({ page }) => {
    await signInAndLand(page, "brewer@example.com");
    await page.goto("/lots");
    const search = async (q: string) => {
      await page.getByRole("searchbox").fill(q);
      await page.getByRole("searchbox").press("Enter");
      await expect(page).toHaveURL(/\/search\?q=/);
    };
    await search("H260001");
    await expect(page.getByTestId("search-lots").getByRole("link", { name: "H26-0001" })).toBeVisible();
    // JAN-13 of the seed's first bottling (GS1's Digital Link example GTIN 09506000134352).
    await search("9506000134352");
    await expect(page.getByTestId("search-bottlings").locator(".code-chip").first()).toHaveText(/^BT/);
    await search("Tank 3");
    await expect(page.getByTestId("search-tanks")).toContainText("Tank 3");
    await search("Ikeda");
    await expect(page.getByTestId("search-growers")).toContainText("Ikeda Farm");
    await search("River Flat");
    await expect(page.getByTestId("search-fields")).toContainText("Nakase Family Paddies");
    await search("H260001");
    await page.getByTestId("search-lots").getByRole("link", { name: "H26-0001" }).click();
    await expect(page).toHaveURL(/\/lots\/H26-0001$/);
  });

  test("another grower's lot answers exactly like a code that does not exist: nothing found", async ({ page }) => {
    await signInAndLand(page, "grower2@example.com");
    await page.goto("/fields");
    const answer = async (q: string) => {
      await page.getByRole("searchbox").fill(q);
      await page.getByRole("searchbox").press("Enter");
      await expect(page.getByTestId("search-none")).toBeVisible();
      return (await page.locator("main").innerText()).replaceAll(q, "<q>");
    };
    // H26-0001 is Ikeda Farm's harvest; Nakase Family Paddies neither holds nor made it.
    expect(await answer("H260001")).toBe(await answer("ZZ990001"));
    expect(await answer("Terrace Paddy")).toBe(await answer("No Such Paddy"));
  });
});
