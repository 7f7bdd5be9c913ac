import { createHash, randomBytes } from "node:crypto";
import { existsSync, readdirSync, readFileSync, rmdirSync, rmSync } from "node:fs";
import path from "node:path";
import { PNG } from "pngjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getAttachment } from "../../app/api/attachments/[id]/route";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as listRoute, POST as uploadRoute } from "../../app/api/lots/[code]/attachments/route";
import { GET as getLotEvents } from "../../app/api/lots/[code]/events/route";
import { getSqlite } from "@/server/platform/db";
import { call, jsonRequest, ORIGIN, signInAs, tableDigests } from "../support/api";

const MiB = 1024 * 1024;
const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");
const nonce = randomBytes(8).toString("hex"); // unique bytes per run: the blob folder outlives the test database
const written = new Set<string>();
const blobPath = (sha: string) => path.join(path.dirname(process.env.GRAINLINE_DB!), "files", sha.slice(0, 2), sha);

/** A real 8×8 PNG with random pixels, written by pngjs (an encoder outside the project). */
function makePng(): Buffer {
  const png = new PNG({ width: 8, height: 8 });
  randomBytes(png.data.length).copy(png.data);
  return PNG.sync.write(png);
}

/**
 * The smallest PDF that follows ISO 32000-1 §7.5: header, three objects, a cross-reference
 * table of 20-byte entries at the offsets it names, trailer and startxref.
 */
function makePdf(note = nonce): Buffer {
  const objects = ["<< /Type /Catalog /Pages 2 0 R >>", "<< /Type /Pages /Kids [3 0 R] /Count 1 >>", "<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] >>"];
  let out = `%PDF-1.4\n%${note}\n`;
  const offsets = objects.map((body, i) => {
    const at = Buffer.byteLength(out);
    out += `${i + 1} 0 obj\n${body}\nendobj\n`;
    return at;
  });
  const xref = Buffer.byteLength(out);
  out += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map((o) => `${String(o).padStart(10, "0")} 00000 n \n`).join("")}`;
  out += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(out, "latin1");
}

/** A PDF header followed by padding to exactly `size` bytes: enough for the type sniffer. */
const paddedPdf = (size: number) => Buffer.concat([Buffer.from(`%PDF-1.4\n%${nonce}\n`), Buffer.alloc(size - 27, 0x20)]).subarray(0, size);

type Parts = { file?: { bytes: Uint8Array; name: string; type?: string }; title?: string; eventId?: string };

function uploadRequest(cookie: string, code: string, parts: Parts, headers: Record<string, string> = {}) {
  const form = new FormData();
  if (parts.file) form.append("file", new File([new Uint8Array(parts.file.bytes)], parts.file.name, { type: parts.file.type ?? "application/octet-stream" }));
  if (parts.title !== undefined) form.append("title", parts.title);
  if (parts.eventId !== undefined) form.append("eventId", parts.eventId);
  return new Request(`${ORIGIN}/api/lots/${code}/attachments`, { method: "POST", body: form, headers: { host: "localhost:3000", "accept-language": "en", cookie, ...headers } });
}

async function upload(cookie: string, code: string, parts: Parts, headers: Record<string, string> = {}) {
  const res = await call(uploadRoute, uploadRequest(cookie, code, parts, headers), { code });
  if (res.status === 201) written.add(res.body.sha256);
  return res;
}

async function download(cookie: string, id: number | string) {
  const response = await getAttachment(jsonRequest(`/api/attachments/${id}`, { cookie }), { params: Promise.resolve({ id: String(id) }) });
  return { status: response.status, headers: response.headers, bytes: Buffer.from(await response.arrayBuffer()) };
}

let grower: string, grower2: string, miller: string, brewer: string, sales: string, auditor: string;
let lotCode: string, lotId: number;

beforeAll(async () => {
  grower = await signInAs("grower@example.com");
  grower2 = await signInAs("grower2@example.com");
  miller = await signInAs("miller@example.com");
  brewer = await signInAs("brewer@example.com");
  sales = await signInAs("sales@example.com");
  auditor = await signInAs("auditor@example.com");
  const body = { fieldId: "field-ikeda-terrace", variety: "Omachi", cropYear: 2026, brownKg: 480, moisturePct: 14.5, grade: "1", bags: 8 };
  lotCode = (await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body }))).body.code;
  lotId = (getSqlite().prepare("select id from lots where code = ?").get(lotCode) as { id: number }).id;
});

afterAll(() => {
  for (const sha of written) {
    rmSync(blobPath(sha), { force: true });
    try {
      rmdirSync(path.dirname(blobPath(sha))); // only when empty: another run may share the prefix
    } catch {}
  }
});

const rowsOf = (id: number) => getSqlite().prepare("select * from attachments where id = ?").get(id) as Record<string, unknown>;

describe("upload", () => {
  it("stores a PNG by its SHA-256 beside the database and records its row", async () => {
    const png = makePng();
    const res = await upload(grower, lotCode, { file: { bytes: png, name: "cert.png", type: "image/png" }, title: "Inspection certificate, grade 1" });
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ id: expect.any(Number), sha256: sha256(png), contentType: "image/png", size: png.length });
    expect(rowsOf(res.body.id)).toMatchObject({ lot_id: lotId, event_id: null, sha256: sha256(png), file_name: "cert.png", content_type: "image/png", size: png.length, title: "Inspection certificate, grade 1", user_id: "user-grower" });
    const stored = readFileSync(blobPath(res.body.sha256));
    expect(sha256(stored)).toBe(res.body.sha256);
    expect(PNG.sync.read(stored).width).toBe(8); // pngjs decodes what was stored
  });

  it("takes the type from the content: a PDF sent as text/plain is a PDF", async () => {
    const pdf = makePdf();
    expect(pdf.subarray(0, 8).toString()).toBe("%PDF-1.4");
    const res = await upload(grower, lotCode, { file: { bytes: pdf, name: "lab report.pdf", type: "text/plain" } });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ contentType: "application/pdf", size: pdf.length, sha256: sha256(pdf) });
    expect(sha256(readFileSync(blobPath(res.body.sha256)))).toBe(sha256(pdf));
  });

  it("keeps the same bytes once on disk, with a row per upload", async () => {
    const png = makePng();
    const first = await upload(grower, lotCode, { file: { bytes: png, name: "a.png" } });
    const second = await upload(grower, lotCode, { file: { bytes: png, name: "b.png" } });
    expect([first.status, second.status]).toEqual([201, 201]);
    expect(second.body.id).not.toBe(first.body.id);
    expect(getSqlite().prepare("select file_name from attachments where sha256 = ? order by id").all(sha256(png))).toEqual([{ file_name: "a.png" }, { file_name: "b.png" }]);
    // One file, and no temporary file left beside it.
    const folder = path.dirname(blobPath(sha256(png)));
    expect(readdirSync(folder).filter((name) => name.includes(sha256(png)))).toEqual([sha256(png)]);
  });

  it("links an event that touched the lot, and refuses one that did not", async () => {
    const [registering] = (await call(getLotEvents, jsonRequest(`/api/lots/${lotCode}/events`, { cookie: grower }), { code: lotCode })).body.items;
    expect(registering.step).toBe("registering");
    const ok = await upload(grower, lotCode, { file: { bytes: makePng(), name: "bags.png" }, eventId: String(registering.id) });
    expect(ok.status).toBe(201);
    expect(rowsOf(ok.body.id).event_id).toBe(registering.id);
    const other = await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body: { fieldId: "field-ikeda-cedar", variety: "Omachi", cropYear: 2026, brownKg: 60, moisturePct: 14.5, grade: "2", bags: 1 } }));
    const [elsewhere] = (await call(getLotEvents, jsonRequest(`/api/lots/${other.body.code}/events`, { cookie: grower }), { code: other.body.code })).body.items;
    const before = await tableDigests();
    const bad = await upload(grower, lotCode, { file: { bytes: makePng(), name: "x.png" }, eventId: String(elsewhere.id) });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields)).toEqual(["eventId"]);
    expect(await tableDigests()).toEqual(before);
  });
});

describe("the size limit's edge", () => {
  it("takes exactly 10 MiB", async () => {
    const res = await upload(grower, lotCode, { file: { bytes: paddedPdf(10 * MiB), name: "scan.pdf" } });
    expect(res.status).toBe(201);
    expect(res.body.size).toBe(10_485_760);
  });
});

describe("refused uploads change nothing", () => {
  let before: Record<string, string>;
  beforeAll(async () => {
    before = await tableDigests();
  });
  const expectUnchanged = async () => expect(await tableDigests()).toEqual(before);

  it("answers 422 on file for HTML or SVG named .png, whatever the client claims", async () => {
    const html = Buffer.from(`<!doctype html><html><body><script>alert(document.cookie)</script>${nonce}</body></html>`);
    const svg = Buffer.from(`<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script><!--${nonce}--></svg>`);
    for (const bytes of [html, svg]) {
      const res = await upload(grower, lotCode, { file: { bytes, name: "cert.png", type: "image/png" } });
      expect(res.status).toBe(422);
      expect(res.body.error.code).toBe("invalid");
      expect(res.body.error.fields.file).toHaveLength(1);
      expect(existsSync(blobPath(sha256(bytes)))).toBe(false);
    }
    await expectUnchanged();
  });

  it("answers 422 for an empty file, a missing file and a title over 200 characters", async () => {
    const empty = await upload(grower, lotCode, { file: { bytes: new Uint8Array(), name: "cert.pdf" } });
    expect(empty.status).toBe(422);
    expect(empty.body.error.fields.file).toEqual(["The file is empty."]);
    const missing = await upload(grower, lotCode, { title: "no file" });
    expect(missing.body.error.fields.file).toEqual(["This is required."]);
    const long = await upload(grower, lotCode, { file: { bytes: makePng(), name: "c.png" }, title: "x".repeat(201) });
    expect(long.status).toBe(422);
    expect(long.body.error.fields).toEqual({ title: ["Use at most 200 characters."] });
    const json = await call(uploadRoute, jsonRequest(`/api/lots/${lotCode}/attachments`, { cookie: grower, body: { file: "x" } }), { code: lotCode });
    expect(json.status).toBe(422);
    await expectUnchanged();
  });

  it("answers 413 too_large past 10 MiB: by size, by declared length, mid-stream", async () => {
    const tooLarge = { code: "too_large", message: expect.stringContaining("10 MB") };
    const eleven = await upload(grower, lotCode, { file: { bytes: paddedPdf(11 * MiB), name: "scan.pdf" } });
    expect(eleven.status).toBe(413);
    expect(eleven.body).toEqual({ error: tooLarge });
    const justOver = await upload(grower, lotCode, { file: { bytes: paddedPdf(10 * MiB + 1), name: "scan.pdf" } });
    expect(justOver.status).toBe(413);
    // A declared Content-Length over the limit is refused before the body is read.
    const declared = await call(uploadRoute, uploadRequest(grower, lotCode, { file: { bytes: makePng(), name: "a.png" } }, { "content-length": String(11 * MiB) }), { code: lotCode });
    expect(declared).toMatchObject({ status: 413, body: { error: tooLarge } });
    await expectUnchanged();
  });

  it("stops reading a 40 MiB body soon after the limit", async () => {
    let sent = 0;
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (sent >= 40 * MiB) return controller.close();
        sent += MiB;
        controller.enqueue(new Uint8Array(MiB));
      },
    });
    const request = new Request(`${ORIGIN}/api/lots/${lotCode}/attachments`, {
      method: "POST",
      body,
      headers: { host: "localhost:3000", cookie: grower, "content-type": "multipart/form-data; boundary=x" },
      duplex: "half",
    } as RequestInit);
    const res = await call(uploadRoute, request, { code: lotCode });
    expect(res.status).toBe(413);
    // 10 MiB plus the 64 KiB allowed for the form around it, plus what was already queued.
    expect(sent).toBeLessThanOrEqual(13 * MiB);
    await expectUnchanged();
  });
});

describe("who may upload and download", () => {
  let pngId: number;
  beforeAll(async () => {
    pngId = (await upload(grower, lotCode, { file: { bytes: makePng(), name: "grade.png" } })).body.id;
  });

  it("hides another grower's lot and its files: 404 for upload, list and download", async () => {
    const before = await tableDigests();
    expect((await upload(grower2, lotCode, { file: { bytes: makePng(), name: "x.png" } })).status).toBe(404);
    expect((await call(listRoute, jsonRequest(`/api/lots/${lotCode}/attachments`, { cookie: grower2 }), { code: lotCode })).status).toBe(404);
    expect((await download(grower2, pngId)).status).toBe(404);
    expect(await tableDigests()).toEqual(before);
  });

  it("lets sales and auditors read but never upload (403)", async () => {
    for (const cookie of [sales, auditor]) {
      expect((await upload(cookie, lotCode, { file: { bytes: makePng(), name: "x.png" } })).status).toBe(403);
      expect((await download(cookie, pngId)).status).toBe(200);
    }
  });

  it("after delivery: the mill (holder) and the grower (origin) may upload, the brewer may not", async () => {
    await call(postEvent, jsonRequest("/api/events", { cookie: grower, body: { step: "shipping", inputs: [{ lot: lotCode, quantity: 480 }], counterpartyId: "mill-shirotae", referenceDoc: "DS-ATT-1" } }));
    const received = await call(postEvent, jsonRequest("/api/events", { cookie: miller, body: { step: "receiving", inputs: [{ lot: lotCode, quantity: 480 }] } }));
    expect(received.status).toBe(201);
    expect((await upload(miller, lotCode, { file: { bytes: makePdf(`${nonce}-mill`), name: "moisture.pdf" } })).status).toBe(201);
    expect((await upload(grower, lotCode, { file: { bytes: makePdf(`${nonce}-grower`), name: "certificate.pdf" } })).status).toBe(201);
    expect((await upload(brewer, lotCode, { file: { bytes: makePng(), name: "x.png" } })).status).toBe(403);
  });

  it("at the brewery: the brewer may upload to a lot the brewery holds, sales still may not", async () => {
    const run = await call(postEvent, jsonRequest("/api/events", { cookie: miller, body: { step: "polishing", inputs: [{ lot: lotCode, quantity: 480 }], outputs: [{ kind: "polished", quantity: 336 }], measurements: [{ name: "targetPolishingRatioPct", value: 70, unit: "%" }] } }));
    expect(run.status).toBe(201);
    const polished = run.body.outputs[0].code;
    await call(postEvent, jsonRequest("/api/events", { cookie: miller, body: { step: "shipping", inputs: [{ lot: polished, quantity: 336 }], counterpartyId: "brewery-kirinoha", referenceDoc: "SH-ATT-1" } }));
    const receipt = await call(postEvent, jsonRequest("/api/events", { cookie: brewer, body: { step: "receiving", inputs: [{ lot: polished, quantity: 336 }] } }));
    expect(receipt.status).toBe(201);
    // Sales belongs to the brewery that now holds the lot, yet only reads.
    expect((await upload(sales, polished, { file: { bytes: makePng(), name: "x.png" } })).status).toBe(403);
    expect((await upload(brewer, polished, { file: { bytes: makePdf(`${nonce}-brewery`), name: "analysis.pdf" } })).status).toBe(201);
    expect((await upload(grower, polished, { file: { bytes: makePng(), name: "x.png" } })).status).toBe(404);
  });

  it("refuses the signed-out (401) and cross-site posts (403)", async () => {
    expect((await upload("", lotCode, { file: { bytes: makePng(), name: "x.png" } })).status).toBe(401);
    expect((await download("", pngId)).status).toBe(401);
    expect((await upload(grower, lotCode, { file: { bytes: makePng(), name: "x.png" } }, { origin: "https://elsewhere.example" })).status).toBe(403);
  });

  it("answers 404 for ids that are not attachments", async () => {
    for (const id of ["999999", "abc", "0", "1e3"]) expect((await download(grower, id)).status, id).toBe(404);
  });
});

describe("download", () => {
  it("sends the stored bytes with the sniffed type as a named attachment", async () => {
    const png = makePng();
    // The client says PDF; the bytes are PNG.
    const { body } = await upload(grower, lotCode, { file: { bytes: png, name: "検査 証明書.png", type: "application/pdf" } });
    const res = await download(sales, body.id);
    expect(res.status).toBe(200);
    expect(sha256(res.bytes)).toBe(sha256(png));
    expect(res.headers.get("content-type")).toBe("image/png");
    // Encoding cross-checked with Python: urllib.parse.quote("検査 証明書.png").
    expect(res.headers.get("content-disposition")).toBe("attachment; filename*=UTF-8''%E6%A4%9C%E6%9F%BB%20%E8%A8%BC%E6%98%8E%E6%9B%B8.png");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("cache-control")).toBe("private");
  });

  it("strips path parts and control characters from the name", async () => {
    const { body } = await upload(grower, lotCode, { file: { bytes: makePdf(`${nonce}-path`), name: "C:\\fakepath\\..\\lab\r\n\"report\".pdf" } });
    expect(rowsOf(body.id).file_name).toBe('lab"report".pdf');
    expect((await download(grower, body.id)).headers.get("content-disposition")).toBe("attachment; filename*=UTF-8''lab%22report%22.pdf");
  });
});

describe("listing", () => {
  it("gives the lot's attachments newest first, with who and where to download", async () => {
    const res = await call(listRoute, jsonRequest(`/api/lots/${lotCode}/attachments`, { cookie: auditor }), { code: lotCode });
    expect(res.status).toBe(200);
    const count = (getSqlite().prepare("select count(*) as n from attachments where lot_id = ?").get(lotId) as { n: number }).n;
    expect(res.body.items).toHaveLength(count);
    const newest = res.body.items[0];
    expect(newest).toMatchObject({ fileName: 'lab"report".pdf', contentType: "application/pdf", kind: "pdf", userName: "Ikeda Haruto", href: `/api/attachments/${newest.id}` });
    const ids = res.body.items.map((i: { id: number }) => i.id);
    expect(ids).toEqual([...ids].sort((a, b) => b - a));
    const first = res.body.items.at(-1);
    expect(first).toMatchObject({ fileName: "cert.png", title: "Inspection certificate, grade 1", kind: "png" });
  });
});
