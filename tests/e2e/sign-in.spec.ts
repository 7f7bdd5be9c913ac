import { expect, test } from "@playwright/test";
import { signIn, signOut } from "./helpers";

// Each role's home, as the foundation issue lists them.
const HOMES = [
  { email: "admin@example.com", path: "/overview", heading: "Overview" },
  { email: "auditor@example.com", path: "/records", heading: "Records" },
  { email: "grower@example.com", path: "/fields", heading: "My fields and lots" },
  { email: "grower2@example.com", path: "/fields", heading: "My fields and lots" },
  { email: "miller@example.com", path: "/mill", heading: "Lots waiting to be polished" },
  { email: "brewer@example.com", path: "/scan", heading: "Scan a bag" },
  { email: "sales@example.com", path: "/provenance", heading: "Provenance" },
];

for (const home of HOMES) {
  test(`${home.email} signs in and lands on ${home.path}`, async ({ page }) => {
    await signIn(page, home.email);
    await expect(page).toHaveURL(new RegExp(`${home.path}$`));
    await expect(page.getByRole("heading", { level: 1 })).toHaveText(home.heading);
  });
}

test("a wrong password shows an error and stays on sign-in", async ({ page }) => {
  await signIn(page, "sales@example.com", "not-the-password");
  await expect(page.getByTestId("form-message")).toHaveText("The e-mail or password is not right.");
  await expect(page).toHaveURL(/\/sign-in$/);
});

test("sign-out returns to sign-in and the old cookie no longer works", async ({ page, context, request }) => {
  await signIn(page, "auditor@example.com");
  await expect(page).toHaveURL(/\/records$/);
  const session = (await context.cookies()).find((c) => c.name === "grainline_session");
  expect(session?.httpOnly).toBe(true);
  expect(session?.sameSite).toBe("Lax");
  const withOld = { headers: { cookie: `grainline_session=${session!.value}` } };
  expect((await request.get("/api/me", withOld)).status()).toBe(200);

  await signOut(page);
  expect((await request.get("/api/me", withOld)).status()).toBe(401);
  await page.goto("/records");
  await expect(page).toHaveURL(/\/sign-in$/);
});

test("a grower cannot open the admin's pages", async ({ page }) => {
  await signIn(page, "grower@example.com");
  await expect(page).toHaveURL(/\/fields$/);
  const res = await page.goto("/admin/users");
  expect(res?.status()).toBe(403);
  await expect(page.getByRole("navigation").getByRole("link", { name: "Users" })).toHaveCount(0);
});
