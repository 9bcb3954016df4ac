import { expect, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";

/**
 * Each demo role sees exactly the sections its permissions allow (lib/auth/permissions.ts,
 * expected table in tests/unit/auth/permissions.test.ts) and the safety notice in the footer.
 */
const EXPECTED_NAV: Record<keyof typeof DEMO, string[]> = {
  chemist: ["Overview"],
  safety: ["Overview", "Audit log"],
  stockkeeper: ["Overview"],
  admin: ["Overview", "Members", "Audit log"],
  viewer: ["Overview", "Audit log"],
  harrow: ["Overview"],
};

for (const [role, email] of Object.entries(DEMO) as Array<[keyof typeof DEMO, string]>) {
  test(`${role} signs in and sees the right navigation`, async ({ page }) => {
    await signIn(page, email);
    const nav = page.getByRole("navigation", { name: "Lab sections" });
    const labels = (await nav.getByRole("link").allTextContents()).map((s) => s.trim());
    // Sections added by later features (inventory…) are allowed after these; these must be there, in order.
    expect(labels.filter((l) => ["Overview", "Members", "Audit log"].includes(l))).toEqual(EXPECTED_NAV[role]);
    await expect(page.getByTestId("safety-notice")).toContainText("planning aids");
  });
}

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
