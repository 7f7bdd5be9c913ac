// The chain to the buyer (issue 13, items 9–11), in Chromium: a shipment recorded from the office's
// lot page reaches the recall and is returned by a correction; a recall puts every reached lot on
// hold, the floor card and the lot page say so, a held lot is refused, and releases undo it; labels
// print one per bag on pages the size of the label, and their QR codes read back.
import jsQR from "jsqr";
import { PDFDocument } from "pdf-lib";
import { PNG } from "pngjs";
import { expect, test, type Page } from "@playwright/test";
import { signInAndLand } from "./helpers";

type Lot = { code: string; kind: string; quantity: number; onHand: number; cropYear?: number; polishingRatioPct?: number; attributes: Record<string, unknown>; createdAt: string };
const PORT = process.env.E2E_PORT || 3100;
/** 1 mm in PDF points (1 pt = 1/72 inch, 1 inch = 25.4 mm). */
const MM = 72 / 25.4;

async function lotsOf(page: Page, kind: string): Promise<Lot[]> {
  const body = await (await page.request.get(`/api/lots?kind=${kind}&limit=100`)).json();
  return (body.items as Lot[]).sort((a, b) => a.createdAt.localeCompare(b.createdAt));
}
/** The first harvest of the seeded 2024 season: its recall reaches a tank, its sake and two bottlings. */
async function harvest2024(page: Page) {
  return (await lotsOf(page, "harvest")).find((l) => l.cropYear === 2024)!.code;
}

test("the office ships bottles to a buyer; the recall lists it; a return is a correction of the shipment", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  const bottles = (await lotsOf(page, "bottled")).find((l) => l.quantity === 800)!;
  const harvest = await harvest2024(page);
  await page.goto("/recall");
  await page.locator('form[action="/recall"] input[name="code"]').fill(harvest);
  await page.locator('form[action="/recall"]').getByRole("button", { name: "Find" }).click();
  await page.getByRole("link", { name: bottles.code }).first().click();
  await expect(page).toHaveURL(new RegExp(`/lots/${bottles.code}$`));

  const form = page.getByTestId("shipment-form");
  await form.getByLabel("Buyer").selectOption({ label: "Minato Liquor Wholesale" });
  await form.getByLabel("Shipped on").fill("2026-12-01");
  await form.getByLabel("Quantity (bottle)").fill("24");
  await form.getByRole("button", { name: "Record the shipment" }).click();
  // The slip is required: the error stands beside its field and nothing is recorded.
  await expect(form.locator("#ship-slip")).toHaveAttribute("aria-invalid", "true");
  await form.getByLabel("Delivery slip number").fill("INV-2026-120");
  await form.getByRole("button", { name: "Record the shipment" }).click();
  await expect(form.getByTestId("form-message")).toHaveText("Shipment of 24 bottles to Minato Liquor Wholesale recorded.");

  await page.goto(`/recall?code=${harvest}`);
  const shipment = page.getByTestId("recall-shipments").getByText("INV-2026-120");
  await expect(shipment).toContainText(`2026-12-01: 24 bottles of ${bottles.code} to Minato Liquor Wholesale`);

  // The buyer sends them all back: the shipment is corrected, with the reason.
  await page.goto(`/lots/${bottles.code}`);
  const correction = page.locator("form").filter({ has: page.getByRole("button", { name: "Record correction" }) });
  const option = correction.locator("#corrects option").filter({ hasText: "Shipped" });
  await correction.locator("#corrects").selectOption((await option.first().getAttribute("value"))!);
  await correction.getByLabel("Reason").fill("Buyer returned the 24 bottles: labels smudged");
  await correction.getByRole("button", { name: "Record correction" }).click();
  await expect(correction.getByTestId("form-message")).toHaveText("Correction recorded.");
  await page.goto(`/recall?code=${harvest}`);
  await expect(page.getByTestId("recall-shipments").getByText("INV-2026-120")).toContainText("reversed by event #");
});

test("a recall holds every reached lot; the floor card, lot page and recall show it; releases undo it", async ({ browser }) => {
  const office = await browser.newPage();
  await signInAndLand(office, "admin@example.com");
  const harvest = await harvest2024(office);
  const forward = await (await office.request.get(`/api/trace/${harvest}?direction=forward`)).json();
  const sake = (forward.reached as { code: string; kind: string }[]).find((l) => l.kind === "sake")!.code;
  const bottles = (await lotsOf(office, "bottled")).find((l) => l.quantity === 800)!.code;

  await office.goto(`/recall?code=${harvest}`);
  const panel = office.getByTestId("recall-holds");
  await expect(panel.getByRole("note")).toContainText("food-safety plan");
  await panel.getByTestId("hold-all-form").getByLabel("Reason").fill("Mould reported on polished rice lot");
  await panel.getByRole("button", { name: "Put every reached lot on hold" }).click();
  await expect(panel.getByTestId("form-message")).toContainText("lots put on hold.");
  const rows = office.getByTestId("recall-lots").locator("tbody tr");
  await expect(office.getByTestId("recall-hold").first()).toHaveText("On hold: Mould reported on polished rice lot");
  await expect(office.getByTestId("recall-hold").filter({ hasText: "Not on hold" })).toHaveCount(0);
  expect(await rows.count()).toBeGreaterThan(4);

  // The brewer's phone: the card says so in one line, and a shipment of the held bottles is refused.
  const phone = await browser.newPage({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
  await signInAndLand(phone, "brewer@example.com");
  await phone.goto("/scan");
  await phone.locator('input[name="code"]').fill(sake);
  await phone.keyboard.press("Enter");
  await expect(phone.getByTestId("floor-lot-card").getByTestId("lot-on-hold")).toHaveText("On hold: Mould reported on polished rice lot");
  // Nothing is drawn from a held lot, so the card offers no step on it (sake offers bottling and blending otherwise).
  await expect(phone.getByTestId("floor-lot-card").locator('a[href^="/floor/"]')).toHaveCount(0);
  await expect(phone.getByTestId("floor-lot-card")).toContainText("Nothing to record on the floor for this lot.");
  await phone.goto(`/lots/${bottles}`);
  await expect(phone.getByTestId("lot-on-hold")).toContainText("Mould reported on polished rice lot");
  const form = phone.getByTestId("shipment-form");
  await form.getByLabel("Quantity (bottle)").fill("10");
  await form.getByLabel("Delivery slip number").fill("INV-HELD");
  await form.getByRole("button", { name: "Record the shipment" }).click();
  await expect(form.getByText(`Lot ${bottles} is on hold (Mould reported on polished rice lot)`)).toBeVisible();

  // The office releases the bottles alone, then the rest of the recall.
  await office.goto(`/lots/${bottles}`);
  await office.getByTestId("release-lot-form").getByLabel("Reason").fill("Lab result clear for this bottling");
  await office.getByRole("button", { name: "Release this lot" }).click();
  // Released: the page drops the hold (and its release form) and keeps the history.
  await expect(office.getByTestId("lot-on-hold")).toHaveCount(0);
  await office.reload();
  await expect(office.getByTestId("lot-on-hold")).toHaveCount(0);
  await expect(office.getByTestId("lot-hold-history")).toContainText("Released on");
  await office.goto(`/recall?code=${harvest}`);
  await office.getByTestId("release-all-form").getByLabel("Reason").fill("Authority cleared the batch");
  await office.getByRole("button", { name: "Release every held lot of this recall" }).click();
  await expect(office.getByTestId("recall-held-summary")).toHaveText("No reached lot is on hold.");
  await office.reload();
  await expect(office.getByTestId("recall-held-summary")).toHaveText("No reached lot is on hold.");

  // Both actions are in the audit log.
  await office.goto("/records");
  await expect(office.getByText(new RegExp(`Put on hold: .*${sake}.*\\. Reason: Mould reported on polished rice lot`)).first()).toBeVisible();
  await expect(office.getByText(new RegExp(`Released from hold: .*${bottles}.*\\. Reason: Lab result clear for this bottling`)).first()).toBeVisible();
});

test("labels: one per bag on a 100 × 150 mm page, a 62 mm roll, A4 sheets; polished rice names its ratio and mill; the QR reads back", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  const harvest = (await lotsOf(page, "harvest")).find((l) => typeof l.attributes.bags === "number" && (l.attributes.bags as number) >= 2 && (l.attributes.bags as number) <= 40)!;
  const bags = harvest.attributes.bags as number;
  const polished = (await lotsOf(page, "polished")).at(-1)!;

  // From the lot page's "print label" link: the bag layout, one label per bag.
  await page.goto(`/lots/${harvest.code}`);
  await page.getByRole("link", { name: "Print bag label" }).click();
  await expect(page.getByTestId("label")).toHaveCount(bags);
  await expect(page.getByTestId("label-copies")).toContainText(`${harvest.code}: ${bags} labels, one per bag recorded`);
  // Printed with the page's own @page size: every page is the 100 × 150 mm label (common practice size).
  // page.pdf lays the page out for print media, as the browser's print dialog does.
  let pdf = await PDFDocument.load(await page.pdf({ preferCSSPageSize: true, printBackground: true }));
  expect(pdf.getPageCount()).toBe(bags);
  for (const p of pdf.getPages()) {
    expect(p.getWidth() / MM).toBeCloseTo(100, 0);
    expect(p.getHeight() / MM).toBeCloseTo(150, 0);
  }
  // ISO/IEC 18004, read by an independent decoder (jsQR): the printed symbol opens the lot.
  const shot = PNG.sync.read(await page.getByTestId("label").first().getByRole("img", { name: /QR code for lot/ }).screenshot());
  expect(jsQR(new Uint8ClampedArray(shot.data), shot.width, shot.height)?.data).toBe(`http://localhost:${PORT}/l/${harvest.code}`);

  // The polished lot on the 62 mm roll, two copies asked for: variety, polishing ratio, mill.
  await page.goto("/labels");
  await page.getByLabel("Lot codes").fill(polished.code);
  await page.getByLabel("Layout").selectOption("roll");
  await page.getByLabel("Copies of each").fill("2");
  await page.getByRole("button", { name: "Show labels" }).click();
  const label = page.getByTestId("label");
  await expect(label).toHaveCount(2);
  await expect(label.first()).toContainText("Polishing ratio");
  // The ratio as labels print it, the fraction below 1 % dropped (NTA labelling standard).
  await expect(label.first()).toContainText(`${Math.floor(polished.polishingRatioPct!)} %`);
  await expect(label.first()).toContainText("Polished by");
  await expect(label.first()).toContainText("Shirotae Polishing Works");
  pdf = await PDFDocument.load(await page.pdf({ preferCSSPageSize: true }));
  expect(pdf.getPageCount()).toBe(2);
  expect(pdf.getPage(0).getWidth() / MM).toBeCloseTo(62, 0);
  expect(pdf.getPage(0).getHeight() / MM).toBeCloseTo(100, 0);

  // A4 sheets (ISO 216: 210 × 297 mm), 24 labels to a sheet.
  await page.getByLabel("Layout").selectOption("sheet");
  await page.getByRole("button", { name: "Show labels" }).click();
  await expect(page.getByTestId("label")).toHaveCount(2);
  pdf = await PDFDocument.load(await page.pdf({ preferCSSPageSize: true }));
  expect(pdf.getPageCount()).toBe(1);
  expect(pdf.getPage(0).getWidth() / MM).toBeCloseTo(210, 0);
  expect(pdf.getPage(0).getHeight() / MM).toBeCloseTo(297, 0);
  await expect(page.getByTestId("label-polished").first()).toContainText("Shirotae Polishing Works");
});
