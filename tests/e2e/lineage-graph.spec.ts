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
  await expect(page.getByTestId("lineage-text").locator("ol > li")).toHaveCount(31);
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
