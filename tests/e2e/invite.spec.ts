import { expect, test } from "@playwright/test";
import { readFileSync } from "node:fs";
import path from "node:path";
import { signIn, signInAndLand, signOut } from "./helpers";

const coreJa = JSON.parse(readFileSync(path.join(import.meta.dirname, "../../src/i18n/messages/ja/core.json"), "utf8")) as { mail: { invite: { subject: string } } };

test("admin invites a brewer, who sets a password from the outbox link and signs in", async ({ page }) => {
  const email = `kato.${Date.now()}@example.com`;
  await signInAndLand(page, "admin@example.com");
  await page.goto("/admin/users");
  const form = page.locator("form").filter({ has: page.getByRole("button", { name: "Send invitation" }) });
  await form.getByLabel("Name").fill("Kato Yui");
  await form.getByLabel("E-mail").fill(email);
  await form.getByLabel("Role").selectOption("brewer");
  await form.getByLabel("Party").selectOption({ label: "Kirinoha Brewery — Brewery" });
  await form.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByTestId("form-message")).toContainText(email);
  await expect(page.getByTestId("users-table")).toContainText("Invited");

  await page.goto("/admin/outbox");
  await page.getByTestId("outbox-table").getByRole("row").filter({ hasText: email }).getByRole("link").click();
  const message = page.getByTestId("outbox-message");
  // The invited person has no language setting yet: the invitation is in Japanese, the default.
  await expect(message).toContainText(coreJa.mail.invite.subject);
  const link = message.getByRole("link", { name: /\/set-password\// });
  const href = await link.getAttribute("href");
  expect(href).toMatch(/\/set-password\/[A-Za-z0-9_-]{40,}$/);
  await signOut(page);

  await page.goto(href!);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Set your password");
  await page.getByLabel("New password", { exact: true }).fill("koji-room-at-dawn");
  await page.getByLabel("Repeat the password").fill("koji-room-at-dawn");
  await page.getByRole("button", { name: "Save password" }).click();
  await expect(page.getByTestId("form-message")).toHaveText("Your password is saved. Sign in with it now.");

  // The link is single-use.
  await page.goto(href!);
  await expect(page.getByText("This link has been used or has expired.", { exact: false })).toBeVisible();

  await signIn(page, email, "koji-room-at-dawn");
  await expect(page).toHaveURL(/\/scan$/);
  await expect(page.getByTestId("signed-in-as")).toContainText("Kato Yui (Brewer)");
});
