import { expect, test, type Page } from "@playwright/test";
import { signInAndLand } from "./helpers";

// BL25-0001, the seeded blend: 31 lots from two paddies to one bottling (src/server/records/seed-brewing.ts).
const CODE = "BL25-0001";

/** The drawn nodes outside the canvas, and the zoom React Flow fitted the drawing at. */
async function fit(page: Page) {
  return page.evaluate(() => {
    const pane = document.querySelector(".react-flow")!.getBoundingClientRect();
    const outside = [...document.querySelectorAll(".react-flow__node")].filter((n) => {
      const b = n.getBoundingClientRect();
      return b.left < pane.left - 1 || b.right > pane.right + 1 || b.top < pane.top - 1 || b.bottom > pane.bottom + 1;
    }).length;
    const transform = document.querySelector<HTMLElement>(".react-flow__viewport")!.style.transform;
    return { outside, zoom: Number(/scale\(([\d.]+)\)/.exec(transform)?.[1] ?? 1) };
  });
}

test("a blend's lineage draws lot by lot, folds into stage columns that fit and read, and unfolds again", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  await page.goto(`/lots/${CODE}/graph`);
  const canvas = page.getByRole("region", { name: `Lineage graph of ${CODE}. The same lots and links follow as a list.` });
  const nodes = canvas.locator(".react-flow__node");
  await expect(nodes).toHaveCount(31);
  // React Flow has started in the browser (the mark the jobs bench times "usable" by).
  await expect(canvas).toHaveAttribute("data-interactive", "");
  // The list under the graph: 25 lots a page, numbered on across pages, or every lot on one page.
  const list = page.getByTestId("lineage-text");
  await expect(list.locator("ol > li")).toHaveCount(25);
  await expect(list.getByTestId("lineage-range")).toHaveText("Lots 1–25 of 31");
  await expect.poll(async () => (await fit(page)).outside).toBe(0);

  // Fold every stage, one button at a time: one node per stage and step, the blend itself on its own.
  const stages = page.getByRole("group", { name: "Fold a stage into one node per step" }).getByRole("button");
  const kinds = await stages.count();
  for (let i = 0; i < kinds; i++) {
    await stages.nth(i).click();
    await expect(stages.nth(i)).toHaveAttribute("aria-pressed", "true");
  }
  await expect(nodes).toHaveCount(12);
  await expect(canvas.locator("[data-current]")).toContainText(CODE);
  await expect(canvas.getByRole("button", { name: /8 steamed lots/ })).toBeVisible();
  // Readable at first sight: the whole flow fits, at a zoom where a stage's 16 px count stays above 9 px.
  await expect.poll(async () => (await fit(page)).outside).toBe(0);
  expect((await fit(page)).zoom).toBeGreaterThanOrEqual(0.6);

  // A folded stage opens on a click; "Show every lot" unfolds the rest.
  await canvas.getByRole("button", { name: /8 steamed lots/ }).click();
  await expect(stages.filter({ hasText: "Steamed rice" })).toHaveAttribute("aria-pressed", "false");
  await expect(nodes).toHaveCount(12 - 2 + 12);
  await page.getByRole("button", { name: "Show every lot" }).click();
  await expect(nodes).toHaveCount(31);
});

test("the lineage's list pages on the server, keeps the graph's folds, and shows every lot on one page when asked", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  await page.goto(`/lots/${CODE}/graph`);
  const canvas = page.getByRole("region", { name: `Lineage graph of ${CODE}. The same lots and links follow as a list.` });
  const nodes = canvas.locator(".react-flow__node");
  const list = page.getByTestId("lineage-text");
  const rows = list.locator("ol > li");
  const firstPage = await rows.allTextContents();
  await expect(nodes).toHaveCount(31);
  // A fold made before paging stays: the graph is not drawn again from the server's first view.
  const stages = page.getByRole("group", { name: "Fold a stage into one node per step" });
  await stages.getByRole("button", { name: /Steamed rice/ }).click();
  await expect(nodes).toHaveCount(31 - 12 + 2);

  await list.getByTestId("lineage-pages").getByRole("link", { name: "Next" }).click();
  await expect(page).toHaveURL(new RegExp(`/lots/${CODE}/graph\\?page=2#lineage-text$`));
  await expect(rows).toHaveCount(6);
  await expect(list.getByTestId("lineage-range")).toHaveText("Lots 26–31 of 31");
  await expect(list.locator("ol")).toHaveAttribute("start", "26");
  await expect(rows.last()).toContainText(/Bottled/);
  await expect(nodes).toHaveCount(31 - 12 + 2);
  const secondPage = await rows.allTextContents();

  // Every lot on one page is the two pages, in order; and the address keeps the view on a reload.
  await list.getByTestId("lineage-whole").click();
  await expect(page).toHaveURL(new RegExp(`/lots/${CODE}/graph\\?list=all#lineage-text$`));
  await expect(rows).toHaveCount(31);
  expect(await rows.allTextContents()).toEqual([...firstPage, ...secondPage]);
  await page.reload();
  await expect(rows).toHaveCount(31);
  await expect(list.getByTestId("lineage-pages")).toHaveCount(0);
  await list.getByTestId("lineage-whole").click();
  await expect(rows).toHaveCount(25);
});

test("the first drawing arrives fitted in the page itself, before any script has run", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  // A 1280 × 800 desk, as bench/jobs-bench.ts times it; no script runs, so what shows is the server's drawing.
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.route(/\/_next\/static\/.*\.js(\?.*)?$/, (route) => route.abort());
  await page.goto(`/lots/${CODE}/graph`);
  const canvas = page.getByRole("region", { name: `Lineage graph of ${CODE}. The same lots and links follow as a list.` });
  await expect(canvas.locator(".react-flow__node")).toHaveCount(31);
  await expect(canvas.locator(".react-flow__node[style*='visibility:hidden'], .react-flow__node[style*='visibility: hidden']")).toHaveCount(0);
  const { outside, zoom } = await fit(page);
  expect(outside).toBe(0);
  // Fitted by the server: without it the page came at scale(1), the flow running off the canvas.
  expect(zoom).toBeGreaterThan(0.1);
  expect(zoom).toBeLessThan(1);
  // Shown, but not yet usable: nothing marks it started without its scripts.
  await expect(canvas).not.toHaveAttribute("data-interactive");
});
