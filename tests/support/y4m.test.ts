import jsQR from "jsqr";
import { PNG } from "pngjs";
import QRCode from "qrcode";
import { describe, expect, it } from "vitest";
import { rgbToYcbcr, y4mFromPng, y4mHeader } from "./y4m";

function solidPng(width: number, height: number, rgba: [number, number, number, number]): Buffer {
  const png = new PNG({ width, height });
  for (let i = 0; i < width * height; i++) png.data.set(rgba, i * 4);
  return PNG.sync.write(png);
}

/** Splits a Y4M into its header line and frames (YUV4MPEG2: "FRAME\n" before each). */
function parseY4m(bytes: Buffer) {
  const headerEnd = bytes.indexOf(0x0a) + 1;
  const header = bytes.subarray(0, headerEnd).toString("ascii");
  const width = Number(/ W(\d+)/.exec(header)![1]);
  const height = Number(/ H(\d+)/.exec(header)![1]);
  const frameBytes = width * height * 1.5;
  const frames: Buffer[] = [];
  for (let at = headerEnd; at < bytes.length; at += 6 + frameBytes) {
    expect(bytes.subarray(at, at + 6).toString("ascii")).toBe("FRAME\n");
    frames.push(bytes.subarray(at + 6, at + 6 + frameBytes));
  }
  return { header, width, height, frames };
}

describe("Y4M from a PNG", () => {
  it("writes the YUV4MPEG2 header line and w·h·1.5 bytes per frame after each FRAME line", () => {
    const y4m = y4mFromPng(solidPng(10, 10, [0, 0, 0, 255]), { frames: 3, fps: 15 });
    const header = y4mHeader(640, 480, 15);
    expect(header).toBe("YUV4MPEG2 W640 H480 F15:1 Ip A1:1 C420jpeg\n");
    expect(y4m.subarray(0, header.length).toString("ascii")).toBe(header);
    expect(y4m.length).toBe(header.length + 3 * ("FRAME\n".length + 640 * 480 * 1.5));
    expect(parseY4m(y4m).frames).toHaveLength(3);
  });

  it("converts with the JFIF matrix (ITU-T T.871 §7): white 255/128/128, black 0/128/128, red 76/85/255", () => {
    expect(rgbToYcbcr(255, 255, 255)).toEqual([255, 128, 128]);
    expect(rgbToYcbcr(0, 0, 0)).toEqual([0, 128, 128]);
    // Red: Y = 0.299·255 = 76.2; Cb = 128 − 0.168736·255 = 85.0; Cr = 128 + 127.5, clipped to 255.
    expect(rgbToYcbcr(255, 0, 0)).toEqual([76, 85, 255]);
  });

  it("centres the picture on white and subsamples chroma 2 × 2", () => {
    // A 2 × 2 red PNG on a 6 × 6 canvas lands on pixels 2–3 of rows 2–3: chroma sample (1, 1).
    const { frames } = parseY4m(y4mFromPng(solidPng(2, 2, [255, 0, 0, 255]), { width: 6, height: 6 }));
    const frame = frames[0]!;
    const lumaAt = (x: number, y: number) => frame[y * 6 + x];
    expect([lumaAt(2, 2), lumaAt(3, 3), lumaAt(1, 2), lumaAt(4, 3)]).toEqual([76, 76, 255, 255]);
    const u = frame.subarray(36, 45);
    const v = frame.subarray(45, 54);
    expect([u[4], v[4]]).toEqual([85, 255]);
    expect([u[0], v[0], u[8], v[8]]).toEqual([128, 128, 128, 128]);
  });

  it("composites transparency over white and grows the canvas to even sizes for a larger PNG", () => {
    const { width, height, frames } = parseY4m(y4mFromPng(solidPng(641, 3, [0, 0, 0, 0])));
    expect([width, height]).toEqual([642, 480]);
    expect(frames[0]!.subarray(0, width * height).every((b) => b === 255)).toBe(true);
  });

  it("keeps a QR code readable: jsQR (an independent decoder) reads the luma plane back", async () => {
    const text = "http://localhost:3210/lots/P26-0003";
    const png = await QRCode.toBuffer(text, { type: "png", errorCorrectionLevel: "Q", margin: 4, scale: 10 });
    const { width, height, frames } = parseY4m(y4mFromPng(png));
    const grey = new Uint8ClampedArray(width * height * 4);
    for (let i = 0; i < width * height; i++) grey.set([frames[0]![i]!, frames[0]![i]!, frames[0]![i]!, 255], i * 4);
    expect(jsQR(grey, width, height)?.data).toBe(text);
  });
});
