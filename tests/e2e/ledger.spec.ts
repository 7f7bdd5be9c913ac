import { expect, test } from "@playwright/test";
import { registerHarvestOnForm, signInAndLand, signOut } from "./helpers";

test("a grower registers a field and a harvest, prints its label; the miller polishes it with another lot", async ({ page }) => {
  // Grower: a new paddy, then a harvest lot on it.
  await signInAndLand(page, "grower@example.com");
  await expect(page).toHaveURL(/\/fields$/);
  const fieldForm = page.locator("form").filter({ has: page.getByRole("button", { name: "Save field" }) });
  await fieldForm.getByLabel("Field name").fill("Maple Strip");
  await fieldForm.getByLabel("Region (prefecture)").fill("Hyogo");
  await fieldForm.getByLabel("Area (ha)").fill("0.6");
  await fieldForm.getByRole("button", { name: "Save field" }).click();
  await expect(page.getByTestId("fields-table")).toContainText("Maple Strip");

  const { code, form: harvest } = await registerHarvestOnForm(page, { field: { label: "Maple Strip" }, variety: "Yamada Nishiki", brownKg: "480", moisturePct: "14.5", grade: "1", bags: "8" });

  await harvest.getByRole("link", { name: "Print bag labels" }).click();
  await expect(page).toHaveURL(new RegExp(`/labels\\?codes=${code}`));
  const label = page.getByTestId("label").first();
  await expect(label).toContainText(code);
  await expect(label.locator("svg")).toBeVisible();

  // Grower: the delivery slip (the sender's word); the lot stays the grower's until it arrives.
  await page.goto(`/dispatch?code=${code}`);
  await page.getByLabel("Send to").selectOption({ label: "Shirotae Polishing Works" });
  await page.getByLabel("Delivery-slip number").fill("DS-2026-201");
  await page.getByRole("button", { name: "Record dispatch" }).click();
  await expect(page.getByTestId("form-message")).toContainText(`Lot ${code} dispatched`);
  await signOut(page);

  // Miller: receive the new lot with its weight on arrival, then polish it with a lot already at the mill.
  await signInAndLand(page, "miller@example.com");
  await page.goto("/receive");
  await page.getByLabel("Lot code").fill(code);
  await page.getByLabel("Weight on arrival").fill("480");
  await page.getByLabel("Delivery-slip number").fill("DS-2026-201");
  await page.getByRole("button", { name: "Record receipt" }).click();
  await expect(page.getByTestId("form-message")).toContainText(`Lot ${code} received.`);

  await page.goto("/mill");
  await expect(page.getByTestId("lots-table")).toContainText(code);
  const run = page.getByTestId("polishing-form");
  await run.getByLabel("Harvest lot 1").fill(code);
  await run.getByLabel("Brown rice (kg) from lot 1").fill("480");
  await run.getByLabel("Harvest lot 2").fill("h26-0006");
  await run.getByLabel("Brown rice (kg) from lot 2").fill("520");
  await run.getByLabel("Polished rice out (kg)").fill("600");
  await run.getByLabel("Bran out (kg)").fill("385");
  await run.getByLabel("Target polishing ratio (%)").fill("60");
  await run.getByRole("button", { name: "Record polishing run" }).click();
  // Two varieties in one run: the mill confirms the mix (the polished lot keeps both, with shares).
  await expect(run.getByRole("alert").filter({ hasText: "different varieties" })).toBeVisible();
  await run.getByLabel("I confirm polishing these varieties together").check();
  await run.getByRole("button", { name: "Record polishing run" }).click();
  const result = page.getByTestId("polishing-result");
  await expect(result.getByRole("status")).toContainText(/polished lot P26-\d{4}/);
  const polished = /P26-\d{4}/.exec((await result.getByRole("status").textContent()) ?? "")![0];

  await result.getByRole("link", { name: polished }).click();
  await expect(page).toHaveURL(new RegExp(`/lots/${polished}$`));
  const back = page.getByTestId("one-step-back");
  await expect(back).toContainText(code);
  await expect(back).toContainText("H26-0006");
  await expect(back).toContainText("48% of this lot");
  await expect(back).toContainText("52% of this lot");
  await expect(page.getByTestId("polishing-figures")).toContainText("60 %");
  await expect(page.getByTestId("missed-target")).toHaveCount(0);
});

test("an over-draw at the mill shows the 409 message beside the field and records nothing", async ({ page }) => {
  await signInAndLand(page, "miller@example.com");
  await page.goto("/mill");
  const run = page.getByTestId("polishing-form");
  await run.getByLabel("Harvest lot 1").fill("H26-0006");
  await run.getByLabel("Brown rice (kg) from lot 1").fill("99999");
  await run.getByLabel("Polished rice out (kg)").fill("600");
  await run.getByLabel("Target polishing ratio (%)").fill("60");
  await run.getByRole("button", { name: "Record polishing run" }).click();
  await expect(run.getByRole("alert")).toContainText("H26-0006 has only");
  await expect(run.locator(".field-error").first()).toContainText("kg on hand");
});
