import { expect, type Page } from "@playwright/test";

export const DEMO_PASSWORD = "grainline-demo";

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

/** Signs in and waits until the role's home has replaced the sign-in page. */
export async function signInAndLand(page: Page, email: string, password = DEMO_PASSWORD) {
  await signIn(page, email, password);
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

export async function signOut(page: Page) {
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/sign-in$/);
}

export type HarvestTyped = { field: { label: string } | { index: number }; variety: string; brownKg: string; moisturePct: string; grade: string; bags: string; cropYear?: string };

/** Fills the harvest form on the current page and registers it; answers the new lot's code and the form. */
export async function registerHarvestOnForm(page: Page, h: HarvestTyped) {
  const form = page.getByTestId("harvest-form");
  await form.getByLabel("Field").selectOption(h.field);
  await form.getByLabel("Variety").selectOption(h.variety);
  if (h.cropYear) await form.getByLabel("Crop year").fill(h.cropYear);
  await form.getByLabel("Brown rice (kg)").fill(h.brownKg);
  await form.getByLabel("Moisture (%)").fill(h.moisturePct);
  await form.getByLabel("Inspection grade").selectOption(h.grade);
  await form.getByLabel("Bags").fill(h.bags);
  await form.getByRole("button", { name: "Register harvest" }).click();
  const saved = form.getByTestId("form-message");
  await expect(saved).toContainText(/Harvest lot H26-\d{4} registered/);
  return { code: /H26-\d{4}/.exec((await saved.textContent()) ?? "")![0], form };
}
