// Issue 14: "a test fails if a screen shows a raw key". Every role, in Japanese and in English,
// walks its own menu and the main screens; no visible text (nor a placeholder, label or title)
// may be a catalogue key path — next-intl shows the path when a message is missing. In Japanese
// the screen must also show Japanese: Hiragana, Katakana or CJK ideographs (Unicode blocks
// U+3040–30FF, U+4E00–9FFF; The Unicode Standard, chapter 18).
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { DEMO_PASSWORD } from "./helpers";

const MESSAGES = path.join(import.meta.dirname, "../../src/i18n/messages/en");
const flatten = (tree: object, at: string, out: Set<string>): Set<string> => {
  for (const [key, value] of Object.entries(tree)) (value && typeof value === "object" ? flatten(value, `${at}${key}.`, out) : out.add(`${at}${key}`));
  return out;
};
const KEY_PATHS = readdirSync(MESSAGES).reduce((all, file) => flatten(JSON.parse(readFileSync(path.join(MESSAGES, file), "utf8")), "", all), new Set<string>());
const JAPANESE = /[\u3040-\u30ff\u4e00-\u9fff]/;

const ROLES = ["admin", "brewer", "grower", "miller", "sales", "auditor"] as const;
/** Screens beyond the menu: a lot every signed-in role may see (a harvest of Ikeda Farm, seed-season.ts), the scan page, a supplier's account. */
const EXTRA: Record<(typeof ROLES)[number], string[]> = {
  admin: ["/lots/H26-0001", "/scan", "/suppliers/grower-ikeda"],
  brewer: ["/lots/H26-0001", "/scan"],
  grower: ["/lots/H26-0001", "/account"],
  miller: ["/lots/H26-0001", "/account"],
  sales: ["/lots/H26-0001"],
  auditor: ["/lots/H26-0001", "/suppliers/grower-ikeda"],
};

/** Key paths among the page's visible text and its placeholders, labels and titles. */
async function rawKeysOn(page: Page): Promise<string[]> {
  const text = await page.evaluate(() => {
    const attrs = [...document.querySelectorAll("[placeholder],[aria-label],[title],[alt]")].flatMap((el) => ["placeholder", "aria-label", "title", "alt"].map((a) => el.getAttribute(a) ?? ""));
    return [document.title, document.body.innerText, ...attrs].join("\n");
  });
  return [...new Set(text.match(/[A-Za-z][\w-]*(?:\.[\w-]+)+/g) ?? [])].filter((token) => KEY_PATHS.has(token));
}

async function check(page: Page, url: string, locale: string) {
  const res = await page.goto(url);
  expect(res?.status(), url).toBeLessThan(400);
  await page.waitForLoadState("networkidle");
  expect(await rawKeysOn(page), `${url} (${locale})`).toEqual([]);
  if (locale === "ja-JP") expect(await page.locator("body").innerText(), url).toMatch(JAPANESE);
}

test.describe.configure({ mode: "parallel" });

test("the catalogue has key paths to look for", () => {
  expect(KEY_PATHS.size).toBeGreaterThan(500);
  expect(KEY_PATHS.has("nav.signOut")).toBe(true);
});

for (const locale of ["ja-JP", "en-US"] as const) {
  test.describe(locale, () => {
    test.use({ locale });

    test(`signed out: the sign-in page and the public bottle page (${locale})`, async ({ page, browser }) => {
      const admin = await browser.newContext();
      const signedIn = await admin.request.post("/api/auth/sign-in", { data: { email: "admin@example.com", password: DEMO_PASSWORD } });
      expect(signedIn.status()).toBe(200);
      const bottled = (await (await admin.request.get("/api/lots?kind=bottled&limit=50")).json()).items.find((l: { attributes: { gtin?: string } }) => l.attributes.gtin);
      await admin.close();
      await check(page, "/sign-in", locale);
      await check(page, `/01/${bottled.attributes.gtin.padStart(14, "0")}/10/${bottled.code}`, locale);
    });

    for (const role of ROLES) {
      test(`${role}: the menu's screens, a lot, and the role's own pages (${locale})`, async ({ page }) => {
        test.setTimeout(120_000);
        const signedIn = await page.request.post("/api/auth/sign-in", { data: { email: `${role}@example.com`, password: DEMO_PASSWORD } });
        expect(signedIn.status()).toBe(200);
        // The role's home (a floor screen for the brewer) and the office menu every role reaches from /lots.
        const menu: string[] = [];
        for (const start of ["/", "/lots"]) {
          await page.goto(start);
          menu.push(page.url().replace(/^https?:\/\/[^/]+/, ""), ...(await page.locator("nav a").evaluateAll((links) => links.map((a) => a.getAttribute("href") ?? ""))));
        }
        const urls = [...new Set([...menu.filter((href) => href.startsWith("/")), ...EXTRA[role]])];
        expect(urls.length).toBeGreaterThan(3);
        for (const url of urls) await check(page, url, locale);
      });
    }
  });
}
