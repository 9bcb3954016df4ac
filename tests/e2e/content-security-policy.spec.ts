import { readFileSync } from "node:fs";
import { expect, test } from "@playwright/test";
import pg from "pg";
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
  // The plan editor and the plan page (issue 10): the editor checks the plan document with its
  // zod schema in the browser (zodResolver) and recomputes the preview as the chemist types.
  const study = (await page.evaluate(async () => {
    const r = await fetch("/api/labs/kestrel-bay/studies", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name: `CSP study ${Date.now()}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }) });
    return ((await r.json()) as { study: { id: string } }).study.id;
  })) as string;
  const res = await page.goto(`/labs/kestrel-bay/studies/${study}/plans/new`);
  expect(res?.status()).toBe(200);
  await page.getByTestId("factors-section").getByRole("button", { name: "Add a factor" }).click();
  await page.getByTestId("factor-0-low").fill("80");
  await page.getByTestId("factor-0-high").fill("60");
  await page.getByTestId("save-plan").click();
  await expect(page.getByTestId("error-factors.0.high")).toBeVisible();
  await collect();
  const plan = (await page.evaluate(async (studyId) => {
    const doc = { name: "CSP plan", recipe: { limitingReagent: "a", scaleMmol: 0.1, concentrationM: 0.2, components: [{ id: "a", name: "A", role: "reagent", formula: "C7H7BrO", form: { state: "solid" } }], solvents: [{ name: "toluene", volumeFraction: 1 }] }, factors: [{ name: "temperature", low: 40, high: 60, unit: "degC", binding: { kind: "temperature" } }], design: { design: "full-factorial", seed: 1 } };
    const r = await fetch(`/api/labs/kestrel-bay/studies/${studyId}/plans`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ document: doc }) });
    return ((await r.json()) as { plan: { id: string } }).plan.id;
  }, study)) as string;
  // Leaving the unsaved new plan: the browser asks (beforeunload); leave.
  page.once("dialog", (d) => void d.accept());
  for (const path of [`/studies/${study}/plans/${plan}`, `/studies/${study}/plans/${plan}/edit`]) {
    const r = await page.goto(`/labs/kestrel-bay${path}`);
    expect(r?.status(), path).toBe(200);
    await expect(page.getByRole("navigation", { name: "Lab sections" })).toBeVisible();
    await collect();
  }
  await expect(page.getByTestId("preview-status")).toHaveAttribute("data-status", "ready", { timeout: 20_000 });
  await collect();
  {
  // The results grid and the analysis pages (issue 12): Plotly is loaded there (a dynamic
  // import) and draws every diagnostic plot under the policy. The plan's state is set in the
  // database (a test fixture), its yields entered through the API.
  const study = await page.request.post("/api/labs/kestrel-bay/studies", { data: { name: `CSP analysis ${Date.now()}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] } });
  const studyId = ((await study.json()) as { study: { id: string } }).study.id;
  const created = await page.request.post(`/api/labs/kestrel-bay/studies/${studyId}/plans`, { data: { document: JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")) as unknown } });
  const plan = ((await created.json()) as { plan: { id: string; runSheet: { runs: Array<{ run: number; coded: Record<string, number> }> } } }).plan;
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  await db.query("UPDATE plans SET state = 'running' WHERE id = $1", [plan.id]).finally(() => db.end());
  const runs = plan.runSheet.runs.map((r) => ({ run: r.run, responses: { yield: 60 + 8 * r.coded.temperature! + 3 * r.coded.baseEquiv! + (r.run % 3) * 0.4 } }));
  expect((await page.request.put(`/api/labs/kestrel-bay/plans/${plan.id}/results`, { data: { runs } })).status()).toBe(200);
  for (const path of [`/studies/${studyId}/plans/${plan.id}/results`, `/studies/${studyId}/plans/${plan.id}/analysis`, `/studies/${studyId}/analysis`]) {
    const res = await page.goto(`/labs/kestrel-bay${path}`);
    expect(res?.status(), path).toBe(200);
    if (path.endsWith("/results")) await expect(page.getByTestId("results-grid")).toBeVisible();
    else {
      for (const id of ["plot-normal", "plot-residual-fitted", "plot-residual-order", "plot-predicted-actual", "plot-cooks"]) await expect(page.getByTestId(id)).toHaveAttribute("data-drawn", "true");
      // The response surface (issue 13): the contour with its pattern-hatched envelope, then the 3-D surface (Plotly's WebGL bundle).
      await expect(page.getByTestId("surface-contour")).toHaveAttribute("data-drawn", "true", { timeout: 30_000 });
      await page.getByTestId("surface-extend").click();
      await page.getByTestId("surface-toggle-3d").click();
      await expect(page.getByTestId("surface-3d")).toHaveAttribute("data-drawn", "true", { timeout: 30_000 });
    }
    await collect();
  }
  }
  // A client-side navigation (React hydrated and running under the policy).
  await page.getByRole("navigation", { name: "Lab sections" }).getByRole("link", { name: "Overview" }).click();
  await expect(page).toHaveURL(/\/labs\/kestrel-bay$/);
  await collect();
  expect(violations).toEqual([]);
});

/**
 * The review pages (issue 11) under the same policy, as the demo safety officer: the queue,
 * the review page of the demo's plan waiting there (Study B's exchange plan, lib/demo/steps/
 * 50-review-and-release.ts) with its vial map, and the sign dialog, which checks its fields
 * with the shared zod schema in the browser (zodResolver; zod runs jitless).
 */
test("the review queue, the review page and its sign dialog run under the Content-Security-Policy", async ({ page }) => {
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
  await signIn(page, DEMO.safety);
  const queue = await page.goto("/labs/kestrel-bay/review");
  expect(queue?.status()).toBe(200);
  expect(queue?.headers()["content-security-policy"]).toContain("frame-ancestors 'none'");
  await collect();
  await page.getByTestId("review-queue-row").filter({ hasText: "Study B" }).getByTestId("review-queue-link").click();
  await expect(page).toHaveURL(/\/labs\/kestrel-bay\/review\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("region", { name: "Vial map" })).toBeVisible();
  await collect();
  await page.getByTestId("open-sign-dialog").click();
  await page.getByTestId("decision-reject").check();
  await page.getByTestId("sign-submit").click();
  await expect(page.getByTestId("error-password")).toBeVisible();
  await collect();
  expect(violations).toEqual([]);
});
