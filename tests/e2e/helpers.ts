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
