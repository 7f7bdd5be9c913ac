import { readFile } from "node:fs/promises";
import { expect, test } from "@playwright/test";
import { readPdfText } from "../support/pdf-read";
import { registerHarvestOnForm, signInAndLand, signOut } from "./helpers";

/*
 * Nakase Family Paddies (grower2) is seeded with 1,436,400 yen owed, all on a statement; no
 * other browser test touches the Nakase account. Contract (seed-suppliers.ts, invented): Omachi
 * 2026, 1st grade, 25,000 yen per 60 kg bag. Tax: 8 % on rice, once per statement, rounded down.
 */
const yen = (v: number) => `¥${v.toLocaleString("en-US")}`;

test("admin records a receipt and a payment; the grower sees what is owed, the lot, the payment and the statement PDF", async ({ page }) => {
  // Admin: a harvest lot of 630 kg on a Nakase field, received at the brewery.
  await signInAndLand(page, "admin@example.com");
  await page.goto("/fields");
  const { code } = await registerHarvestOnForm(page, { field: { label: "Nakase Family Paddies — River Flat" }, variety: "Omachi", cropYear: "2026", brownKg: "630", moisturePct: "14.7", grade: "1", bags: "11" });

  // The grower's delivery slip, recorded by the office for the grower, then the receipt.
  await page.goto(`/dispatch?code=${code}`);
  await page.getByLabel("Send to").selectOption({ label: "Kirinoha Brewery" });
  await page.getByLabel("Delivery-slip number").fill("DS-E2E-1");
  await page.getByRole("button", { name: "Record dispatch" }).click();
  await expect(page.getByTestId("form-message")).toContainText(`Lot ${code} dispatched`);

  await page.goto("/receive");
  await page.getByLabel("Lot code").fill(code);
  await page.getByLabel("Weight on arrival").fill("630");
  await page.getByLabel("Delivery-slip number").fill("DS-E2E-1");
  await page.getByRole("button", { name: "Record receipt" }).click();
  await expect(page.getByTestId("form-message")).toContainText(`Lot ${code} received.`);
  await signOut(page);

  // 630 kg = 10.5 bags × 25,000 = 262,500 yen; not yet stated, so its tax is as the next
  // statement computes it: 262,500 × 8 % = 21,000. Owed: 1,436,400 + 262,500 + 21,000.
  const delivery = 262_500;
  const owed = 1_436_400 + delivery + 21_000;
  await signInAndLand(page, "grower2@example.com");
  await page.goto("/account");
  await expect(page.getByTestId("balance")).toHaveText(yen(owed));
  const row = page.getByTestId("deliveries-table").getByRole("row").filter({ hasText: code });
  await expect(row).toContainText("DS-E2E-1");
  await expect(row).toContainText(yen(delivery));
  await expect(page.getByTestId(`trail-${code}`)).toContainText("Not in a tank or bottling yet.");
  await signOut(page);

  // Admin: a payment of 500,000 yen, then a statement for today, e-mailed.
  await signInAndLand(page, "admin@example.com");
  await page.goto("/suppliers/grower-nakase");
  await expect(page.getByTestId("balance")).toHaveText(yen(owed));
  const payment = page.getByTestId("payment-form");
  await payment.getByLabel("Amount (yen)").fill("500000");
  await payment.getByLabel("Reference (transfer no.)").fill("TR-E2E-1");
  await payment.getByRole("button", { name: "Record payment" }).click();
  await expect(payment.getByTestId("form-message")).toHaveText(`Payment recorded. Balance now ${yen(owed - 500_000)}.`);
  const statement = page.getByTestId("statement-form");
  await statement.getByRole("button", { name: "Issue statement" }).click();
  await expect(statement.getByTestId("form-message")).toContainText(/Statement S-\d{4}-\d{4} issued and e-mailed/);
  const number = /S-\d{4}-\d{4}/.exec((await statement.getByTestId("form-message").textContent()) ?? "")![0];
  await page.goto("/admin/outbox");
  // The mail is in the supplier's language (Japanese: none of its users chose another), so found by number.
  await expect(page.getByTestId("outbox-table").getByRole("row").filter({ hasText: number })).toContainText("nakase@paddies.example");
  await signOut(page);

  // Grower: the balance has fallen by the payment; the statement's PDF names its totals.
  await signInAndLand(page, "grower2@example.com");
  await page.goto("/account");
  await expect(page.getByTestId("balance")).toHaveText(yen(owed - 500_000));
  await expect(page.getByTestId("payments-table")).toContainText("TR-E2E-1");
  const download = page.waitForEvent("download");
  await page.getByTestId("statements-table").getByRole("row").filter({ hasText: number }).getByRole("link", { name: "PDF" }).click();
  const file = await (await download).path();
  const bytes = await readFile(file);
  // The PDF's own header (ISO 32000-1 §7.5.2), then its text read back by pdf.js.
  expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
  const text = await readPdfText(bytes);
  expect(text).toContain(`Statement ${number}`);
  expect(text).toContain("Nakase Family Paddies");
  expect(text).toContain(code);
  expect(text).toMatch(/Subtotal 8 %\*\n262,500 JPY/);
  expect(text).toMatch(/Consumption tax 8 %\n21,000 JPY/);
  expect(text).toMatch(/Total incl. tax\n283,500 JPY/);
  expect(text).toMatch(/Payments in period\n-500,000 JPY/);
  expect(text).toMatch(new RegExp(`Balance owed at issue\\n${(owed - 500_000).toLocaleString("en-US")} JPY`));
});

test("a grower cannot open another grower's account", async ({ page }) => {
  await signInAndLand(page, "grower@example.com");
  const own = await page.request.get("/api/suppliers/grower-ikeda/ledger");
  expect(own.status()).toBe(200);
  // Another supplier's account answers exactly as a party that does not exist.
  const other = await page.request.get("/api/suppliers/grower-nakase/ledger");
  const missing = await page.request.get("/api/suppliers/no-such-party/ledger");
  expect(other.status()).toBe(404);
  expect(await other.text()).toBe(await missing.text());
  const office = await page.goto("/suppliers/grower-nakase");
  expect(office?.status()).toBe(403);
});
