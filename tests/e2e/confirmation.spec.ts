import { readFileSync } from "node:fs";
import { expect, test, type APIRequestContext } from "@playwright/test";
import pg from "pg";
import { DEMO, signIn } from "./support/auth";

/**
 * The confirmation runs and the next design in Chromium (issue 13 items 3 and 4): a chemist
 * opens the analysis of a Box–Behnken plan with results, plans the confirmation runs with one
 * click and lands on the new draft plan's page, which says where its runs come from; once its
 * results are in, the first plan's analysis draws observed against predicted and says whether
 * the confirmation holds. A two-level factorial's analysis shows the path of steepest ascent
 * and augments the plan to a central composite design. The plans are the example's recipe
 * (examples/plan-suzuki.json); their states are set to running in the database (a test
 * fixture: release is tested by the review flow's own tests), the yields entered through the
 * API. No Content-Security-Policy violation on the way. Screenshots as artifacts.
 */
const LAB = "kestrel-bay";
type Run = { run: number; coded: Record<string, number> };

async function planWithResults(request: APIRequestContext, studyId: string, name: string, design: Record<string, unknown>, yieldOf: (c: Record<string, number>, i: number) => number) {
  const doc = JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")) as Record<string, unknown> & { factors: Array<{ name: string }> };
  const document = { ...doc, name, factors: doc.factors.filter((f) => ["temperature", "baseEquiv", "pdLoading"].includes(f.name)), design };
  const created = await request.post(`/api/labs/${LAB}/studies/${studyId}/plans`, { data: { document } });
  expect(created.status()).toBe(201);
  const plan = ((await created.json()) as { plan: { id: string; runSheet: { runs: Run[] } } }).plan;
  await setRunning(plan.id);
  const runs = [...plan.runSheet.runs].sort((a, b) => a.run - b.run).map((r, i) => ({ run: r.run, responses: { yield: Number(yieldOf(r.coded, i).toFixed(1)) } }));
  expect((await request.put(`/api/labs/${LAB}/plans/${plan.id}/results`, { data: { runs } })).status()).toBe(200);
  return plan.id;
}

async function setRunning(planId: string) {
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    await db.query("UPDATE plans SET state = 'running' WHERE id = $1", [planId]); // test fixture
  } finally {
    await db.end();
  }
}

test("plan confirmation runs from the analysis page, land on the new plan, and see the verdict once its results are in", async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  // The production Content-Security-Policy: the panels and the new plan page run without a violation (as tests/e2e/content-security-policy.spec.ts checks).
  const violations: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error" && /Content Security Policy/i.test(m.text())) violations.push(m.text());
  });
  await signIn(page, DEMO.chemist);
  const study = await page.request.post(`/api/labs/${LAB}/studies`, { data: { name: `E2E confirmation ${Date.now()}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] } });
  const studyId = ((await study.json()) as { study: { id: string } }).study.id;
  // Invented yields with an interior maximum (a stated quadratic in coded units plus a fixed wobble).
  const curved = (c: Record<string, number>, i: number) => 78 + 4 * c.temperature! + 2 * c.baseEquiv! + 1.5 * c.pdLoading! - 3 * c.temperature! ** 2 - 4 * c.baseEquiv! ** 2 - 3 * c.pdLoading! ** 2 + ((i * 7) % 5) * 0.3 - 0.6;
  const source = await planWithResults(page.request, studyId, "E2E Box–Behnken", { design: "box-behnken", centerPoints: 3, randomize: true, seed: 21 }, curved);

  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/${source}/analysis`);
  await expect(page.getByTestId("optimum-panel")).toContainText("Predicted yield");
  await expect(page.getByTestId("confirmation-step-temperature")).toHaveValue("1");
  await expect(page.getByTestId("confirmation-step-baseEquiv")).toHaveValue("0.05");
  await expect(page.getByTestId("confirmation-step-pdLoading")).toHaveValue("0.1");
  await page.getByTestId("confirmation-panel").screenshot({ path: testInfo.outputPath("confirmation-panel.png") });
  await page.getByTestId("plan-confirmation").click();

  // The new draft plan's page: three replicate runs at one settable point, and where they come from.
  await expect(page).toHaveURL(new RegExp(`/labs/${LAB}/studies/${studyId}/plans/(?!${source})[0-9a-f-]{36}$`));
  await expect(page.getByTestId("plan-name")).toHaveText("Confirmation of E2E Box–Behnken");
  await expect(page.getByTestId("plan-state")).toContainText(/draft/i);
  await expect(page.getByTestId("plan-derivation")).toContainText("Confirmation runs");
  await expect(page.getByTestId("plan-derivation")).toContainText("Predicted");
  const confirmationId = page.url().split("/").pop()!;
  const plan = (await (await page.request.get(`/api/labs/${LAB}/plans/${confirmationId}`)).json()) as { plan: { derivedFromPlanId: string; runSheet: { runs: Array<{ run: number; natural: Record<string, number> }> }; derivationDetails: { predicted: number } } };
  expect(plan.plan.derivedFromPlanId).toBe(source);
  expect(plan.plan.runSheet.runs).toHaveLength(3);
  expect(new Set(plan.plan.runSheet.runs.map((r) => JSON.stringify(r.natural))).size).toBe(1);
  const t = plan.plan.runSheet.runs[0]!.natural.temperature!;
  expect(Number.isInteger(t)).toBe(true);
  await page.screenshot({ path: testInfo.outputPath("confirmation-plan-page.png"), fullPage: true });

  // Its results: near the prediction. The first plan's analysis draws them and says the confirmation holds.
  await setRunning(confirmationId);
  const predicted = plan.plan.derivationDetails.predicted;
  expect((await page.request.put(`/api/labs/${LAB}/plans/${confirmationId}/results`, { data: { runs: [1, 2, 3].map((run, i) => ({ run, responses: { yield: Number((predicted + [0.4, -0.3, 0.2][i]!).toFixed(1)) } })) } })).status()).toBe(200);
  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/${source}/analysis`);
  await expect(page.getByTestId("confirmation-verdict")).toContainText("The confirmation holds");
  await expect(page.getByTestId("confirmation-chart")).toBeVisible();
  await page.getByTestId("confirmation-checks").screenshot({ path: testInfo.outputPath("confirmation-verdict.png") });
  await page.screenshot({ path: testInfo.outputPath("confirmation-analysis-page.png"), fullPage: true });
  expect(violations).toEqual([]);
});

test("a two-level factorial's analysis proposes the path of steepest ascent and augments the plan to a central composite design", async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  await signIn(page, DEMO.chemist);
  const study = await page.request.post(`/api/labs/${LAB}/studies`, { data: { name: `E2E next design ${Date.now()}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] } });
  const studyId = ((await study.json()) as { study: { id: string } }).study.id;
  const rising = (c: Record<string, number>, i: number) => 55 + 6 * c.temperature! + 3 * c.baseEquiv! - 2 * c.pdLoading! + ((i * 7) % 5) * 0.2 - 0.4;
  const source = await planWithResults(page.request, studyId, "E2E 2^3", { design: "full-factorial", centerPoints: 2, randomize: true, seed: 22 }, rising);
  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/${source}/analysis`);
  await page.getByTestId("model-linear").check();
  await expect(page.getByTestId("steepest-ascent")).toBeVisible();
  await expect(page.getByTestId("path-step").first()).toBeVisible();
  await page.getByTestId("augment-plan").click();
  await expect(page.getByTestId("augment-made")).toContainText("6 axial runs");
  await page.getByTestId("next-design-panel").screenshot({ path: testInfo.outputPath("next-design-panel.png") });
  await page.getByTestId("augment-made").getByRole("link").click();
  await expect(page.getByTestId("plan-derivation")).toContainText("Axial and centre runs");
  await page.screenshot({ path: testInfo.outputPath("augmentation-plan-page.png"), fullPage: true });
});
