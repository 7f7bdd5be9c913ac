import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import jsQR from "jsqr";
import { PNG } from "pngjs";
import { expect, request, test, type APIRequestContext, type Page } from "@playwright/test";
import { CHROMIUM_ARGS } from "../playwright.config";
import { y4mFromPng } from "../support/y4m";
import { DEMO_PASSWORD, signInAndLand } from "./helpers";

// Polished rice the brewery holds in the demo season; other specs use P26-0002, -0003 and -0005.
const POLISHED = "P26-0001";
const VIDEO = path.resolve(import.meta.dirname, "../.tmp/fake-camera", `two-bags-${process.pid}.y4m`);
const executablePath = process.env.CHROMIUM_PATH || "/usr/bin/chromium";
const PHONE_UA = "Mozilla/5.0 (Linux; Android 14; Pixel 8) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0.0.0 Mobile Safari/537.36";
const made = { steamedA: "", steamedB: "", tank: "", soakedC: "" };

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

async function post(api: APIRequestContext, body: unknown): Promise<string> {
  const res = await api.post("/api/events", { data: body });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()).outputs[0].code as string;
}

/** Soaked rice from the polished lot, then (if asked) steamed: what the brewer would have made. */
async function soak(api: APIRequestContext, dryKg: number, drainedKg: number): Promise<string> {
  return post(api, { step: "soaking", inputs: [{ lot: POLISHED, quantity: dryKg }], outputs: [{ kind: "soaked", quantity: drainedKg, use: "mash" }], measurements: [{ name: "soakMinutes", value: 40, unit: "min" }, { name: "waterTempC", value: 10, unit: "°C" }] });
}
async function steam(api: APIRequestContext, soaked: string, inKg: number, outKg: number): Promise<string> {
  return post(api, { step: "steaming", inputs: [{ lot: soaked, quantity: inKg }], outputs: [{ kind: "steamed", quantity: outKg }], measurements: [{ name: "steamMinutes", value: 50, unit: "min" }] });
}

/** The sign-in form on the page as it is (signIn() in helpers opens /sign-in afresh, losing `next`). */
async function fillSignIn(page: Page, email: string) {
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
}

test.beforeAll(async ({}, testInfo) => {
  const api = await request.newContext({ baseURL: testInfo.project.use.baseURL });
  expect((await api.post("/api/auth/sign-in", { data: { email: "brewer@example.com", password: DEMO_PASSWORD } })).status()).toBe(200);
  made.steamedA = await steam(api, await soak(api, 10, 13), 13, 14);
  made.steamedB = await steam(api, await soak(api, 10, 13), 13, 14);
  made.soakedC = await soak(api, 10, 13);
  // A tank to add to: a first addition in a register tank the demo season leaves free.
  const forTank = await steam(api, await soak(api, 10, 13), 13, 14);
  made.tank = await post(api, { step: "mash-addition", attributes: { addition: "first" }, inputs: [{ lot: forTank, quantity: 14 }], outputs: [{ kind: "tank", quantity: 24, tankName: "Small tank A" }], measurements: [{ name: "waterL", value: 10, unit: "L" }] });
  // The camera sees bag A's label, then bag B's, in a loop: two bags held up one after the other.
  const frames = [];
  for (const code of [made.steamedA, made.steamedB]) {
    const label = await api.get(`/api/lots/${code}/label.png`);
    expect(label.headers()["content-type"]).toBe("image/png");
    const video = y4mFromPng(await label.body(), { width: 640, height: 480, frames: 15 });
    frames.push(video.subarray(video.indexOf("FRAME\n")));
    if (frames.length === 1) frames.unshift(video.subarray(0, video.indexOf("FRAME\n")));
  }
  mkdirSync(path.dirname(VIDEO), { recursive: true });
  writeFileSync(VIDEO, Buffer.concat(frames));
  await api.dispose();
});

test("the camera scans two bags in a row into one mash addition; the same bag again is refused; an office code field scans too", async ({ playwright }, testInfo) => {
  test.setTimeout(120_000);
  const browser = await playwright.chromium.launch({ executablePath, args: [...CHROMIUM_ARGS, "--use-fake-device-for-media-stream", "--use-fake-ui-for-media-stream", `--use-file-for-fake-video-capture=${VIDEO}`] });
  const context = await browser.newContext({ baseURL: testInfo.project.use.baseURL, permissions: ["camera"], viewport: { width: 390, height: 844 }, hasTouch: true });
  const page = await context.newPage();
  await signInAndLand(page, "brewer@example.com");
  await page.goto(`/floor/add?lot=${made.steamedA}`);
  const form = page.getByTestId("floor-form");
  await form.getByLabel("Addition").selectOption("middle");
  await form.getByLabel("Tank lot", { exact: true }).fill(made.tank);
  await expect(form.getByLabel("Steamed rice lot", { exact: true })).toHaveValue(made.steamedA);

  // Bag A is already on the form: while the camera sees it, it says so and keeps looking; bag B is added.
  await form.getByRole("button", { name: "Scan Steamed rice lot" }).click();
  const more = form.getByTestId("more-bags-steamedCode");
  await expect(more.locator(".code-chip")).toHaveText(made.steamedB, { timeout: 20_000 });
  await expect(form.getByRole("button", { name: "Close camera Steamed rice lot" })).toHaveCount(0);
  await form.getByLabel(`Steamed rice (kg) · ${made.steamedB}`).fill("14");

  // A third scan: both bags are on the form, so whichever the camera sees is refused.
  await form.getByRole("button", { name: "Scan Steamed rice lot" }).click();
  await expect(form.getByTestId("f-steamedCode-notice")).toContainText("is already on this form", { timeout: 20_000 });
  await expect(more.locator(".code-chip")).toHaveCount(1);
  await form.getByRole("button", { name: "Close camera Steamed rice lot" }).click();

  await form.getByLabel("Water (L)").fill("20");
  await form.getByRole("button", { name: "Record addition" }).click();
  await expect(page.getByTestId("floor-result")).toBeVisible();
  // Both bags were drawn whole into the tank (14 kg each).
  for (const code of [made.steamedA, made.steamedB]) expect((await (await page.request.get(`/api/lots/${code}`)).json()).onHand).toBe(0);

  // The office forms take a scan the same way: the receipt's lot code.
  await page.goto("/receive");
  await page.getByRole("button", { name: "Scan Lot code" }).click();
  await expect(page.getByLabel("Lot code", { exact: true })).toHaveValue(new RegExp(`^(${made.steamedA}|${made.steamedB})$`), { timeout: 20_000 });
  // And the office lot list's code search.
  await page.goto("/lots");
  await page.getByRole("button", { name: "Scan Code contains" }).click();
  await expect(page.getByLabel("Code contains", { exact: true })).toHaveValue(new RegExp(`^(${made.steamedA}|${made.steamedB})$`), { timeout: 20_000 });
  await browser.close();
});

test("a label's QR code opens the floor card on a phone, through sign-in, and the office lot page on a desk", async ({ browser, baseURL }) => {
  const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, userAgent: PHONE_UA });
  const page = await phone.newPage();
  // What the printed label carries, read by an independent decoder (jsQR) as a phone's camera app would.
  await signInAndLand(page, "brewer@example.com");
  const label = PNG.sync.read(await (await page.request.get(`/api/lots/${POLISHED}/label.png`)).body());
  const url = jsQR(new Uint8ClampedArray(label.data), label.width, label.height)?.data;
  expect(url).toBe(`${baseURL}/l/${POLISHED}`);
  await page.context().clearCookies();

  await page.goto(url!);
  await expect(page).toHaveURL(/\/sign-in\?next=%2Fl%2FP26-0001$/);
  await fillSignIn(page, "brewer@example.com");
  await expect(page).toHaveURL(new RegExp(`/scan\\?code=${POLISHED}$`));
  const card = page.getByTestId("floor-lot-card");
  await expect(card.getByTestId("lot-code")).toHaveText(POLISHED);
  await expect(card.getByRole("link", { name: "Soak" })).toHaveAttribute("href", `/floor/soak?lot=${POLISHED}`);
  await phone.close();

  const desk = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const office = await desk.newPage();
  await signInAndLand(office, "brewer@example.com");
  await office.goto(url!);
  await expect(office).toHaveURL(new RegExp(`/lots/${POLISHED}$`));
  await desk.close();
});

test("sign-in ignores a next that is an absolute or //host address (no open redirect)", async ({ page, baseURL }) => {
  for (const next of ["https://evil.example/l/P26-0001", "//evil.example/l/P26-0001", "/\\evil.example"]) {
    await page.context().clearCookies();
    await page.goto(`/sign-in?next=${encodeURIComponent(next)}`);
    await fillSignIn(page, "brewer@example.com");
    await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
    expect(new URL(page.url()).origin).toBe(new URL(baseURL!).origin);
    expect(new URL(page.url()).pathname).toBe("/scan");
  }
});

test("a record queued offline and refused by the server opens again in its form with the message, and is resent fixed", async ({ page, context }) => {
  await signInAndLand(page, "brewer@example.com");
  await page.goto(`/floor/steam?lot=${made.soakedC}`);
  const form = page.getByTestId("floor-form");
  // Required before sending: marked for the eye (*) and for screen readers (aria-required).
  await expect(form.getByLabel("Steamed weight (kg)")).toHaveAttribute("aria-required", "true");
  await expect(form.locator("label[for=f-steamedKg] + span")).toHaveText("*");
  await expect(form.getByLabel("Soaked rice in (kg)")).toHaveAttribute("aria-required", "true");

  // Checked on the phone with the server's schema: a blank weight is refused there, nothing queued.
  await context.setOffline(true);
  await form.getByLabel("Soaked rice in (kg)").fill("99");
  await form.getByLabel("Steaming time (minutes)").fill("50");
  await form.getByRole("button", { name: "Record steaming" }).click();
  await expect(form.getByTestId("f-steamedKg-error")).toHaveText("This is required.");
  await expect(page.getByTestId("queue-panel")).toHaveCount(0);

  // 99 kg from a lot of 13 kg: the phone cannot know, so it keeps the record.
  await form.getByLabel("Steamed weight (kg)").fill("14");
  await form.getByRole("button", { name: "Record steaming" }).click();
  await expect(page.getByTestId("floor-queued")).toBeVisible();
  const panel = page.getByTestId("queue-panel");
  await expect(panel.getByTestId("queue-count")).toHaveText("1 record waiting to be sent");

  await context.setOffline(false);
  await expect(panel).toContainText(`Not accepted: Lot ${made.soakedC} has only 13 kg on hand.`);
  await panel.getByRole("link", { name: "Open to fix" }).click();
  await expect(page).toHaveURL(new RegExp(`/floor/steam\\?lot=${made.soakedC}&queued=`));
  const again = page.getByTestId("floor-form");
  await expect(again.getByLabel("Soaked rice in (kg)")).toHaveValue("99");
  await expect(again.getByLabel("Steamed weight (kg)")).toHaveValue("14");
  await expect(again.getByLabel("Steaming time (minutes)")).toHaveValue("50");
  await expect(again.getByTestId("f-drawKg-error")).toHaveText("Only 13 kg on hand.");

  await again.getByLabel("Soaked rice in (kg)").fill("13");
  await again.getByRole("button", { name: "Record steaming" }).click();
  await expect(page.getByTestId("floor-result")).toBeVisible();
  await expect(page.getByTestId("queue-panel")).toHaveCount(0);
  expect((await (await page.request.get(`/api/lots/${made.soakedC}`)).json()).onHand).toBe(0);
  const events = (await (await page.request.get(`/api/lots/${made.soakedC}/events`)).json()).items as { step: string }[];
  expect(events.filter((e) => e.step === "steaming")).toHaveLength(1);
});
