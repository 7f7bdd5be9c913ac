import ZXing from "@zxing/library";
import jsQR from "jsqr";
import { PNG } from "pngjs";
import QRCode from "qrcode";
import { describe, expect, it } from "vitest";
import { readableMask } from "@/server/floor/qr-readable";

// ZXing (the decoder in the floor phones, via @zxing/browser) and jsQR read the PNGs,
// rendered by the `qrcode` package exactly as the label route renders them.
const urls = Array.from({ length: 60 }, (_, i) => `https://kirinoha.example/lots/P26-${String(i + 1).padStart(4, "0")}`);

async function reads(text: string, mask?: number, scale = 8) {
  const png = PNG.sync.read(await QRCode.toBuffer(text, { errorCorrectionLevel: "Q", margin: 4, scale, ...(mask === undefined ? {} : { maskPattern: mask as never }) }));
  const lum = new Uint8ClampedArray(png.width * png.height);
  for (let i = 0; i < lum.length; i++) lum[i] = png.data[i * 4]!;
  let zxing = false;
  try {
    zxing = new ZXing.QRCodeReader().decode(new ZXing.BinaryBitmap(new ZXing.HybridBinarizer(new ZXing.RGBLuminanceSource(lum, png.width, png.height)))).getText() === text;
  } catch {
    zxing = false;
  }
  return { zxing, jsqr: jsQR(new Uint8ClampedArray(png.data), png.width, png.height)?.data === text };
}

describe("labels the floor's decoder can read", () => {
  it("the encoder's first choice of mask is not always read by ZXing (why the read-back exists)", async () => {
    const results = await Promise.all(urls.map((u) => reads(u)));
    expect(results.every((r) => r.jsqr)).toBe(true);
    expect(results.filter((r) => !r.zxing).length).toBeGreaterThan(0);
  });

  it("with the chosen mask every label reads in both decoders", async () => {
    for (const url of urls) {
      const mask = readableMask(url, "Q");
      for (const scale of [4, 7, 8, 10]) expect(await reads(url, mask, scale), `${url} at ${scale} px`).toEqual({ zxing: true, jsqr: true });
    }
  });
});
