import jsQR from "jsqr";
import { PNG } from "pngjs";
import QRCode from "qrcode";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as getLabelPng } from "../../app/api/lots/[code]/label.png/route";
import { POST as postEvent } from "../../app/api/events/route";
import { buildLabelSheet, expandCopies, MIN_MODULE_MM, PAGE_SIZE, paginateLabels, parseCopies, pickErrorCorrection, printedRatioPct, QR_WIDTH_MM } from "@/server/floor/labels";
import { getSqlite } from "@/server/platform/db";
import type { SessionUser } from "@/server/accounts/session";
import { call, jsonRequest, signInAs } from "../support/api";

let grower: string, grower2: string, miller: string, brewer: string, code: string;

const harvest = async (cookie: string) =>
  (await call(postHarvest, jsonRequest("/api/harvests", { cookie, body: { fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: 2026, brownKg: 600, moisturePct: 14.8, grade: "1", bags: 10 } }))).body.code as string;
const labelPng = (cookie: string | undefined, lotCode: string) =>
  getLabelPng(jsonRequest(`/api/lots/${encodeURIComponent(lotCode)}/label.png`, { cookie }), { params: Promise.resolve({ code: lotCode }) });
const decodePng = async (response: Response): Promise<Bitmap> => {
  const png = PNG.sync.read(Buffer.from(await response.arrayBuffer()));
  return { width: png.width, height: png.height, data: Uint8ClampedArray.from(png.data) };
};
// ISO/IEC 18004: error-correction levels in rising strength, L ≈ 7 %, M ≈ 15 %, Q ≈ 25 %, H ≈ 30 %.
const STRENGTH = ["L", "M", "Q", "H"];

beforeAll(async () => {
  grower = await signInAs("grower@example.com");
  grower2 = await signInAs("grower2@example.com");
  miller = await signInAs("miller@example.com");
  brewer = await signInAs("brewer@example.com");
  vi.stubEnv("GRAINLINE_ORIGIN", "");
  code = await harvest(grower);
  expect(code).toMatch(/^H26-\d{4}$/);
});
afterEach(() => vi.stubEnv("GRAINLINE_ORIGIN", ""));

describe("GET /api/lots/{code}/label.png", () => {
  it("is a PNG that an independent decoder (jsQR) reads as the lot's label route", async () => {
    const res = await labelPng(grower, code);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("image/png");
    expect(res.headers.get("cache-control")).toMatch(/^private\b/);
    const image = await decodePng(res);
    const decoded = jsQR(image.data, image.width, image.height);
    expect(decoded?.data).toBe(`http://localhost:3000/l/${code}`);
  });

  it("follows ISO/IEC 18004 geometry: 4-module quiet zone, 17 + 4·version modules across, format info at M or stronger", async () => {
    const image = await decodePng(await labelPng(grower, code));
    const version = jsQR(image.data, image.width, image.height)!.version;
    const symbol = matrixOf(image);
    expect(symbol.quietZoneModules).toBe(4);
    expect(symbol.rightQuietZoneModules).toBe(4);
    expect(image.width).toBe(image.height);
    expect(symbol.size).toBe(17 + 4 * version);
    // Format information (ISO/IEC 18004 §7.9): both copies agree and carry a valid BCH(15,5) code.
    const format = readFormatInformation(symbol);
    expect(format.copiesAgree).toBe(true);
    expect(format.bchValid).toBe(true);
    expect(STRENGTH.indexOf(format.level)).toBeGreaterThanOrEqual(STRENGTH.indexOf("M"));
    // A short URL fits at Q on a 33 mm sheet label: (17 + 4·v + 8) modules of at least 0.396 mm.
    expect(format.level).toBe("Q");
    expect(QR_WIDTH_MM.sheet / (symbol.size + 8)).toBeGreaterThanOrEqual(MIN_MODULE_MM);
    expect(QRCode.create(`http://localhost:3000/l/${code}`, { errorCorrectionLevel: format.level }).version).toBe(version);
  });

  it("uses GRAINLINE_ORIGIN when it is set, without a doubled slash", async () => {
    vi.stubEnv("GRAINLINE_ORIGIN", "https://labels.example/");
    const image = await decodePng(await labelPng(grower, code));
    expect(jsQR(image.data, image.width, image.height)?.data).toBe(`https://labels.example/l/${code}`);
  });

  it("serves the office, and the mill once it holds the lot", async () => {
    expect((await labelPng(brewer, code)).status).toBe(200);
    expect((await labelPng(miller, code)).status).toBe(404);
    // The grower's dispatch first: a receipt needs the sender's word.
    await call(postEvent, jsonRequest("/api/events", { cookie: grower, body: { step: "shipping", inputs: [{ lot: code, quantity: 600 }], counterpartyId: "mill-shirotae", referenceDoc: "DS-LABEL-1" } }));
    const received = await call(postEvent, jsonRequest("/api/events", { cookie: miller, body: { step: "receiving", inputs: [{ lot: code, quantity: 600 }], counterpartyId: "grower-ikeda" } }));
    expect(received.status).toBe(201);
    expect((await labelPng(miller, code)).status).toBe(200);
    // The grower still sees the lot they registered after it has moved to the mill.
    expect((await labelPng(grower, code)).status).toBe(200);
  });

  it("answers 404 to another grower, as for an unknown lot, and 401 to no one signed in", async () => {
    const other = await labelPng(grower2, code);
    expect(other.status).toBe(404);
    expect((await other.json()).error.code).toBe("not_found");
    expect((await labelPng(grower2, "H26-9999")).status).toBe(404);
    const anonymous = await labelPng(undefined, code);
    expect(anonymous.status).toBe(401);
    expect((await anonymous.json()).error.code).toBe("unauthenticated");
  });
});

describe("label sheet", () => {
  const ikeda: SessionUser = { id: "?", role: "grower", partyId: "grower-ikeda", email: "grower@example.com", name: "Ikeda" };

  it("prints a grower's new harvest lot with an SVG that decodes to its URL, and lists others as not found", async () => {
    const own = await harvest(grower);
    const sheet = await buildLabelSheet(ikeda, [own, "H26-9999"], "sheet", "https://g.example/");
    expect(sheet.status).toBe("ok");
    if (sheet.status !== "ok") return;
    expect(sheet.notFound).toEqual(["H26-9999"]);
    expect(sheet.labels).toHaveLength(1);
    const [label] = sheet.labels;
    expect(label).toMatchObject({ code: own, kind: "harvest", variety: "Yamada Nishiki", cropYear: 2026, quantity: 600, unit: "kg", holder: expect.any(String), url: `https://g.example/l/${own}` });
    const image = rasteriseQrSvg(label!.svg, 6);
    const decoded = jsQR(image.data, image.width, image.height);
    expect(decoded?.data).toBe(`https://g.example/l/${own}`);
    const symbol = matrixOf(image);
    expect(symbol.quietZoneModules).toBe(4);
    expect(symbol.size).toBe(17 + 4 * decoded!.version);
    expect(readFormatInformation(symbol).level).toBe(label!.errorCorrection);
  });

  it("does not print a lot the user may not see", async () => {
    const nakase: SessionUser = { id: "?", role: "grower", partyId: "grower-nakase", email: "grower2@example.com", name: "Nakase" };
    const sheet = await buildLabelSheet(nakase, [code], "bag", "https://g.example");
    expect(sheet).toEqual({ status: "ok", layout: "bag", labels: [], notFound: [code] });
  });

  it("refuses more than 200 codes", async () => {
    const codes = Array.from({ length: 201 }, (_, i) => `H26-${String(i).padStart(4, "0")}`);
    expect(await buildLabelSheet(ikeda, codes, "sheet", "https://g.example")).toEqual({ status: "too-many", layout: "sheet", count: 201, max: 200 });
  });

  it("prints one label per bag: a harvest's registered bags, a polished lot's 30 kg bags, or the copies asked for", async () => {
    const own = await harvest(grower); // 600 kg in 10 bags
    const sheet = await buildLabelSheet(ikeda, [own], "bag", "https://g.example");
    expect(sheet.status === "ok" && sheet.labels.map((l) => [l.copies, l.bags])).toEqual([[10, "recorded"]]);
    const brewery: SessionUser = { id: "?", role: "brewer", partyId: "brewery-kirinoha", email: "brewer@example.com", name: "Brewer" };
    const polished = getSqlite().prepare("select code, quantity_in as kg, polishing_ratio_pct as ratio from lots where kind = 'polished' order by id desc").get() as { code: string; kg: number; ratio: number };
    const roll = await buildLabelSheet(brewery, [polished.code], "roll", "https://g.example");
    if (roll.status !== "ok") throw new Error(roll.status);
    // 30 kg polished-rice bags (common practice, from memory): the last bag part-full.
    expect(roll.labels[0]).toMatchObject({ copies: Math.ceil(polished.kg / 30), bags: "computed", polishingRatioPct: polished.ratio, mill: "Shirotae Polishing Works" });
    expect(expandCopies(roll.labels)).toHaveLength(Math.ceil(polished.kg / 30));
    expect(paginateLabels(expandCopies(roll.labels), "roll")).toHaveLength(Math.ceil(polished.kg / 30));
    const three = await buildLabelSheet(brewery, [polished.code, own], "sheet", "https://g.example", 3);
    expect(three.status === "ok" && three.labels.map((l) => l.copies)).toEqual([3, 3]);
    expect(parseCopies("3")).toBe(3);
    // Typed on a Japanese keyboard: full-width digits fold to ASCII under NFKC (Unicode UAX #15).
    expect(parseCopies("３")).toBe(3);
    for (const bad of ["0", "-1", "2.5", "201", "1e3", "", "x"]) expect(parseCopies(bad), bad).toBeNull();
  });

  it("refuses a print of more than 480 labels", async () => {
    const brewery: SessionUser = { id: "?", role: "brewer", partyId: "brewery-kirinoha", email: "brewer@example.com", name: "Brewer" };
    const codes = (getSqlite().prepare("select code from lots order by id limit 3").all() as { code: string }[]).map((r) => r.code);
    expect(await buildLabelSheet(brewery, codes, "sheet", "https://g.example", 200)).toEqual({ status: "too-many-labels", layout: "sheet", count: 600, max: 480 });
  });

  it("prints the polishing ratio with the fraction below 1 % dropped (NTA labelling standard, ../shared/references.md)", () => {
    expect([60.4, 60, 59.99, 35.0].map(printedRatioPct)).toEqual([60, 60, 59, 35]);
    // Page sizes: A4 (ISO 216, 210 × 297 mm); the 100 × 150 mm label and the 62 mm roll are common practice.
    expect(PAGE_SIZE).toEqual({ sheet: "A4", bag: "100mm 150mm", roll: "62mm 100mm" });
  });

  it("falls back from Q to M only when Q modules would drop below 0.396 mm (GS1 General Specifications §5.12.3.1)", () => {
    const long = `https://${"a".repeat(240)}.example/lots/H26-0001`;
    const atQ = QRCode.create(long, { errorCorrectionLevel: "Q" }).modules.size + 8;
    expect(QR_WIDTH_MM.sheet / atQ).toBeLessThan(MIN_MODULE_MM);
    expect(pickErrorCorrection(long, QR_WIDTH_MM.sheet)).toBe("M");
    expect(pickErrorCorrection(long, QR_WIDTH_MM.bag)).toBe("Q");
  });
});

// ---------------------------------------------------------------------------
// Reading the printed symbol back, by ISO/IEC 18004 rather than by the encoder's own data.

type Bitmap = { width: number; height: number; data: Uint8ClampedArray };
type QrGrid = { size: number; quietZoneModules: number; rightQuietZoneModules: number; at: (row: number, col: number) => boolean };

const isDark = (image: Bitmap, x: number, y: number) => image.data[(y * image.width + x) * 4]! < 128;

/** The module grid of an upright symbol, measured from its top-left finder pattern (7 modules across, §6.3.3). */
function matrixOf(image: Bitmap): QrGrid {
  let x0 = -1;
  let y0 = -1;
  for (let y = 0; y < image.height && y0 < 0; y++) {
    for (let x = 0; x < image.width; x++) if (isDark(image, x, y)) { x0 = x; y0 = y; break; }
  }
  let run = 0;
  while (isDark(image, x0 + run, y0)) run++;
  const px = run / 7;
  let last = image.width - 1;
  while (!isDark(image, last, y0)) last--;
  return {
    size: Math.round((last + 1 - x0) / px),
    quietZoneModules: Math.min(x0, y0) / px,
    rightQuietZoneModules: (image.width - 1 - last) / px,
    at: (row, col) => isDark(image, Math.floor(x0 + (col + 0.5) * px), Math.floor(y0 + (row + 0.5) * px)),
  };
}

/**
 * Format information, ISO/IEC 18004 §7.9: 15 bits, XOR-masked with 101010000010010, holding
 * 2 bits of error-correction level (L 01, M 00, Q 11, H 10) and 3 of mask, protected by a
 * BCH(15,5) code with generator x^10 + x^8 + x^5 + x^4 + x^2 + x + 1. It is written twice:
 * around the top-left finder, and split between the other two.
 */
function readFormatInformation(symbol: QrGrid) {
  const n = symbol.size;
  const bits = (cells: [number, number][]) => cells.reduce((acc, [row, col]) => (acc << 1) | (symbol.at(row, col) ? 1 : 0), 0);
  const first = bits([
    ...[0, 1, 2, 3, 4, 5, 7, 8].map((col) => [8, col] as [number, number]),
    ...[7, 5, 4, 3, 2, 1, 0].map((row) => [row, 8] as [number, number]),
  ]);
  const second = bits([
    ...[1, 2, 3, 4, 5, 6, 7].map((k) => [n - k, 8] as [number, number]),
    ...[8, 7, 6, 5, 4, 3, 2, 1].map((k) => [8, n - k] as [number, number]),
  ]);
  const unmasked = first ^ 0b101010000010010;
  const data = unmasked >> 10;
  let remainder = data << 10;
  for (let bit = 14; bit >= 10; bit--) if (remainder & (1 << bit)) remainder ^= 0b10100110111 << (bit - 10);
  const level = (["M", "L", "H", "Q"] as const)[data >> 3]!;
  return { level, copiesAgree: first === second, bchValid: remainder === (unmasked & 0x3ff) };
}

/** Paints the qrcode SVG (horizontal strokes of one module, "M x y", "m dx 0", "h n") at px pixels a module. */
function rasteriseQrSvg(svg: string, px: number): Bitmap {
  const modules = Number(/viewBox="0 0 (\d+) \d+"/.exec(svg)![1]);
  const d = /<path stroke="[^"]*" d="([^"]*)"/.exec(svg)![1]!;
  const width = modules * px;
  const data = new Uint8ClampedArray(width * width * 4).fill(255);
  let x = 0;
  let y = 0;
  for (const [, op, a, b] of d.matchAll(/([Mmh])(-?[\d.]+)(?: (-?[\d.]+))?/g)) {
    if (op === "M") { x = Number(a); y = Math.floor(Number(b)); }
    else if (op === "m") x += Number(a);
    else {
      for (let col = x; col < x + Number(a); col++) {
        for (let dy = 0; dy < px; dy++) for (let dx = 0; dx < px; dx++) data.fill(0, ((y * px + dy) * width + col * px + dx) * 4, ((y * px + dy) * width + col * px + dx) * 4 + 3);
      }
      x += Number(a);
    }
  }
  return { width, height: width, data };
}
