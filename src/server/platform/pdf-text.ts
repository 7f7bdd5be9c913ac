import "server-only";
import type { PDFFont } from "pdf-lib";

/**
 * Line-breaking rules for Japanese (kinsoku shori): characters that may not start a line —
 * closing brackets, 、。 and other punctuation, small kana, the prolonged sound mark,
 * iteration marks — and those that may not end one (opening brackets). Source: W3C
 * "Requirements for Japanese Text Layout" (JLREQ) §3.1.7 and Appendix A (character classes
 * cl-02, cl-04, cl-05, cl-06, cl-07, cl-09, cl-11 / cl-01), after JIS X 4051. ASCII closing
 * punctuation is added so that Latin text does not break before "," or ")" either.
 */
const NO_START = new Set([..."、。，．・：；？！‼⁇⁈⁉ー―‐゠–〜～）」』】〕〉》〙〗〟］｝’”»ヽヾゝゞ々〻ぁぃぅぇぉっゃゅょゎゕゖァィゥェォッャュョヮヵヶㇰㇱㇲㇳㇴㇵㇶㇷㇸㇹㇺㇻㇼㇽㇾㇿ％,.:;?!)]}%"]);
const NO_END = new Set([..."（「『【〔〈《〘〖〝［｛‘“«([{"]);
/** Kana, kanji and full-width forms: a line may break between two words of these with no space. */
const CJK = /[\p{Script=Han}\p{Script=Hiragana}\p{Script=Katakana}\u3000-\u303f\uff00-\uffef]/u;

const words = new Intl.Segmenter("ja", { granularity: "word" });

const last = (s: string) => [...s].at(-1) ?? "";
const first = (s: string) => [...s][0] ?? "";

/** May a line break fall between `before` and `after` (two adjacent word segments)? */
function mayBreak(before: string, after: string): boolean {
  if (NO_START.has(first(after)) || NO_END.has(last(before.trimEnd()))) return false;
  if (/\s$/.test(before)) return true;
  // Latin breaks only at spaces; Japanese between words (ICU's dictionary finds them).
  return CJK.test(last(before)) || CJK.test(first(after));
}

/**
 * `text` cut where a line may break: each piece keeps the spaces after it, so the pieces
 * joined give the text back.
 */
export function breakUnits(text: string): string[] {
  const units: string[] = [];
  for (const { segment } of words.segment(text)) {
    const previous = units.at(-1);
    if (previous === undefined || (!/^\s+$/.test(segment) && mayBreak(previous, segment))) units.push(segment);
    else units[units.length - 1] = previous + segment;
  }
  return units;
}

/**
 * Widths of the pieces lines are made of, per font and size. Laying text out (fontkit shapes it
 * with the font's tables) is the slow part of a PDF with a Japanese face; a row's width is
 * taken as the sum of its pieces' (kerning between two pieces is ignored). Bounded per font.
 */
const widths = new WeakMap<PDFFont, Map<string, number>>();
function widthOf(font: PDFFont, size: number, s: string): number {
  let known = widths.get(font);
  if (!known) widths.set(font, (known = new Map()));
  const key = `${size}|${s}`;
  let w = known.get(key);
  if (w === undefined) {
    if (known.size > 10_000) known.clear();
    known.set(key, (w = font.widthOfTextAtSize(s, size)));
  }
  return w;
}

/**
 * `text` in rows no wider than `width` at this font and size, broken where breakUnits allows;
 * a piece wider than a whole row is cut by characters. Spaces at the end of a row are dropped.
 */
export function wrapText(text: string, font: PDFFont, size: number, width: number): string[] {
  const rows: string[] = [];
  let row = "";
  let rowWidth = 0;
  const add = (piece: string) => {
    row += piece;
    rowWidth += widthOf(font, size, piece);
  };
  const startRow = () => {
    if (row) rows.push(row);
    row = "";
    rowWidth = 0;
  };
  // Trailing spaces do not count against the width: they are dropped at the break.
  const fits = (piece: string) => rowWidth + widthOf(font, size, piece.trimEnd()) <= width;
  for (const unit of breakUnits(text)) {
    if (fits(unit)) add(unit);
    else if (widthOf(font, size, unit.trimEnd()) <= width) {
      startRow();
      add(unit);
    } else {
      for (const char of unit) {
        if (row && !fits(char)) startRow();
        add(char);
      }
    }
  }
  return [...rows, row].map((r) => r.trimEnd());
}
