import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { expect, request, test, type Page } from "@playwright/test";
import { CHROMIUM_ARGS } from "../playwright.config";
import { y4mFromPng } from "../support/y4m";
import { DEMO_PASSWORD, signInAndLand } from "./helpers";

// A polished lot the brewery holds in the demo season; the offline-queue spec uses P26-0002.
const LOT = "P26-0003";
const VIDEO = path.resolve(import.meta.dirname, "../.tmp/fake-camera", `label-${LOT}-${process.pid}.y4m`);
const executablePath = process.env.CHROMIUM_PATH || "/usr/bin/chromium";
const expected = { onHand: "", kind: "" };

// Chromium's fake camera plays the Y4M in a loop; the fake UI answers the permission prompt.
// The browser is launched inside the test, after the file is written: a worker's browser may
// already be running (or be launched before beforeAll), and it reads the file only at launch.
const cameraArgs = () => [...CHROMIUM_ARGS, "--use-fake-device-for-media-stream", "--use-fake-ui-for-media-stream", `--use-file-for-fake-video-capture=${VIDEO}`];

test.describe("with a camera that sees a lot label", () => {
  // The label the label route prints for this lot, as the camera would see it on a bag.
  test.beforeAll(async ({}, testInfo) => {
    const api = await request.newContext({ baseURL: testInfo.project.use.baseURL });
    expect((await api.post("/api/auth/sign-in", { data: { email: "brewer@example.com", password: DEMO_PASSWORD } })).status()).toBe(200);
    const label = await api.get(`/api/lots/${LOT}/label.png`);
    expect(label.headers()["content-type"]).toBe("image/png");
    const lot = await (await api.get(`/api/lots/${LOT}`)).json();
    expected.kind = lot.kind;
    expected.onHand = `${new Intl.NumberFormat("en", { maximumFractionDigits: 1 }).format(lot.onHand)} ${lot.unit}`;
    mkdirSync(path.dirname(VIDEO), { recursive: true });
    writeFileSync(VIDEO, y4mFromPng(await label.body(), { width: 640, height: 480, frames: 2 }));
    await api.dispose();
  });

  test("the brewer starts the camera on /scan and the label opens its lot card", async ({ playwright }, testInfo) => {
    expect(expected.kind).toBe("polished");
    const browser = await playwright.chromium.launch({ executablePath, args: cameraArgs() });
    const context = await browser.newContext({ baseURL: testInfo.project.use.baseURL, permissions: ["camera"] });
    const page = await context.newPage();
    await signInAndLand(page, "brewer@example.com");
    await page.goto("/scan");
    await expect(page.getByTestId("recent-scans")).not.toContainText(LOT);
    await page.getByRole("button", { name: "Start camera" }).click();

    const card = page.getByTestId("floor-lot-card");
    await expect(card.getByTestId("lot-code")).toHaveText(LOT, { timeout: 20_000 });
    await expect(card.getByTestId("lot-kind")).toHaveText("Polished rice");
    await expect(card.getByTestId("lot-on-hand")).toHaveText(expected.onHand);
    await expect(card.getByRole("link", { name: "Soak" })).toHaveAttribute("href", `/floor/soak?lot=${LOT}`);
    // A good read stops the camera, so the next bag is not read by accident.
    await expect(page.getByRole("button", { name: "Start camera" })).toBeVisible();
    await expect(page).toHaveURL(new RegExp(`/scan\\?code=${LOT}$`));

    const recent = page.getByTestId("recent-scans");
    await expect(recent.getByRole("link", { name: new RegExp(LOT) })).toBeVisible();
    await page.reload();
    await expect(page.getByTestId("recent-scans").getByRole("link").first()).toContainText(LOT);
    await browser.close();
  });
});

/** getUserMedia failing as Chromium fails it on a phone without a camera, or when the person said no. */
async function failCamera(page: Page, name: "NotFoundError" | "NotAllowedError") {
  await page.addInitScript((errorName) => {
    navigator.mediaDevices.getUserMedia = () => Promise.reject(new DOMException("camera unavailable", errorName));
  }, name);
}

test.describe("without a camera", () => {
  test("permission refused: the message says so and the typed code still opens the lot", async ({ page }) => {
    await failCamera(page, "NotAllowedError");
    await signInAndLand(page, "brewer@example.com");
    await page.goto("/scan");
    await page.getByRole("button", { name: "Start camera" }).click();
    await expect(page.getByTestId("camera-error")).toHaveText("The camera is blocked for this site. Allow it in the browser's settings, or type the code instead.");
    await page.getByLabel("Type the code").fill("P26-0001");
    await page.getByRole("button", { name: "Open" }).click();
    await expect(page.getByTestId("lot-code")).toHaveText("P26-0001");
  });

  test("no device: typed codes, label addresses and recent scans still work", async ({ page, baseURL }) => {
    await failCamera(page, "NotFoundError");
    await signInAndLand(page, "brewer@example.com");
    await page.goto("/scan");
    await page.getByRole("button", { name: "Start camera" }).click();
    await expect(page.getByTestId("camera-error")).toHaveText("No camera was found on this device. Type the code instead.");

    const typed = page.getByLabel("Type the code");
    await typed.fill("p26 0004");
    await page.getByRole("button", { name: "Open" }).click();
    await expect(page.getByTestId("lot-code")).toHaveText("P26-0004");

    // A keyboard-wedge scanner types the whole label address into the box.
    await typed.fill(`${baseURL}/lots/P26-0001`);
    await typed.press("Enter");
    await expect(page.getByTestId("lot-code")).toHaveText("P26-0001");

    await typed.fill("WIFI:S:brewery;;");
    await typed.press("Enter");
    const result = page.getByTestId("scan-result");
    await expect(result.getByRole("alert")).toHaveText("That is not a Grainline code: WIFI:S:brewery;;");
    await typed.fill("P26-9999");
    await typed.press("Enter");
    await expect(result.getByRole("alert")).toHaveText("No lot has the code P26-9999.");

    const recent = page.getByTestId("recent-scans").getByRole("link");
    await expect(recent).toHaveCount(2);
    await expect(recent.nth(0)).toContainText("P26-0001");
    await expect(recent.nth(1)).toContainText("P26-0004");
    await recent.nth(1).click();
    await expect(page.getByTestId("lot-code")).toHaveText("P26-0004");
    await expect(recent.nth(0)).toContainText("P26-0004");
  });

  test("the typed-code form works as a plain GET without JavaScript", async ({ browser, baseURL }) => {
    const api = await request.newContext({ baseURL });
    expect((await api.post("/api/auth/sign-in", { data: { email: "brewer@example.com", password: DEMO_PASSWORD } })).status()).toBe(200);
    const context = await browser.newContext({ baseURL, javaScriptEnabled: false, storageState: await api.storageState() });
    await api.dispose();
    const page = await context.newPage();
    await page.goto("/scan");
    await page.getByLabel("Type the code").fill("p26-0002");
    await page.getByRole("button", { name: "Open" }).click();
    await expect(page).toHaveURL(/\/scan\?code=p26-0002$/);
    await expect(page.getByTestId("lot-code")).toHaveText("P26-0002");
    await context.close();
  });
});
