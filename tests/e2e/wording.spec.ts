// Wording people read (issue 14, item 6), in Chromium against the demo ledger: figures on event
// cards are named in words with their units, bottles are counted with a plural (CLDR's English
// plural rules: one / other), a number that is not whole is refused with the catalogue's sentence
// and never zod's English, and a code field's example keeps its own letters.
import { expect, test, type Page } from "@playwright/test";
import { signInAndLand } from "./helpers";

// zod 4's default English (its en locale): none of it may reach a screen or an API answer.
const ZOD_ENGLISH = /Invalid input|expected (number|int|string)|received|Too small|Too big|>=|must be a int/;

type Lot = { code: string; quantity: number; createdAt: string };
async function lotsOf(page: Page, kind: string): Promise<Lot[]> {
  const body = await (await page.request.get(`/api/lots?kind=${kind}&limit=100`)).json();
  return (body.items as Lot[]).sort((a, b) => a.createdAt.localeCompare(b.createdAt));
}

test("a lot's events name their figures in words: Moisture, not moisturePct", async ({ page }) => {
  const LOT = "P26-0002";
  await signInAndLand(page, "brewer@example.com");
  const origin = new URL(page.url()).origin;
  const answer = await page.request.post("/api/events", {
    headers: { origin },
    data: { step: "measuring", inputs: [{ lot: LOT, quantity: 0 }], measurements: [{ name: "moisturePct", value: 13.7, unit: "%" }] },
  });
  expect(answer.status()).toBe(201);

  // An API answer to a quantity that is no number is a sentence from the catalogue, in the
  // language asked for (Japanese when none is: the default locale).
  for (const [language, sentence] of [["en", "Enter a number"], ["ja", "数値を入力してください"], ["", "数値を入力してください"]]) {
    const headers = { origin, ...(language ? { "accept-language": language } : {}) };
    const refused = await page.request.post("/api/events", { headers, data: { step: "measuring", inputs: [{ lot: LOT, quantity: "lots" }] } });
    expect(refused.status()).toBe(422);
    const body = JSON.stringify(await refused.json());
    expect(body).toContain(sentence);
    expect(body).not.toMatch(ZOD_ENGLISH);
  }

  await page.goto(`/lots/${LOT}`);
  const timeline = page.getByTestId("event-timeline");
  await expect(timeline).toContainText("Moisture: 13.7 %");
  // The seeded polishing run carries its target as a measurement and its achieved ratio as a figure.
  await expect(timeline).toContainText(/Target polishing ratio: \d+ %/);
  await expect(timeline).toContainText(/Polishing ratio achieved: [\d.]+ %/);
  await expect(timeline).not.toContainText(/moisturePct|targetPolishingRatioPct|achievedPolishingRatioPct|[a-z][A-Z][a-z]+(Pct|Kg|G)\b/);
});

test("a bottling counts bottles: 800 bottles, never 800 bottle", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  const bottles = (await lotsOf(page, "bottled")).find((l) => l.quantity === 800)!;
  await page.goto(`/lots/${bottles.code}`);
  const timeline = page.getByTestId("event-timeline");
  await expect(timeline).toContainText("800 bottles");
  await expect(timeline).toContainText("Bottles: 800");
  await expect(page.getByTestId("lot-card")).toContainText(/\d bottles/);
  await expect(timeline).not.toContainText(/\b(?!1 )\d+ bottle(?!s)/);
});

test("a harvest with half a bag is refused with the catalogue's sentence, not zod's", async ({ page }) => {
  await signInAndLand(page, "grower@example.com");
  const form = page.getByTestId("harvest-form");
  await form.getByLabel("Field").selectOption({ index: 0 });
  await form.getByLabel("Variety").selectOption("Yamada Nishiki");
  await form.getByLabel("Brown rice (kg)").fill("300");
  await form.getByLabel("Moisture (%)").fill("14.5");
  await form.getByLabel("Inspection grade").selectOption("1");
  await form.getByLabel("Bags").fill("2.5");
  await form.getByRole("button", { name: "Register harvest" }).click();
  await expect(form.getByText(/^Enter a whole number/)).toBeVisible();
  await expect(form).not.toContainText(ZOD_ENGLISH);
});

test("a code field upper-cases what is typed but not its example", async ({ page }) => {
  await signInAndLand(page, "brewer@example.com");
  await page.goto("/scan");
  const input = page.getByPlaceholder("e.g. P26-0002");
  await expect(input).toBeVisible();
  // CSS Pseudo-Elements Level 4, ::placeholder: its text-transform is read from the computed style.
  const styles = await input.evaluate((el) => ({ value: getComputedStyle(el).textTransform, placeholder: getComputedStyle(el, "::placeholder").textTransform }));
  expect(styles).toEqual({ value: "uppercase", placeholder: "none" });
});
