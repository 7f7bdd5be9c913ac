// Each page and layout hands its client components the catalogue namespaces they read, no more and
// no fewer (src/i18n/client-messages.tsx). A namespace left out shows its key path on the screen
// (the e2e raw-key walk catches the screens it visits); one too many is sent on every request.
import { existsSync, mkdtempSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { catalogueFiles, flatten, readCatalogue } from "./catalogue-walk";
import { clientNamespacesOf, declaredNamespaces, ROOT, TRANSLATOR_TAKERS } from "./client-namespaces";

const appFiles = (name: RegExp) =>
  (readdirSync(path.join(ROOT, "app"), { recursive: true }) as string[]).filter((f) => name.test(path.basename(f))).map((f) => path.join("app", f)).sort();
const pages = appFiles(/^page\.tsx$/);
const layouts = appFiles(/^layout\.tsx$/);
const KEYS = new Set(catalogueFiles().flatMap((file) => [...flatten(readCatalogue("en", file)).keys()]));
const NAMESPACES = new Set([...KEYS].map((k) => k.split(".")[0]!));

describe("the namespaces each page and layout hands its client components", () => {
  it("finds the app's pages and layouts", () => {
    expect(pages.length).toBeGreaterThan(30);
    expect(layouts).toContain(path.join("app", "(office)", "layout.tsx"));
  });

  it.each(pages)("%s names exactly what its client components read", (page) => {
    const found = clientNamespacesOf(path.join(ROOT, page));
    expect(found.problems).toEqual([]);
    expect(declaredNamespaces(path.join(ROOT, page)) ?? []).toEqual(found.namespaces);
  });

  it.each(layouts)("%s names exactly what its own client components read", (layout) => {
    const found = clientNamespacesOf(path.join(ROOT, layout));
    expect(found.problems).toEqual([]);
    expect(declaredNamespaces(path.join(ROOT, layout)) ?? []).toEqual(found.namespaces);
  });

  // A not-found or forbidden screen renders inside the layouts above it, not inside a page: what
  // its client components read must come from the nearest layout that names a list.
  it.each(appFiles(/^(not-found|forbidden|unauthorized|error|global-error|loading|template|default)\.tsx$/))("%s reads only what the layout above it hands on", (file) => {
    let handed: string[] = [];
    for (let dir = path.dirname(file); dir !== "."; dir = path.dirname(dir)) {
      const layout = path.join(ROOT, dir, "layout.tsx");
      const list = existsSync(layout) ? declaredNamespaces(layout) : null;
      if (list) {
        handed = list;
        break;
      }
    }
    const found = clientNamespacesOf(path.join(ROOT, file));
    expect(found.problems).toEqual([]);
    expect(handed).toEqual(expect.arrayContaining(found.namespaces));
  });

  it("names only namespaces the catalogue has", () => {
    for (const file of [...pages, ...layouts]) for (const name of declaredNamespaces(path.join(ROOT, file)) ?? []) expect(NAMESPACES, `${file}: ${name}`).toContain(name);
  });

  it("hands the signed-in screens a provider at their layout, so a page naming nothing still formats dates", () => {
    for (const group of ["(office)", "(floor)", "(auth)"]) expect(declaredNamespaces(path.join(ROOT, "app", group, "layout.tsx"))).not.toBeNull();
  });

  it("hands the client the catalogue only through ClientMessages", () => {
    const sources = [...(readdirSync(path.join(ROOT, "app"), { recursive: true }) as string[]).map((f) => path.join("app", f)), ...(readdirSync(path.join(ROOT, "src"), { recursive: true }) as string[]).map((f) => path.join("src", f))]
      .filter((f) => /\.tsx?$/.test(f) && !f.endsWith(".test.ts") && f !== path.join("src", "i18n", "client-messages.tsx"));
    const users = sources.filter((f) => readFileSync(path.join(ROOT, f), "utf8").includes("NextIntlClientProvider"));
    expect(users).toEqual([]);
  });

  // The lot page's correction form reads "lotPage" and "steps" keys through a root translator
  // (app/(office)/lots/[code]/correction-form.tsx): the reading follows it.
  it("follows a root translator's written keys", () => {
    expect(clientNamespacesOf(path.join(ROOT, "app/(office)/lots/[code]/page.tsx")).namespaces).toEqual(expect.arrayContaining(["lotPage", "steps"]));
  });
});

describe("functions handed a root translator", () => {
  // Every key written in their files lies in the namespaces the table gives them.
  it.each(Object.entries(TRANSLATOR_TAKERS))("%s reads only its namespaces", (name, { namespaces, files }) => {
    const texts = files.map((f) => readFileSync(path.join(ROOT, f), "utf8"));
    expect(texts.some((t) => new RegExp(`export function ${name}\\(`).test(t))).toBe(true);
    const keys = texts.flatMap((t) => [...t.matchAll(/["`]([a-zA-Z]+\.[\w.]+)["`]/g)].map((m) => m[1]!)).filter((k) => KEYS.has(k));
    expect(keys.length).toBeGreaterThan(0);
    for (const key of keys) expect(namespaces, key).toContain(key.split(".")[0]);
  });
});

describe("the reading itself, on a small app", () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), "client-ns-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const write = (name: string, text: string) => {
    mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
    writeFileSync(path.join(dir, name), text);
    return path.join(dir, name);
  };
  write("form.tsx", `"use client";
import { useTranslations } from "next-intl";
import { quantityText } from "./amount";
import { Row } from "./row";
export function Form({ ok, step }: { ok: boolean; step: string }) {
  const t = useTranslations() as unknown as (key: string) => string;
  const sizes = useTranslations("labels.sizes");
  // The map's own "t" is a tank, not the translator: its "t.code" reads nothing.
  return <p>{t(ok ? "lotPage.saved" : "errors.unknown")}{t(\`steps.\${step}\`)}{sizes("small")}{quantityText(t as never, "en", 1, "kg")}{[{ code: "T1" }].map((t) => t.code)}<Row /></p>;
}
`);
  write("row.tsx", `import { useTranslations } from "next-intl";
export function Row() { const t = useTranslations("holds"); return <span>{t("onHold")}</span>; }
`);
  write("amount.ts", `export function quantityText() { return ""; }\n`);
  write("server-part.tsx", `import { getTranslations } from "next-intl/server";
import { Form } from "./form";
export async function Part() { const t = await getTranslations("recall"); return <Form ok step={t("title")} />; }
`);
  write("loose.tsx", `"use client";
import { useTranslations } from "next-intl";
export function Loose({ key }: { key: string }) { const t = useTranslations(); return <p>{t(key)}</p>; }
`);

  it("reads namespaces through server modules into client modules and what they import", () => {
    const page = write("page.tsx", `import { Part } from "./server-part";\nexport default function Page() { return <Part />; }\n`);
    // "recall" is read on the server (getTranslations) and is not the client's; "lot" comes from quantityText.
    expect(clientNamespacesOf(page)).toEqual({ namespaces: ["errors", "holds", "labels", "lot", "lotPage", "steps"], problems: [] });
  });

  it("reports a key it cannot read rather than guess", () => {
    const page = write("loose-page.tsx", `import { Loose } from "./loose";\nexport default function Page() { return <Loose key="x" />; }\n`);
    expect(clientNamespacesOf(page).problems).toEqual([expect.stringMatching(/loose\.tsx:3: a root translator called with a key not written out/)]);
  });

  it("reads the list a page or layout declares", () => {
    const page = write("declared/page.tsx", `import { withClientMessages } from "@/i18n/client-messages";\nfunction P() { return null; }\nexport default withClientMessages(["lot", "holds"], P);\n`);
    const layout = write("declared/layout.tsx", `export default function L({ children }) { return <ClientMessages namespaces={[]}>{children}</ClientMessages>; }\n`);
    expect(declaredNamespaces(page)).toEqual(["lot", "holds"]);
    expect(declaredNamespaces(layout)).toEqual([]);
    expect(declaredNamespaces(write("declared/none.tsx", "export default function N() { return null; }\n"))).toBeNull();
  });
});
