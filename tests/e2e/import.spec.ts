import path from "node:path";
import { expect, test } from "@playwright/test";
import { signInAndLand } from "./helpers";

const fixture = (name: string) => path.join(import.meta.dirname, "../../fixtures/csv", name);

test("a harvest CSV with one bad row is reported line by line and cannot be committed", async ({ page }) => {
  await signInAndLand(page, "grower@example.com");
  await page.goto("/import");
  await page.getByLabel("CSV file").setInputFiles(fixture("harvests-bad-grade.csv"));
  await expect(page.getByTestId("import-summary")).toHaveText("1 row needs correcting.");
  const row = page.getByRole("row").filter({ has: page.getByRole("rowheader", { name: "3" }) });
  await expect(row).toContainText("premium");
  await expect(row).toContainText("grade:");
  await expect(page.getByRole("button", { name: "Commit 3 rows" })).toBeDisabled();
});

test("a good harvest CSV commits every row at once", async ({ page }) => {
  await signInAndLand(page, "grower@example.com");
  await page.goto("/import");
  await page.getByLabel("CSV file").setInputFiles(fixture("harvests-good.csv"));
  await expect(page.getByTestId("import-summary")).toHaveText("Every row can be imported.");
  await page.getByRole("button", { name: /^Commit \d+ rows$/ }).click();
  await expect(page.getByTestId("import-created").getByRole("link")).not.toHaveCount(0);
  const codes = await page.getByTestId("import-created").getByRole("link").allTextContents();
  expect(codes.every((c) => /^H2\d-\d{4}$/.test(c))).toBe(true);
});
