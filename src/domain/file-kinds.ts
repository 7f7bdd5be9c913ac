/**
 * The files a lot or an event may carry: inspection certificates and lab reports, as
 * PDF or a scanned or photographed page. The kind is what the bytes say (sniffed on the
 * server), never the name or what the browser claimed.
 */
export const ATTACHMENT_KINDS = {
  "application/pdf": { kind: "pdf", extensions: ["pdf"] },
  "image/jpeg": { kind: "jpeg", extensions: ["jpg", "jpeg"] },
  "image/png": { kind: "png", extensions: ["png"] },
} as const;
export type AttachmentType = keyof typeof ATTACHMENT_KINDS;
export type AttachmentKind = (typeof ATTACHMENT_KINDS)[AttachmentType]["kind"];

/** 10 MiB: a multi-page scan at 300 dpi fits; a phone video does not. */
export const MAX_ATTACHMENT_BYTES = 10 * 1024 * 1024;
export const MAX_TITLE_LENGTH = 200;
/** What the file input offers; the server decides by content regardless. */
export const ACCEPT_ATTRIBUTE = ".pdf,.jpg,.jpeg,.png";

export function isAttachmentType(mime: string | undefined): mime is AttachmentType {
  return mime !== undefined && Object.hasOwn(ATTACHMENT_KINDS, mime);
}

export function kindOf(mime: string): AttachmentKind | null {
  return isAttachmentType(mime) ? ATTACHMENT_KINDS[mime].kind : null;
}

const MAX_NAME_LENGTH = 150;
// C0 and C1 controls and DEL (Unicode Cc), and format characters such as the bidi
// overrides (Unicode Cf) that make "cert\u202Egnp.exe" read as "certexe.png".
const INVISIBLE = /[\p{Cc}\p{Cf}]/gu;

/**
 * A file name safe to store and to hand back: the last path segment only (browsers and
 * old clients send "C:\\scans\\cert.pdf"), no control or bidi characters, no leading dots,
 * at most 150 characters, and ending in an extension that matches the sniffed type.
 */
export function safeFileName(name: string, mime: AttachmentType): string {
  const last = name.split(/[/\\]/).pop() ?? "";
  let clean = last.replace(INVISIBLE, "").trim().replace(/^\.+/, "").trim();
  const { extensions } = ATTACHMENT_KINDS[mime];
  const ext = clean.includes(".") ? clean.slice(clean.lastIndexOf(".") + 1).toLowerCase() : "";
  if (!(extensions as readonly string[]).includes(ext)) clean = `${clean || "attachment"}.${extensions[0]}`;
  const chars = [...clean];
  if (chars.length <= MAX_NAME_LENGTH) return clean;
  const suffix = clean.slice(clean.lastIndexOf("."));
  return chars.slice(0, MAX_NAME_LENGTH - suffix.length).join("") + suffix;
}

/**
 * RFC 8187 (formerly RFC 5987) ext-value: UTF-8 percent-encoded, leaving only attr-char
 * (ALPHA / DIGIT / "!#$&+-.^_`|~") as they are. encodeURIComponent also leaves *'() alone,
 * which attr-char does not allow.
 */
export function encodeExtValue(value: string): string {
  return encodeURIComponent(value).replace(/[*'()]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
}

/** RFC 6266 §4.1: a download, named with filename* so that any script survives. */
export function contentDisposition(fileName: string, mime: AttachmentType): string {
  return `attachment; filename*=UTF-8''${encodeExtValue(safeFileName(fileName, mime))}`;
}

/** A size as people read it: bytes, then KB and MB in binary steps (1 KB = 1024 bytes). */
export function readableSize(bytes: number): { value: number; unit: "B" | "KB" | "MB" } {
  if (bytes < 1024) return { value: bytes, unit: "B" };
  if (bytes < 1024 * 1024) return { value: Math.round((bytes / 1024) * 10) / 10, unit: "KB" };
  return { value: Math.round((bytes / (1024 * 1024)) * 10) / 10, unit: "MB" };
}
