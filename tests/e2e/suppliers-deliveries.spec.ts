import { readFile } from "node:fs/promises";
import { expect, test } from "@playwright/test";
import { signInAndLand } from "./helpers";

/*
 * The cooperative (grower-coop) is seeded with one delivery without a contract price, H24-0002
 * (no 2024 contract), beside its priced ones. The supplier account lists deliveries once, in a
 * table rendered on the server; the unpriced ones are shown alone from the address.
 */
test("the office shows a grower's unpriced deliveries alone from the address, and downloads them as CSV", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  await page.goto("/suppliers/grower-coop");
  await expect(page.getByTestId("unpriced-count")).toContainText("1 delivery has no contract price");
  const table = page.getByTestId("deliveries-table");
  await expect(table.getByRole("row").filter({ hasText: "H24-0002" })).toContainText("no contract price");
  const all = await table.getByRole("row").count();

  await page.getByTestId("unpriced").getByRole("link", { name: "Only deliveries without a contract price" }).click();
  await expect(page).toHaveURL(/\/suppliers\/grower-coop\?unpriced=1#deliveries$/);
  await expect(table.getByRole("row")).toHaveCount(2); // the header and H24-0002
  expect(all).toBeGreaterThan(2);
  await expect(page.getByTestId("deliveries-range")).toHaveText("Deliveries 1–1 of 1");

  const [file] = await Promise.all([page.waitForEvent("download"), table.getByRole("link", { name: "Download CSV", exact: true }).click()]);
  expect(file.suggestedFilename()).toBe("grainline-deliveries.csv");
  const lines = (await readFile((await file.path())!, "utf8")).replace(/^\uFEFF/, "").trim().split("\r\n");
  expect(lines).toHaveLength(2);
  expect(lines[1]).toContain("H24-0002");

  await page.getByTestId("deliveries-unpriced-only").click();
  await expect(page).toHaveURL(/\/suppliers\/grower-coop#deliveries$/);
  await expect(table.getByRole("row")).toHaveCount(all);
});
