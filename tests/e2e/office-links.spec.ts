import { expect, test } from "@playwright/test";
import { signInAndLand } from "./helpers";

// Office links do not prefetch (src/components/app-link.tsx): every page is dynamic and per person,
// so each prefetch was a server render, 44 of them for one lineage page. A click still navigates
// inside the page, without a full load.
test("an office page asks the server for nothing more than itself, and its links still navigate in the page", async ({ page }) => {
  await signInAndLand(page, "admin@example.com");
  const prefetches: string[] = [];
  page.on("request", (request) => {
    if (request.headers()["next-router-prefetch"]) prefetches.push(request.url());
  });
  await page.goto("/lots/BL25-0001/graph");
  await expect(page.getByTestId("lineage-canvas")).toHaveAttribute("data-interactive", "");
  await page.mouse.wheel(0, 4000);
  // Prefetches went out as links came into view and again after hydration; give them the time they took.
  await page.waitForTimeout(1500);
  expect(prefetches).toEqual([]);
  await page.evaluate(() => ((window as { stayed?: boolean }).stayed = true));
  await page.getByRole("navigation", { name: "Office" }).getByRole("link", { name: "Recall" }).click();
  await expect(page).toHaveURL(/\/recall$/);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  expect(await page.evaluate(() => (window as { stayed?: boolean }).stayed), "navigated in the page, not by a full load").toBe(true);
});
