import { readFileSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import pg from "pg";
import { DEMO, signIn } from "./support/auth";

/**
 * The response surface and the safe optimum in Chromium (issue 13): a chemist opens the
 * analysis of a Box–Behnken plan on the demo's Suzuki–Miyaura recipe in 1,4-dioxane/water
 * (temperature 90–125 °C, base equivalents, Pd loading), sees the contour plot, moves a
 * slider (the held Pd loading changes and the plot is redrawn), extends the axes past the
 * studied range and sees the safe envelope — the hazard engine's TL-F02 (within 50 °C of
 * dioxane's autoignition temperature, 180 °C) from 130 °C, and the heating block's 150 °C
 * limit — hatched and labelled, the extrapolated region shaded; opens the 3-D surface; reads
 * the best conditions with their intervals and the canonical analysis; downloads the report.
 * Screenshots of the contour, the 3-D surface and the optimum panel are kept as artifacts.
 * The plan's state is set to running in the database (a test fixture); the yields are
 * invented from a stated model with an interior maximum (below).
 */
const LAB = "kestrel-bay";

/** Invented yields (and impurities, below): 70 + 4·T + 3·B + 2·P − 5·T² − 3·B² − 2·P² + 1.5·T·P in coded units, plus a fixed wobble. */
const yieldAt = (c: Record<string, number>, run: number) =>
  70 + 4 * c.temperature! + 3 * c.baseEquiv! + 2 * c.pdLoading! - 5 * c.temperature! ** 2 - 3 * c.baseEquiv! ** 2 - 2 * c.pdLoading! ** 2 + 1.5 * c.temperature! * c.pdLoading! + (((run * 7) % 5) - 2) * 0.2;

async function planWithResults(page: Page): Promise<{ studyId: string; planId: string }> {
  const study = await page.request.post(`/api/labs/${LAB}/studies`, { data: { name: `E2E surface ${Date.now()}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }, { name: "impurity", unit: "area %", goal: "minimize", low: 0.5, high: 3 }] } });
  expect(study.status()).toBe(201);
  const studyId = ((await study.json()) as { study: { id: string } }).study.id;
  const doc = JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")) as { name: string; factors: Array<Record<string, unknown>>; design: unknown };
  doc.name = "Surface E2E — Box–Behnken";
  doc.factors = [{ ...doc.factors[0], low: 90, high: 125 }, doc.factors[1]!, doc.factors[3]!];
  doc.design = { design: "box-behnken", centerPoints: 3, randomize: true, seed: 12 };
  const created = await page.request.post(`/api/labs/${LAB}/studies/${studyId}/plans`, { data: { document: doc } });
  expect(created.status()).toBe(201);
  const plan = ((await created.json()) as { plan: { id: string; runSheet: { runs: Array<{ run: number; coded: Record<string, number> }> } } }).plan;
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    await db.query("UPDATE plans SET state = 'running' WHERE id = $1", [plan.id]); // test fixture
  } finally {
    await db.end();
  }
  const runs = plan.runSheet.runs.map((r) => ({ run: r.run, responses: { yield: Number(yieldAt(r.coded, r.run).toFixed(2)), impurity: Number((1.6 + 0.5 * r.coded.temperature! - 0.2 * r.coded.pdLoading! + 0.3 * r.coded.temperature! ** 2 + (((r.run * 3) % 4) - 1.5) * 0.04).toFixed(2)) } }));
  expect((await page.request.put(`/api/labs/${LAB}/plans/${plan.id}/results`, { data: { runs } })).status()).toBe(200);
  return { studyId, planId: plan.id };
}

test("open the surface, move a slider, extend the axes and see the safe envelope; the 3-D surface; the best conditions; the report", async ({ page }, testInfo) => {
  test.setTimeout(150_000);
  await signIn(page, DEMO.chemist);
  const { studyId, planId } = await planWithResults(page);
  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/${planId}/analysis`);
  await page.getByTestId("model-quadratic").check();
  await expect(page.getByTestId("canonical-words")).toContainText("maximum");

  // The contour, drawn with the two strongest factors (temperature and base), Pd loading held at the best conditions.
  const body = page.getByTestId("surface-body");
  await expect(page.getByTestId("surface-contour")).toHaveAttribute("data-drawn", "true", { timeout: 30_000 });
  await expect(body).toHaveAttribute("data-x", "temperature");
  await expect(body).toHaveAttribute("data-y", "baseEquiv");
  // Inside the studied range nothing blocks (the plan was designed so).
  await expect(page.getByTestId("surface-envelope-clear")).toBeVisible();
  await expect(page.getByTestId("surface-notice")).toContainText("planning aids");

  // Move the Pd loading slider: the held value changes and the surface is fetched again.
  const heldBefore = await body.getAttribute("data-held");
  const slider = page.getByTestId("surface-hold-pdLoading");
  await slider.focus();
  for (let i = 0; i < 30; i++) await page.keyboard.press("ArrowLeft");
  await expect(body).not.toHaveAttribute("data-held", heldBefore!);
  expect(await body.getAttribute("data-held")).toMatch(/^pdLoading:/);
  await expect(page.getByTestId("surface-hold-value-pdLoading")).toContainText("mol %");

  // Extend the axes past the studied range: the envelope appears, hatched and labelled with its cautions.
  await page.getByTestId("surface-extend").click();
  await expect(page.getByTestId("surface-caution-TL-F02")).toBeVisible();
  await expect(page.getByTestId("surface-caution-TL-F02")).toContainText("autoignition");
  await expect(page.getByTestId("surface-contour")).toHaveAttribute("data-drawn", "true");
  const labels = await page.getByTestId("surface-contour").locator(".annotation-text").allTextContents();
  expect(labels.join(" ")).toContain("TL-F02");
  expect(labels.join(" ")).toContain("extrapolated");
  // The hatched region is a Plotly pattern fill.
  expect(await page.getByTestId("surface-contour").locator("pattern").count()).toBeGreaterThan(0);
  await page.getByTestId("surface-panel").screenshot({ path: testInfo.outputPath("surface-contour.png") });

  // An axis range typed by hand.
  await page.getByTestId("surface-x-to").fill("170");
  await page.getByTestId("surface-x-to").press("Enter");
  // …to 170 °C: over the vial's pressure limit (TL-V02) and past the heating block's 150 °C (a limit of the lab).
  await expect(page.getByTestId("surface-caution-TL-V02")).toBeVisible();
  await expect(page.getByTestId("surface-limit-TL-T01")).toContainText("heating block");
  await page.getByTestId("surface-panel").screenshot({ path: testInfo.outputPath("surface-contour-to-170.png") });

  // The 3-D surface: Plotly's WebGL bundle, loaded only now.
  await page.getByTestId("surface-toggle-3d").click();
  await expect(page.getByTestId("surface-3d")).toHaveAttribute("data-drawn", "true", { timeout: 30_000 });
  await page.waitForTimeout(500);
  await page.getByTestId("surface-3d").screenshot({ path: testInfo.outputPath("surface-3d.png") });

  // The best conditions: intervals, and two responses at once through their desirability.
  await expect(page.getByTestId("optimum-intervals")).toContainText("95 % prediction interval");
  await page.getByTestId("optimum-panel").screenshot({ path: testInfo.outputPath("optimum-panel.png") });
  await page.getByTestId("optimum-combine-impurity").check();
  await expect(page.getByTestId("optimum-desirability")).toBeVisible();
  await expect(page.getByTestId("optimum-response-impurity")).toBeVisible();
  await page.getByTestId("optimum-panel").screenshot({ path: testInfo.outputPath("optimum-panel-desirability.png") });

  // The report as drawn: a PDF.
  const href = await page.getByTestId("analysis-report-link").getAttribute("href");
  expect(href).toContain("analysis-report.pdf");
  expect(href).toContain("combine=impurity");
  const pdf = await page.request.get(href!);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  expect((await pdf.body()).subarray(0, 5).toString("latin1")).toBe("%PDF-");
  await page.screenshot({ path: testInfo.outputPath("surface-analysis-page.png"), fullPage: true });
});
