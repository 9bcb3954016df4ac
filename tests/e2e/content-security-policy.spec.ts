import { expect, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";

/**
 * The Content-Security-Policy of next.config.mjs works with Next's production pages in
 * Chromium: signing in (a client-side form), every lab page and a client-side navigation
 * run without one policy violation (the browser reports each as a
 * `securitypolicyviolation` event and a console error).
 */
test("the pages run under the Content-Security-Policy without a violation", async ({ page }) => {
  const violations: string[] = [];
  await page.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => {
      (window as unknown as { __csp: string[] }).__csp ??= [];
      (window as unknown as { __csp: string[] }).__csp.push(`${e.violatedDirective} ${e.blockedURI}`);
    });
  });
  page.on("console", (m) => {
    if (m.type() === "error" && /Content Security Policy/i.test(m.text())) violations.push(m.text());
  });
  const collect = async () => violations.push(...((await page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? [])) as string[]));

  await page.goto("/signin");
  await expect(page.getByLabel("E-mail")).toBeVisible();
  await collect();
  await signIn(page, DEMO.admin);
  await collect();
  for (const path of ["", "/inventory", "/inventory/chemicals", "/inventory/containers", "/inventory/reservations", "/inventory/alerts", "/inventory/import", "/members", "/audit", "/studies", "/studies/new", "/settings", "/settings/tokens"]) {
    const res = await page.goto(`/labs/kestrel-bay${path}`);
    expect(res?.status(), path).toBe(200);
    expect(res?.headers()["content-security-policy"]).toContain("frame-ancestors 'none'");
    await expect(page.getByRole("navigation", { name: "Lab sections" })).toBeVisible();
    await collect();
  }
  // A form checked in the browser with the shared zod schema (zod must not probe for eval).
  await page.getByRole("button", { name: "Create token" }).click();
  await expect(page.getByTestId("error-token-name")).toBeVisible();
  await collect();
  // A client-side navigation (React hydrated and running under the policy).
  await page.getByRole("navigation", { name: "Lab sections" }).getByRole("link", { name: "Overview" }).click();
  await expect(page).toHaveURL(/\/labs\/kestrel-bay$/);
  await collect();
  expect(violations).toEqual([]);
});
