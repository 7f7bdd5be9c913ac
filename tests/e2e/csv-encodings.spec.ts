import { readFile } from "node:fs/promises";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { signInAndLand } from "./helpers";

// Written by Debian's iconv (fixtures/README.md), not by the app.
const fixture = (name: string) => path.join(import.meta.dirname, "../../fixtures/csv", name);

async function download(page: Page, testId: string) {
  const [file] = await Promise.all([page.waitForEvent("download"), page.getByTestId(testId).click()]);
  return { name: file.suggestedFilename(), bytes: new Uint8Array(await readFile((await file.path())!)) };
}

test("a Shift_JIS file from a Japanese spreadsheet shows its names in the preview, with the encoding named", async ({ page }) => {
  await signInAndLand(page, "miller@example.com");
  await page.goto("/import");
  await page.getByLabel("CSV file").setInputFiles(fixture("receipts-shift-jis.csv"));
  await expect(page.getByTestId("import-encoding")).toHaveText("Encoding: Shift_JIS");
  await expect(page.getByRole("cell", { name: "生産者 池田農園" })).toBeVisible();
  await expect(page.getByRole("cell", { name: "㈱白妙精米所 第①倉庫" })).toBeVisible();
  await expect(page.getByRole("cell", { name: "生産者 髙橋さんの圃場" })).toBeVisible();
});

test("a Latin-1 file is refused before any preview, with nothing sent", async ({ page }) => {
  await signInAndLand(page, "miller@example.com");
  await page.goto("/import");
  const checks: string[] = [];
  page.on("request", (r) => r.url().includes("/api/import/") && checks.push(r.url()));
  await page.getByLabel("CSV file").setInputFiles(fixture("receipts-latin1.csv"));
  await expect(page.getByRole("alert").filter({ hasText: "neither UTF-8 nor Shift_JIS (CP932)" })).toBeVisible();
  await expect(page.getByTestId("import-encoding")).toHaveCount(0);
  await expect(page.getByRole("table")).toHaveCount(0);
  expect(checks).toEqual([]);
});

test("the Shift_JIS download of the receipts and shipments record decodes to the UTF-8 download's text", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  await page.goto("/records/transactions?from=2024-01-01&to=2026-12-31");
  // Other specs record events meanwhile (every worker shares one database). The ledger only grows,
  // so when two UTF-8 downloads around the Shift_JIS one are equal, all three saw the same rows.
  let utf8 = await download(page, "transactions-download");
  let sjis = await download(page, "transactions-download-sjis");
  for (let tries = 0; tries < 5; tries++) {
    const again = await download(page, "transactions-download");
    if (Buffer.from(again.bytes).equals(Buffer.from(utf8.bytes))) break;
    utf8 = again;
    sjis = await download(page, "transactions-download-sjis");
  }
  expect(sjis.name).toBe("grainline-transactions-2024-01-01-to-2026-12-31-sjis.csv");
  expect([...utf8.bytes.slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
  // Node's TextDecoder is the WHATWG Encoding Standard's Shift_JIS decoder, independent of the server's encoder.
  const fromSjis = new TextDecoder("shift_jis", { fatal: true }).decode(sjis.bytes);
  expect(fromSjis).toBe(new TextDecoder("utf-8", { fatal: true }).decode(utf8.bytes));
  expect(fromSjis.split("\r\n").length).toBeGreaterThan(2);
  // The table's own download, made in the browser, has a Shift_JIS button too: the same text as its UTF-8 one.
  const tableSjis = await download(page, "transactions-table-csv-sjis");
  expect(tableSjis.name).toBe("grainline-transactions-2024-01-01-to-2026-12-31-sjis.csv");
  const [tableUtf8] = await Promise.all([page.waitForEvent("download"), page.getByTestId("transactions-table").getByRole("button", { name: "Download CSV", exact: true }).click()]);
  const utf8Text = new TextDecoder("utf-8", { fatal: true }).decode(await readFile((await tableUtf8.path())!));
  expect(new TextDecoder("shift_jis", { fatal: true }).decode(tableSjis.bytes)).toBe(utf8Text);
  expect(utf8Text.split("\r\n").length).toBeGreaterThan(2);
});

test.describe("in Japanese", () => {
  test.use({ locale: "ja-JP" });

  test("the preview says 文字コード: Shift_JIS, and a file that is neither is refused in Japanese", async ({ page }) => {
    const signedIn = await page.request.post("/api/auth/sign-in", { data: { email: "miller@example.com", password: "grainline-demo" } });
    expect(signedIn.ok()).toBe(true);
    await page.goto("/import");
    await page.locator("#csv-file").setInputFiles(fixture("receipts-shift-jis.csv"));
    await expect(page.getByTestId("import-encoding")).toHaveText("文字コード: Shift_JIS");
    await expect(page.getByRole("cell", { name: "㈱白妙精米所 第①倉庫" })).toBeVisible();
    await page.goto("/import");
    await page.locator("#csv-file").setInputFiles(fixture("random-bytes.csv"));
    await expect(page.getByRole("alert").filter({ hasText: "UTF-8 でも Shift_JIS（CP932）でもない" })).toBeVisible();
  });
});
