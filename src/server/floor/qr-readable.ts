import "server-only";
import ZXing from "@zxing/library";
import jsQR from "jsqr";
import QRCode from "qrcode";

type Level = "L" | "M" | "Q" | "H";
export type QrMask = 0 | 1 | 2 | 3 | 4 | 5 | 6 | 7;

const QUIET = 4;
// A camera sees a label at any size: the read-back tries a spread of pixels per module.
const SCALES = [3, 4, 5, 6, 8, 10, 12];

/** Renders a symbol's modules to 8-bit luminance with a 4-module quiet zone. */
function luminance(text: string, level: Level, mask: QrMask | undefined, PIXELS: number) {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: level, ...(mask === undefined ? {} : { maskPattern: mask }) });
  const side = (modules.size + 2 * QUIET) * PIXELS;
  const lum = new Uint8ClampedArray(side * side).fill(255);
  for (let r = 0; r < modules.size; r++) {
    for (let c = 0; c < modules.size; c++) {
      if (!modules.get(r, c)) continue;
      for (let y = 0; y < PIXELS; y++) lum.fill(0, ((r + QUIET) * PIXELS + y) * side + (c + QUIET) * PIXELS, ((r + QUIET) * PIXELS + y) * side + (c + QUIET + 1) * PIXELS);
    }
  }
  return { lum, side };
}

function readsWithZxing(lum: Uint8ClampedArray, side: number, text: string): boolean {
  try {
    const bitmap = new ZXing.BinaryBitmap(new ZXing.HybridBinarizer(new ZXing.RGBLuminanceSource(lum, side, side)));
    return new ZXing.QRCodeReader().decode(bitmap).getText() === text;
  } catch {
    return false;
  }
}

function readsWithJsQr(lum: Uint8ClampedArray, side: number, text: string): boolean {
  const rgba = new Uint8ClampedArray(side * side * 4);
  for (let i = 0; i < lum.length; i++) rgba.fill(lum[i]!, i * 4, i * 4 + 3), (rgba[i * 4 + 3] = 255);
  return jsQR(rgba, side, side)?.data === text;
}

const cache = new Map<string, QrMask | undefined>();

/**
 * The mask pattern to print with. The encoder's own choice (lowest ISO/IEC 18004 penalty)
 * comes first, but ZXing-js 0.23, the decoder in the floor phones, fails on some symbols:
 * measured on 60 of our label URLs, 16 of the encoder's first choices were not read; mask
 * pattern 2 was never read at any size, mask 1 not at some sizes. So each symbol is read
 * back by ZXing at several sizes (and by jsQR) before it is printed, trying the other masks
 * until it reads.
 */
export function readableMask(text: string, level: Level): QrMask | undefined {
  const key = `${level}:${text}`;
  if (cache.has(key)) return cache.get(key);
  const candidates: (QrMask | undefined)[] = [undefined, 0, 1, 2, 3, 4, 5, 6, 7];
  const chosen = candidates.find((mask) =>
    SCALES.every((scale, n) => {
      const { lum, side } = luminance(text, level, mask, scale);
      return readsWithZxing(lum, side, text) && (n > 0 || readsWithJsQr(lum, side, text));
    }),
  );
  if (cache.size > 5000) cache.clear();
  cache.set(key, chosen);
  return chosen;
}
