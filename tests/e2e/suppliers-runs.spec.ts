import { readFile } from "node:fs/promises";
import { expect, test, type Browser, type Locator, type Page } from "@playwright/test";
import { signInAndLand, signOut } from "./helpers";

/*
 * Shirotae Polishing Works (mill-shirotae) is seeded with 7 polishing runs, every one with a
 * contract fee (seed-suppliers.ts prices every ratio). To fill more than one page of 25, the
 * miller records 20 small runs (1 kg each) from H26-0006, the co-op's rice at the mill. Other
 * specs record runs of the same mill at the same time (every worker shares one database), so the
 * count is read again at each step, and it only grows. The supplier account, and the mill's own account, list
 * the runs once, in a table rendered on the server; the page and "without a contract fee only" are
 * in the address.
 */
async function recordSmallRuns(browser: Browser, baseURL: string, count: number) {
  const context = await browser.newContext({ baseURL });
  const post = async (url: string, data: unknown) => {
    const res = await context.request.post(url, { data, headers: { origin: baseURL } });
    expect(res.status(), await res.text()).toBeLessThan(300);
  };
  await post("/api/auth/sign-in", { email: "miller@example.com", password: "grainline-demo" });
  for (let i = 0; i < count; i++) {
    await post("/api/events", {
      step: "polishing",
      inputs: [{ lot: "H26-0006", quantity: 1 }],
      outputs: [{ kind: "polished", quantity: 0.6 }, { kind: "bran", quantity: 0.39 }],
      measurements: [{ name: "targetPolishingRatioPct", value: 60, unit: "%" }],
    });
  }
  await context.close();
}

/** The range above the table, once it shows the page starting at `from`: its total, checked against the page's last row. */
async function rangeFrom(range: Locator, from: number): Promise<number> {
  await expect(range).toHaveText(new RegExp(`^Polishing runs ${from}–\\d+ of \\d+$`));
  const [, to, total] = /–(\d+) of (\d+)/.exec((await range.textContent())!)!.map(Number);
  expect(to).toBe(Math.min(from + 24, total!));
  return total!;
}

/** The CSV's runs: every run the table counted just before the download, and none it did not count just after. */
async function downloadsEveryRun(page: Page, table: Locator, range: Locator) {
  const before = await rangeFrom(range, Number(/^Polishing runs (\d+)/.exec((await range.textContent())!)![1]));
  const [file] = await Promise.all([page.waitForEvent("download"), table.getByRole("link", { name: "Download CSV", exact: true }).click()]);
  expect(file.suggestedFilename()).toBe("grainline-runs.csv");
  const lines = (await readFile((await file.path())!, "utf8")).replace(/^\uFEFF/, "").trim().split("\r\n");
  expect(lines[0]).toBe("Date,Polished lot,Brown rice in (kg),Target ratio,Achieved ratio,Fee,Status");
  await page.reload();
  const after = await rangeFrom(range, Number(/^Polishing runs (\d+)/.exec((await range.textContent())!)![1]));
  expect(lines.length - 1).toBeGreaterThanOrEqual(before);
  expect(lines.length - 1).toBeLessThanOrEqual(after);
}

test("the office pages through a mill's polishing runs from the address, shows the unpriced ones alone, and downloads every run as CSV", async ({ page, browser, baseURL }) => {
  test.setTimeout(90_000);
  await recordSmallRuns(browser, baseURL!, 20);
  await signInAndLand(page, "admin@example.com");
  await page.goto("/suppliers/mill-shirotae");
  await expect(page.getByTestId("unpriced")).toContainText("Every polishing run has a contract fee.");
  const table = page.getByTestId("runs-table");
  const range = page.getByTestId("runs-range");
  const total = await rangeFrom(range, 1);
  expect(total).toBeGreaterThanOrEqual(27);
  await expect(table.getByRole("row")).toHaveCount(26); // the header and 25 runs

  await page.getByTestId("runs-pages").getByRole("link", { name: "Next" }).click();
  await expect(page).toHaveURL(/\/suppliers\/mill-shirotae\?page=2#deliveries$/);
  expect(await rangeFrom(range, 26)).toBeGreaterThanOrEqual(total);
  await downloadsEveryRun(page, table, range);

  await page.getByTestId("runs-unpriced-only").click();
  await expect(page).toHaveURL(/\/suppliers\/mill-shirotae\?unpriced=1#deliveries$/);
  await expect(range).toHaveText("No polishing run");
  await expect(table.getByRole("row")).toHaveCount(2); // the header and "no rows"
  await expect(page.getByTestId("runs-pages")).toHaveCount(0);

  await page.getByTestId("runs-unpriced-only").click();
  await expect(page).toHaveURL(/\/suppliers\/mill-shirotae#deliveries$/);
  expect(await rangeFrom(range, 1)).toBeGreaterThanOrEqual(total);

  // The mill's own account lists the same runs, a page at a time, in its own address.
  await signOut(page);
  await signInAndLand(page, "miller@example.com");
  await page.goto("/account");
  expect(await rangeFrom(range, 1)).toBeGreaterThanOrEqual(total);
  await page.getByTestId("runs-pages").getByRole("link", { name: "Next" }).click();
  await expect(page).toHaveURL(/\/account\?page=2#deliveries$/);
  expect(await rangeFrom(range, 26)).toBeGreaterThanOrEqual(total);
  // Its CSV comes from the server too, every run, for the mill's own party.
  await downloadsEveryRun(page, table, range);
});
