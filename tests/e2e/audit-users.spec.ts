// The office's users page (deactivate, reactivate, change a role, an invite form that offers only
// fitting role and party pairs), the readable audit record, and the auditor's read-only set-up pages.
// Every page is reached from the navigation, never by typing a URL.
import { expect, test, type Browser, type Page } from "@playwright/test";
import { signIn, signInAndLand } from "./helpers";

const nav = (page: Page, name: string) => page.getByRole("navigation", { name: "Office" }).getByRole("link", { name, exact: true }).click();
const userRow = (page: Page, email: string) => page.getByTestId("users-table").getByRole("row").filter({ hasText: email });

/**
 * A user of this spec's own, invited from the users page and signed in in a second browser: the
 * demo users stay as other specs expect them. Returns the new user's signed-in page.
 */
async function invitedUser(page: Page, browser: Browser, name: string, email: string, role: string) {
  const invite = page.locator("form").filter({ has: page.getByRole("button", { name: "Send invitation" }) });
  await invite.getByLabel("Name").fill(name);
  await invite.getByLabel("E-mail").fill(email);
  await invite.getByLabel("Role").selectOption(role);
  await invite.getByRole("button", { name: "Send invitation" }).click();
  await expect(invite.getByTestId("form-message")).toContainText(email);
  await nav(page, "Outbox");
  await page.getByTestId("outbox-table").getByRole("row").filter({ hasText: email }).getByRole("link").click();
  const href = await page.getByTestId("outbox-message").getByRole("link", { name: /\/set-password\// }).getAttribute("href");
  const them = await (await browser.newContext()).newPage();
  await them.goto(href!);
  await them.getByLabel("New password", { exact: true }).fill("tank-room-evening");
  await them.getByLabel("Repeat the password").fill("tank-room-evening");
  await them.getByRole("button", { name: "Save password" }).click();
  await expect(them.getByTestId("form-message")).toHaveText("Your password is saved. Sign in with it now.");
  await signInAndLand(them, email, "tank-room-evening");
  await nav(page, "Users");
  return them;
}

/** What the sign-in page says to a wrong password: the words a deactivated user must get too. */
async function wrongPasswordMessage(page: Page) {
  await signIn(page, "miller@example.com", "not-the-password");
  const message = page.getByTestId("form-message");
  await expect(message).toBeVisible();
  return message.innerText();
}

test("the admin deactivates, reactivates and re-roles users; the invite form offers only fitting pairs", async ({ page, browser }) => {
  await signInAndLand(page, "admin@example.com");
  await nav(page, "Users");
  await expect(page).toHaveURL(/\/admin\/users$/);

  // PARTY_KIND_FOR_ROLE: growers with grower parties, millers with mills, brewery roles with the brewery.
  const invite = page.locator("form").filter({ has: page.getByRole("button", { name: "Send invitation" }) });
  for (const [role, kind] of [["grower", "Grower"], ["miller", "Polishing mill"], ["auditor", "Brewery"]] as const) {
    await invite.getByLabel("Role").selectOption(role);
    await expect(invite.getByLabel("Party").locator("option").first()).toHaveText(new RegExp(` — ${kind}$`));
    const options = await invite.getByLabel("Party").locator("option").allInnerTexts();
    expect(options.length, role).toBeGreaterThan(0);
    for (const option of options) expect(option, role).toMatch(new RegExp(` — ${kind}$`));
  }

  // Deactivation ends the user's session at once; their sign-in then reads like a wrong password.
  const stamp = Date.now();
  const [email, other] = [`sugi.${stamp}@example.com`, `noda.${stamp}@example.com`];
  const sugi = await invitedUser(page, browser, "Sugi Nanami", email, "sales");
  await userRow(page, email).getByRole("button", { name: "Deactivate" }).click();
  await expect(userRow(page, email)).toContainText("Deactivated");
  await expect(userRow(page, email).getByTestId("form-message")).toHaveText("Sugi Nanami is deactivated: signed out everywhere, and cannot sign in.");
  await sugi.reload();
  await expect(sugi).toHaveURL(/\/sign-in$/);
  const wrong = await wrongPasswordMessage(sugi);
  await signIn(sugi, email, "tank-room-evening");
  await expect(sugi.getByTestId("form-message")).toHaveText(wrong);
  await expect(sugi).toHaveURL(/\/sign-in$/);

  await userRow(page, email).getByRole("button", { name: "Reactivate" }).click();
  await expect(userRow(page, email)).toContainText("Active");
  await signInAndLand(sugi, email, "tank-room-evening");

  // A role change offers only the roles of the user's party, and signs the user out.
  const noda = await invitedUser(page, browser, "Noda Ritsu", other, "sales");
  const row = userRow(page, other);
  await expect(row.getByLabel("New role for Noda Ritsu").locator("option")).toHaveText(["Office admin", "Brewer", "Sales", "Auditor"]);
  await row.getByLabel("New role for Noda Ritsu").selectOption("brewer");
  await row.getByRole("button", { name: "Change role" }).click();
  await expect(row.getByTestId("form-message")).toHaveText("Noda Ritsu is now Brewer, and signs in again under it.");
  await expect(row).toContainText("Brewer");
  await noda.reload();
  await expect(noda).toHaveURL(/\/sign-in$/);

  // The last active admin cannot switch themselves off.
  const own = userRow(page, "admin@example.com");
  await own.getByRole("button", { name: "Deactivate" }).click();
  await expect(own.getByText("The last active office admin cannot be deactivated or given another role: make another user an admin first.")).toBeVisible();
  await expect(own).toContainText("Active");
});

test("the audit record reads as sentences: events, money, statements and user changes, with names and yen", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  await nav(page, "Records");
  const table = page.getByTestId("audit-table");
  const filter = page.getByLabel(/^Filter/);
  for (const [query, expected] of [
    ["Polishing run by", /Polishing run by Shirotae Polishing Works: H26-\d{4} \([\d.,]+ kg\)(, H26-\d{4} \([\d.,]+ kg\))* → P26-\d{4}/],
    ["Paid Ikeda Farm", /Paid Ikeda Farm ¥[\d,]+/],
    ["Issued statement S-2025-0001", /Issued statement S-2025-0001 to Ikeda Farm for \d{4}-\d\d-\d\d to \d{4}-\d\d-\d\d; balance ¥[\d,]+/],
    ["earlier record — Polishing run", /Correction by .+ of an earlier record — Polishing run: .+ Reason: .+/],
    ["Deactivated Sugi", /Deactivated Sugi Nanami; their sessions ended/],
    ["Changed the role of Noda", /Changed the role of Noda Ritsu from Sales to Brewer; their sessions ended/],
  ] as const) {
    // Filled again until the table answers: a fill before hydration is not seen by React.
    await expect(async () => {
      await filter.fill(query);
      await expect(table.getByRole("row").nth(1), query).toContainText(expected, { timeout: 1_000 });
    }).toPass();
  }
  await filter.fill("");
  const text = await table.innerText();
  // No raw JSON, no catalogue keys, no ids of users or parties (src/server/records/seed.ts names them so).
  expect(text).not.toMatch(/[{}"]|\baudit\.|\buser-(admin|grower|sales)|\bgrower-ikeda\b|\bmill-shirotae\b/);
});

test("the auditor reads settings, users and parties from the menu, with no form or button to change them", async ({ page }) => {
  await signInAndLand(page, "auditor@example.com");
  for (const [link, heading, table] of [["Settings", "Brewery settings", "settings-view"], ["Users", "Users", "users-table"], ["Parties", "Parties", "parties-table"]] as const) {
    await nav(page, link);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText(heading);
    await expect(page.getByTestId(table)).toBeVisible();
    const main = page.locator("main");
    await expect(main.locator("form")).toHaveCount(0);
    await expect(main.locator("input:not([aria-label^='Filter']), select, textarea, button[type=submit]")).toHaveCount(0);
  }
  await nav(page, "Settings");
  await expect(page.getByTestId("tank-register-view")).toContainText(" L");
  await expect(page.getByTestId("variety-list-view")).toContainText("Yamada Nishiki · Sake rice");
  await nav(page, "Parties");
  await page.getByTestId("parties-table").getByRole("link", { name: "Ikeda Farm" }).click();
  await expect(page.getByTestId("party-view")).toContainText("Hyogo");
  await expect(page.locator("main form")).toHaveCount(0);
});
