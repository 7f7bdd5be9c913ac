// For the catalogue tests only (catalogue-parity, glossary, the e2e raw-key check): reads the JSON
// files as the translators wrote them and walks ICU MessageFormat with FormatJS's own parser.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { parse, TYPE, type MessageFormatElement } from "@formatjs/icu-messageformat-parser";

const DIR = path.join(import.meta.dirname, "messages");

export const catalogueFiles = (): string[] => readdirSync(path.join(DIR, "en")).filter((f) => f.endsWith(".json")).sort();

export function readCatalogue(locale: string, file: string): unknown {
  return JSON.parse(readFileSync(path.join(DIR, locale, file), "utf8"));
}

/** Every leaf as "a.b.c" → its value (next-intl reads dots as nesting). */
export function flatten(tree: unknown, at = "", out = new Map<string, unknown>()): Map<string, unknown> {
  if (tree && typeof tree === "object" && !Array.isArray(tree)) {
    for (const [key, value] of Object.entries(tree)) flatten(value, at ? `${at}.${key}` : key, out);
  } else {
    out.set(at, tree);
  }
  return out;
}

export const parseMessage = (text: string): MessageFormatElement[] => parse(text);

/** Each argument and tag a message names, with the kind of value it takes ("plural", "date", "tag" …). */
export function argumentsOf(elements: MessageFormatElement[], out = new Map<string, string>()): Map<string, string> {
  for (const el of elements) {
    if (el.type === TYPE.argument) out.set(el.value, out.get(el.value) ?? "argument");
    else if (el.type === TYPE.number || el.type === TYPE.plural) out.set(el.value, "number");
    else if (el.type === TYPE.date || el.type === TYPE.time) out.set(el.value, "date");
    else if (el.type === TYPE.select) out.set(el.value, `select:${Object.keys(el.options).find((k) => k !== "other") ?? "other"}`);
    else if (el.type === TYPE.tag) out.set(el.value, "tag");
    if (el.type === TYPE.plural || el.type === TYPE.select) for (const option of Object.values(el.options)) argumentsOf(option.value, out);
    if (el.type === TYPE.tag) argumentsOf(el.children, out);
  }
  return out;
}

/** The words a reader sees, arguments left out (so a `{lot}` placeholder is not the word "lot"). */
export function literalText(elements: MessageFormatElement[]): string {
  return elements
    .map((el) => {
      if (el.type === TYPE.literal) return el.value;
      if (el.type === TYPE.plural || el.type === TYPE.select) return Object.values(el.options).map((o) => literalText(o.value)).join(" ");
      if (el.type === TYPE.tag) return literalText(el.children);
      return " ";
    })
    .join("");
}
