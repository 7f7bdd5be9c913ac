import { expect, test, type Browser, type Page } from "@playwright/test";
import { signInAndLand } from "./helpers";

// Tank register and variety list, from the office and the phone. Variety names are public
// registered names (common practice list); a mash started from a starter is common practice.

async function as(browser: Browser, email: string, phone = false): Promise<Page> {
  const context = await browser.newContext(phone ? { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true } : {});
  const page = await context.newPage();
  await signInAndLand(page, email);
  return page;
}

/** A floor field by its label; a field needed before recording carries a "*" after it. */
const field = (form: ReturnType<Page["getByTestId"]>, label: string) => form.getByLabel(new RegExp(`^${label.replace(/[()*.?+[\]\\]/g, "\\$&")}\\s*\\*?$`));

/** Fills a floor screen, submits it, and returns the result block. */
async function record(page: Page, action: string, lot: string, values: Record<string, string>, select: Record<string, string> = {}) {
  await page.goto(`/floor/${action}?lot=${lot}`);
  const form = page.getByTestId("floor-form");
  for (const [label, value] of Object.entries(select)) await field(form, label).selectOption(value);
  for (const [label, value] of Object.entries(values)) await field(form, label).fill(value);
  await form.getByRole("button").last().click();
  const result = page.getByTestId("floor-result");
  await expect(result).toBeVisible();
  return result;
}
const firstCode = async (result: ReturnType<Page["getByTestId"]>) => (await result.locator(".code-chip").first().textContent())!.trim();

test("the office registers a tank and a variety in settings; the harvest form offers only listed varieties", async ({ browser }) => {
  const admin = await as(browser, "admin@example.com");
  await admin.goto("/admin/settings");
  const register = admin.getByTestId("tank-register");
  await expect(register.getByTestId("tank-row")).toHaveCount(6);
  const add = register.getByTestId("tank-add");
  await add.getByLabel("Name").fill("Tank 8");
  await add.getByLabel("Capacity (L)").fill("1500");
  await add.getByLabel("Location").fill("Annex");
  await add.getByRole("button", { name: "Add tank" }).click();
  await expect(register.getByTestId("tank-row")).toHaveCount(7);
  // A second tank of the same name is refused beside the field.
  await add.getByLabel("Name").fill("tank 8");
  await add.getByLabel("Capacity (L)").fill("900");
  await add.getByRole("button", { name: "Add tank" }).click();
  await expect(add.locator(".field-error")).toContainText("Another tank already has this name.");

  const list = admin.getByTestId("variety-list");
  await expect(list).toContainText("Yamada Nishiki");
  await expect(list).toContainText("Koshihikari");
  const addVariety = list.getByTestId("variety-add");
  await addVariety.getByLabel("Variety").fill("Sasanishiki");
  await addVariety.getByLabel("Kind").selectOption("table");
  await addVariety.getByRole("button", { name: "Add variety" }).click();
  await expect(list.getByRole("listitem").filter({ hasText: "Sasanishiki" })).toContainText("Table rice");

  // The harvest form is a list, not free text; the API refuses a name that is not on it.
  await admin.goto("/fields");
  const offered = await admin.getByTestId("harvest-form").locator('select[name="variety"] option').allTextContents();
  expect(offered).toEqual(expect.arrayContaining(["Sasanishiki", "Omachi", "Yamada Nishiki"]));
  expect(offered).not.toContain("Rice Nobody Grows");
  const refused = await admin.request.post("/api/harvests", { headers: { "accept-language": "en" }, data: { fieldId: "field-ikeda-cedar", variety: "Rice Nobody Grows", cropYear: 2026, brownKg: 150, moisturePct: 14.2, grade: "2", bags: 3 } });
  expect(refused.status()).toBe(422);
  expect((await refused.json()).error.fields.variety[0]).toContain("Settings → Rice varieties");
  await admin.context().close();
});

test("on the phone, a first addition picks a free tank by name, warns without a starter, and the tank is found by its name", async ({ browser }) => {
  test.setTimeout(120_000);
  const phone = await as(browser, "brewer@example.com", true);
  const soaked = await firstCode(await record(phone, "soak", "P26-0003", { "Dry rice taken (kg)": "40", "Drained weight after soaking (kg)": "51", "Soak time (minutes)": "40", "Water temperature (°C)": "10" }, { "Rice for": "mash" }));
  const steamed = await firstCode(await record(phone, "steam", soaked, { "Steamed weight (kg)": "54", "Steaming time (minutes)": "50" }));

  await phone.goto(`/floor/add?lot=${steamed}`);
  const form = phone.getByTestId("floor-form");
  const tank = field(form, "Tank");
  await expect(tank.locator("option", { hasText: "Tank 4 · 4000 L · Cold room" })).toHaveCount(1);
  await expect(phone.getByTestId("no-starter-preview")).toContainText("common practice");
  const result = await record(phone, "add", steamed, { "Steamed rice (kg)": "30", "Water (L)": "10" }, { Tank: "tank-4" });
  await expect(result).toContainText("This first addition has no starter (moto)");
  const tankLot = await firstCode(result);

  // Tank 4 now holds an unpressed mash: it is no longer offered.
  await phone.goto(`/floor/add?lot=${steamed}`);
  await expect(field(phone.getByTestId("floor-form"), "Tank").locator("option", { hasText: "Tank 4" })).toHaveCount(0);

  // Typing the tank's name on the scan page opens its current tank lot.
  await phone.goto("/scan");
  await phone.getByLabel("Type the code").fill("Tank 4");
  await phone.getByRole("button", { name: "Open", exact: true }).click();
  await expect(phone.getByTestId("floor-lot-card").getByTestId("lot-code")).toHaveText(tankLot);
  await phone.context().close();

  // In the office: the lot page and tank panel name the tank, and the lots search finds it by name.
  const office = await as(browser, "admin@example.com");
  await office.goto(`/lots/${tankLot}`);
  await expect(office.getByTestId("lot-card")).toContainText("Tank 4");
  await expect(office.getByTestId("tank-panel").getByRole("heading").first()).toHaveText("Tank 4");
  const search = await (await office.request.get(`/api/lots?q=${encodeURIComponent("tank 4")}`)).json();
  expect(search.items.map((l: { code: string }) => l.code)).toEqual([tankLot]);
  await office.context().close();
});

test("polishing two varieties together asks for confirmation, and the polished lot keeps both with their shares", async ({ browser }) => {
  const office = await as(browser, "admin@example.com");
  const made = await office.request.post("/api/harvests", { data: { fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: 2026, brownKg: 300, moisturePct: 14.6, grade: "1", bags: 10 } });
  expect(made.status()).toBe(201);
  const yamada = (await made.json()).code as string;
  const sent = await office.request.post("/api/events", { data: { step: "shipping", partyId: "grower-ikeda", counterpartyId: "mill-shirotae", inputs: [{ lot: yamada, quantity: 300 }], referenceDoc: "DS-E2E-MIX" } });
  expect(sent.status()).toBe(201);
  await office.context().close();

  const mill = await as(browser, "miller@example.com");
  const received = await mill.request.post("/api/events", { data: { step: "receiving", inputs: [{ lot: yamada, quantity: 300 }], referenceDoc: "DS-E2E-MIX" } });
  expect(received.status()).toBe(201);
  await mill.goto("/mill");
  const form = mill.getByTestId("polishing-form");
  await form.getByLabel("Harvest lot 1").fill(yamada);
  await form.getByLabel("Brown rice (kg) from lot 1").fill("300");
  // H26-0006: the seeded co-op Omachi at the mill.
  await form.getByLabel("Harvest lot 2").fill("H26-0006");
  await form.getByLabel("Brown rice (kg) from lot 2").fill("100");
  await form.getByLabel("Polished rice out (kg)").fill("240");
  await form.getByLabel("Bran out (kg)").fill("155");
  await form.getByLabel("Target polishing ratio (%)").fill("60");
  await form.getByRole("button", { name: "Record polishing run" }).click();
  const confirm = mill.getByTestId("mix-confirm");
  await expect(confirm).toContainText("different varieties (Yamada Nishiki, Omachi)");
  await confirm.getByLabel("I confirm polishing these varieties together").check();
  await form.getByRole("button", { name: "Record polishing run" }).click();
  const done = mill.getByTestId("polishing-result");
  await expect(done).toBeVisible();
  const polished = (await done.locator(".code-chip").first().textContent())!.trim();
  await mill.goto(`/lots/${polished}`);
  // 300 kg and 100 kg of brown rice: 75 % and 25 % (worked by hand).
  await expect(mill.getByTestId("lot-card")).toContainText("Yamada Nishiki 75%, Omachi 25%");
  await mill.context().close();
});
