import { expect, test } from "@playwright/test";
import { registerHarvestOnForm, signInAndLand, signOut } from "./helpers";

test("a receipt the grower never dispatched waits for the grower's word; confirmed, the lot passes to the mill", async ({ page }) => {
  // Grower: a harvest lot, not dispatched.
  await signInAndLand(page, "grower@example.com");
  const { code } = await registerHarvestOnForm(page, { field: { index: 0 }, variety: "Yamada Nishiki", brownKg: "300", moisturePct: "14.6", grade: "2", bags: "5" });
  await signOut(page);

  // Miller: the bags are in the yard but no slip was recorded; nothing moves.
  await signInAndLand(page, "miller@example.com");
  await page.goto("/receive");
  await page.getByLabel("Lot code").fill(code);
  await page.getByLabel("Weight on arrival").fill("298.5");
  await page.getByRole("button", { name: "Record receipt" }).click();
  await expect(page.getByTestId("form-message")).toContainText(`Receipt of ${code} recorded, awaiting the sender`);
  await expect(page.getByTestId("own-receipt-requests")).toContainText(`${code}: 298.5 on arrival`);
  await page.goto("/mill");
  await expect(page.getByTestId("lots-table")).not.toContainText(code);
  await signOut(page);

  // Grower: the request waits for the grower's word; confirming records the dispatch and the receipt.
  await signInAndLand(page, "grower@example.com");
  await page.goto("/dispatch");
  const request = page.getByTestId("receipts-awaiting").getByRole("listitem").filter({ hasText: code });
  await expect(request).toContainText("Shirotae Polishing Works recorded");
  await request.getByRole("button", { name: "Confirm: I sent it" }).click();
  // Answered, it leaves the list (a refusal would stay, with its message beside it).
  await expect(page.getByTestId("receipts-awaiting")).not.toContainText(code);
  await signOut(page);

  await signInAndLand(page, "miller@example.com");
  await page.goto("/mill");
  await expect(page.getByTestId("lots-table")).toContainText(code);
  await page.goto("/receive");
  await expect(page.getByTestId("own-receipt-requests").getByRole("listitem").filter({ hasText: code })).toContainText("confirmed");
  // The slip weight beside the weight on arrival; the difference is the loss in transit.
  await page.goto(`/lots/${code}`);
  await expect(page.getByTestId("receipt-figures")).toHaveText("Slip 300 kg · on arrival 298.5 kg · short in transit 1.5 kg");
});

test("a payment over the balance owed asks for a reason; a payment is reversed with a reason, never deleted", async ({ page }) => {
  // The cooperative's account: no other browser test records money on it.
  await signInAndLand(page, "admin@example.com");
  await page.goto("/suppliers/grower-coop");
  const before = (await page.getByTestId("balance").textContent())!;
  const payment = page.getByTestId("payment-form");
  await payment.getByLabel("Amount (yen)").fill("99999999");
  await expect(payment.getByTestId("overpayment").getByRole("alert")).toContainText("more than the balance owed");
  await payment.getByRole("button", { name: "Record payment" }).click();
  await expect(payment.getByTestId("overpayment")).toContainText("Give the reason");
  await expect(page.getByTestId("balance")).toHaveText(before);

  await payment.getByLabel("Reason for paying more than owed").fill("Advance on the 2027 crop, agreed by phone");
  await payment.getByRole("button", { name: "Record payment" }).click();
  await expect(payment.getByTestId("form-message")).toContainText("Payment recorded.");
  await expect(page.getByTestId("balance")).not.toHaveText(before);

  const line = page.getByTestId("payments-list").getByRole("listitem").filter({ hasText: "¥99,999,999" });
  await line.getByText("Reverse", { exact: true }).click();
  await line.getByLabel("Reason for the reversal").fill("Keyed in error: the advance was never sent");
  await line.getByRole("button", { name: "Record reversal" }).click();
  await expect(page.getByTestId("balance")).toHaveText(before);
  await expect(page.getByTestId("payments-list").getByRole("listitem").filter({ hasText: "¥99,999,999" }).first()).toContainText("reversed");
});
