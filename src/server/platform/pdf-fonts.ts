import "server-only";
import { readFileSync } from "node:fs";
import path from "node:path";
import fontkit from "@pdf-lib/fontkit";
import type { PDFDocument, PDFFont } from "pdf-lib";

/**
 * BIZ UDPGothic (SIL Open Font License 1.1; fonts/README.md), read from the installed npm
 * package: it covers Japanese and Latin, so English and Japanese documents use the same face.
 * Resolved from the working directory (the app's root under `npm start`, `next start` and
 * Vitest) rather than through the bundler, which would try to inline 4.5 MB files.
 */
const PACKAGE = path.join("node_modules", "@expo-google-fonts", "biz-udpgothic");
const FILES = { regular: "400Regular/BIZUDPGothic_400Regular.ttf", bold: "700Bold/BIZUDPGothic_700Bold.ttf" } as const;
type Weight = keyof typeof FILES;

const bytes = new Map<Weight, Uint8Array>();

/** The font file's bytes, read once per process. */
function fontBytes(weight: Weight): Uint8Array {
  let found = bytes.get(weight);
  if (!found) bytes.set(weight, (found = readFileSync(path.join(process.cwd(), PACKAGE, FILES[weight]))));
  return found;
}

/**
 * fontkit with its parsed fonts kept: parsing a 4.5 MB face costs more than the rest of a PDF,
 * and pdf-lib asks for it anew on every embed. Each PDF still makes its own subset of it.
 */
const parsed = new WeakMap<Uint8Array, ReturnType<typeof fontkit.create>>();
const keepingFontkit: typeof fontkit = {
  ...fontkit,
  create(data, postscriptName) {
    let font = parsed.get(data);
    if (!font) parsed.set(data, (font = fontkit.create(data, postscriptName)));
    return font;
  },
};

export type DocumentFonts = { regular: PDFFont; bold: PDFFont };

/** Embeds both weights, subset: the PDF carries only the glyphs it draws. */
export async function embedDocumentFonts(pdf: PDFDocument): Promise<DocumentFonts> {
  pdf.registerFontkit(keepingFontkit);
  const [regular, bold] = await Promise.all([
    pdf.embedFont(fontBytes("regular"), { subset: true }),
    pdf.embedFont(fontBytes("bold"), { subset: true }),
  ]);
  return { regular, bold };
}
