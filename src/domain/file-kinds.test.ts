import { describe, expect, it } from "vitest";
import { contentDisposition, encodeExtValue, isAttachmentType, kindOf, readableSize, safeFileName, MAX_ATTACHMENT_BYTES } from "./file-kinds";

describe("accepted types", () => {
  it("are PDF, JPEG and PNG by their IANA media types", () => {
    // IANA media types registry: application/pdf (RFC 8118), image/jpeg, image/png.
    expect(kindOf("application/pdf")).toBe("pdf");
    expect(kindOf("image/jpeg")).toBe("jpeg");
    expect(kindOf("image/png")).toBe("png");
    for (const other of ["text/html", "image/svg+xml", "image/gif", "image/apng", "toString", "__proto__"]) expect(isAttachmentType(other), other).toBe(false);
  });

  it("stop at 10 MiB", () => {
    expect(MAX_ATTACHMENT_BYTES).toBe(10_485_760);
  });
});

describe("safeFileName", () => {
  it("keeps only the last path segment", () => {
    expect(safeFileName("C:\\scans\\2026\\cert.pdf", "application/pdf")).toBe("cert.pdf");
    expect(safeFileName("../../etc/passwd.png", "image/png")).toBe("passwd.png");
  });

  it("drops control, DEL and bidi characters and leading dots", () => {
    expect(safeFileName("lab\r\nreport\u0000\u007f.pdf", "application/pdf")).toBe("labreport.pdf");
    // U+202E RIGHT-TO-LEFT OVERRIDE (Unicode bidi class RLO) would show "certgnp.exe" reversed.
    expect(safeFileName("cert\u202Egnp.png", "image/png")).toBe("certgnp.png");
    expect(safeFileName(".htaccess.png", "image/png")).toBe("htaccess.png");
  });

  it("gives the sniffed type's extension when the name lacks it", () => {
    expect(safeFileName("scan.JPG", "image/jpeg")).toBe("scan.JPG");
    expect(safeFileName("cert.png", "application/pdf")).toBe("cert.png.pdf");
    expect(safeFileName("..", "image/png")).toBe("attachment.png");
    expect(safeFileName("", "image/jpeg")).toBe("attachment.jpg");
  });

  it("shortens long names to 150 characters, keeping the extension", () => {
    const name = safeFileName(`${"稲".repeat(300)}.pdf`, "application/pdf");
    expect([...name].length).toBe(150);
    expect(name.endsWith("稲.pdf")).toBe(true);
  });
});

describe("Content-Disposition", () => {
  it("encodes as RFC 6266 §5's example does", () => {
    // RFC 6266 §5: attachment; filename*= UTF-8''%e2%82%ac%20rates (hex case is not significant, RFC 3986 §2.1).
    expect(encodeExtValue("€ rates").toLowerCase()).toBe("%e2%82%ac%20rates");
  });

  it("leaves only RFC 8187 attr-char unencoded", () => {
    const encoded = encodeExtValue("a*b'c(d)e !#$&+-.^_`|~\"; ,");
    expect(encoded).toBe("a%2Ab%27c%28d%29e%20!%23%24%26%2B-.%5E_%60%7C~%22%3B%20%2C");
    expect(encoded).toMatch(/^[A-Za-z0-9!#$&+\-.^_`|~%]+$/);
  });

  it("names the download from the cleaned name", () => {
    expect(contentDisposition("検査証明書 2026.pdf", "application/pdf")).toBe(
      "attachment; filename*=UTF-8''%E6%A4%9C%E6%9F%BB%E8%A8%BC%E6%98%8E%E6%9B%B8%202026.pdf",
    );
    expect(contentDisposition("a\r\nSet-Cookie: x=1.png", "image/png")).toBe("attachment; filename*=UTF-8''aSet-Cookie%3A%20x%3D1.png");
  });
});

describe("readableSize", () => {
  it("steps at 1024", () => {
    expect(readableSize(1023)).toEqual({ value: 1023, unit: "B" });
    expect(readableSize(1536)).toEqual({ value: 1.5, unit: "KB" });
    expect(readableSize(MAX_ATTACHMENT_BYTES)).toEqual({ value: 10, unit: "MB" });
  });
});
