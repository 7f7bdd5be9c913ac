import { PNG } from "pngjs";

/**
 * A YUV4MPEG2 (Y4M) video made from one PNG, for Chromium's fake camera
 * (`--use-file-for-fake-video-capture`). The picture is placed centred on a white canvas,
 * alpha composited over white, converted with the BT.601 full-range matrix of JFIF
 * (ITU-T T.871 §7) and its chroma averaged over 2 × 2 blocks (4:2:0, "C420jpeg": chroma
 * sited between the luma samples, as JPEG does).
 */
export type Y4mOptions = { width?: number; height?: number; frames?: number; fps?: number };

export function y4mHeader(width: number, height: number, fps: number): string {
  return `YUV4MPEG2 W${width} H${height} F${fps}:1 Ip A1:1 C420jpeg\n`;
}

const clampByte = (v: number) => Math.max(0, Math.min(255, Math.round(v)));

/** ITU-T T.871 §7: Y, Cb, Cr from 8-bit R, G, B, full range. */
export function rgbToYcbcr(r: number, g: number, b: number): [number, number, number] {
  return [
    clampByte(0.299 * r + 0.587 * g + 0.114 * b),
    clampByte(128 - 0.168736 * r - 0.331264 * g + 0.5 * b),
    clampByte(128 + 0.5 * r - 0.418688 * g - 0.081312 * b),
  ];
}

const even = (n: number) => n + (n % 2);

/** The PNG centred on white, as RGB rows; the canvas grows (to even sizes) if the PNG is larger. */
function placeOnWhite(png: PNG, width: number, height: number): Uint8Array {
  const rgb = new Uint8Array(width * height * 3).fill(255);
  const left = Math.floor((width - png.width) / 2);
  const top = Math.floor((height - png.height) / 2);
  for (let y = 0; y < png.height; y++) {
    for (let x = 0; x < png.width; x++) {
      const from = (y * png.width + x) * 4;
      const to = ((top + y) * width + left + x) * 3;
      const alpha = png.data[from + 3]! / 255;
      for (let c = 0; c < 3; c++) rgb[to + c] = Math.round(png.data[from + c]! * alpha + 255 * (1 - alpha));
    }
  }
  return rgb;
}

/** One 4:2:0 frame: the Y plane, then Cb and Cr each at half width and half height. */
export function frameFromRgb(rgb: Uint8Array, width: number, height: number): Buffer {
  const y = Buffer.alloc(width * height);
  const cb = new Float64Array(width * height);
  const cr = new Float64Array(width * height);
  for (let i = 0; i < width * height; i++) {
    const [Y, U, V] = rgbToYcbcr(rgb[i * 3]!, rgb[i * 3 + 1]!, rgb[i * 3 + 2]!);
    y[i] = Y;
    cb[i] = U;
    cr[i] = V;
  }
  const cw = width / 2;
  const ch = height / 2;
  const u = Buffer.alloc(cw * ch);
  const v = Buffer.alloc(cw * ch);
  for (let row = 0; row < ch; row++) {
    for (let col = 0; col < cw; col++) {
      const at = [2 * row * width + 2 * col, 2 * row * width + 2 * col + 1, (2 * row + 1) * width + 2 * col, (2 * row + 1) * width + 2 * col + 1];
      u[row * cw + col] = clampByte(at.reduce((s, i) => s + cb[i]!, 0) / 4);
      v[row * cw + col] = clampByte(at.reduce((s, i) => s + cr[i]!, 0) / 4);
    }
  }
  return Buffer.concat([y, u, v]);
}

export function y4mFromPng(pngBytes: Buffer, options: Y4mOptions = {}): Buffer {
  const png = PNG.sync.read(pngBytes);
  const width = Math.max(options.width ?? 640, even(png.width));
  const height = Math.max(options.height ?? 480, even(png.height));
  if (width % 2 || height % 2) throw new RangeError("4:2:0 needs an even width and height");
  const frame = frameFromRgb(placeOnWhite(png, width, height), width, height);
  const parts: Buffer[] = [Buffer.from(y4mHeader(width, height, options.fps ?? 10), "ascii")];
  for (let n = 0; n < (options.frames ?? 1); n++) parts.push(Buffer.from("FRAME\n", "ascii"), frame);
  return Buffer.concat(parts);
}
