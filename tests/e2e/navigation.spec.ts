import { expect, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";

/**
 * Each demo role sees exactly the sections its permissions allow (lib/auth/permissions.ts,
 * expected table in tests/unit/auth/permissions.test.ts) and the safety notice in the footer.
 * The header shows links and menus (▾); the inventory pages sit in one menu.
 */
const EXPECTED_NAV: Record<keyof typeof DEMO, string[]> = {
  // Everyone reads studies and the lab settings (a read-only overview for most roles).
  chemist: ["Overview", "Studies", "Inventory ▾", "Settings ▾"],
  safety: ["Overview", "Studies", "Inventory ▾", "Audit log", "Settings ▾"],
  stockkeeper: ["Overview", "Studies", "Inventory ▾", "Settings ▾"],
  admin: ["Overview", "Studies", "Inventory ▾", "Audit log", "Settings ▾"],
  viewer: ["Overview", "Studies", "Inventory ▾", "Audit log", "Settings ▾"],
  harrow: ["Overview", "Studies", "Inventory ▾", "Settings ▾"],
};

for (const [role, email] of Object.entries(DEMO) as Array<[keyof typeof DEMO, string]>) {
  test(`${role} signs in and sees the right navigation`, async ({ page }) => {
    await signIn(page, email);
    const nav = page.getByRole("navigation", { name: "Lab sections" });
    const top = nav.locator(":scope > ul > li > a, :scope > ul > li > div > button");
    const labels = (await top.evaluateAll((els) => els.map((e) => `${e.textContent?.trim()}${e.tagName === "BUTTON" ? " ▾" : ""}`)));
    // Sections added by later features (studies, plans…) are allowed among these; these must be there, in order.
    expect(labels.filter((l) => EXPECTED_NAV.admin.includes(l))).toEqual(EXPECTED_NAV[role]);
    await expect(page.getByTestId("safety-notice")).toContainText("planning aids");
  });
}

test("the Inventory menu opens with its pages, closes on Escape, and its links work", async ({ page }) => {
  await signIn(page, DEMO.stockkeeper);
  const nav = page.getByRole("navigation", { name: "Lab sections" });
  const menu = nav.getByRole("button", { name: "Inventory" });
  await menu.click();
  await expect(menu).toHaveAttribute("aria-expanded", "true");
  await expect(nav.getByRole("link")).toHaveText(["Overview", "Studies", "Containers", "Chemicals", "Reservations", "Shortfalls", "Import CSV"]);
  await page.keyboard.press("Escape");
  await expect(menu).toHaveAttribute("aria-expanded", "false");
  await expect(nav.getByRole("link", { name: "Chemicals" })).toBeHidden();
  await menu.click();
  await nav.getByRole("link", { name: "Chemicals" }).click();
  await expect(page).toHaveURL(/\/inventory\/chemicals$/);
  // The menu of the current page is marked, and the page's link is marked as current.
  await menu.click();
  await expect(nav.getByRole("link", { name: "Chemicals" })).toHaveAttribute("aria-current", "page");
});

test("the header fits on one line at 1280 px, and on a 390-px phone every section is in the Menu panel", async ({ page }) => {
  await signIn(page, DEMO.admin);
  const header = page.locator("header");
  // One row: the header is no taller than its tallest control plus its padding (wrapping would double it).
  expect((await header.boundingBox())!.height).toBeLessThan(64);
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1280);
  await page.setViewportSize({ width: 390, height: 800 });
  expect((await header.boundingBox())!.height).toBeLessThan(64);
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  const nav = page.getByRole("navigation", { name: "Lab sections" });
  await nav.getByRole("button", { name: "Menu" }).click();
  await expect(nav.getByRole("link")).toHaveText(["Overview", "Studies", "Containers", "Chemicals", "Reservations", "Shortfalls", "Import CSV", "Audit log", "Lab settings", "Members", "API tokens"]);
  await nav.getByRole("link", { name: "API tokens" }).click();
  await expect(page.getByRole("heading", { name: "API tokens", level: 1 })).toBeVisible();
});

test("a wrong password shows a clear message and stays on sign-in", async ({ page }) => {
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(DEMO.chemist);
  await page.getByLabel("Password").fill("not-the-password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("sign-in-error")).toHaveText("Wrong e-mail or password.");
  await expect(page).toHaveURL(/\/signin/);
});

test("another lab's pages are not found", async ({ page }) => {
  await signIn(page, DEMO.harrow);
  const res = await page.goto("/labs/kestrel-bay");
  expect(res?.status()).toBe(404);
  await expect(page.getByTestId("not-found")).toBeVisible();
});

test("a chemist cannot open the members page (404, nothing revealed)", async ({ page }) => {
  await signIn(page, DEMO.chemist);
  const res = await page.goto("/labs/kestrel-bay/members");
  expect(res?.status()).toBe(404);
});

test("the lab switcher moves a member of two labs between them", async ({ page }) => {
  await signIn(page, DEMO.admin);
  await expect(page.getByTestId("lab-name")).toHaveText("Kestrel Bay Process Chemistry");
  await page.getByTestId("lab-switcher").selectOption("harrow-fen");
  await expect(page.getByTestId("lab-name")).toHaveText("Harrow Fen Analytical");
});

test("an anonymous visitor is sent to sign-in", async ({ page }) => {
  await page.goto("/labs/kestrel-bay");
  await expect(page).toHaveURL(/\/signin/);
});
