import { expect, test, type Page } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";
import { upToDate } from "./support/plan-editor";

/**
 * Safe design in the browser (Chromium), on the demo's unsafe plan
 * (lib/demo/steps/40-unsafe-ccd.ts): Study A's coupling in THF/water as a rotatable central
 * composite design on temperature 85–115 °C, base and boronic acid equivalents, 3 centre
 * points, in the lab's 10 bar crimp vial. A chemist opens it, sees the blocking run named
 * on the plan page and in the editor's safe-design panel, applies an alternative, sees no
 * blocking caution in the live preview, saves, and finds nothing blocking on the saved
 * plan. The demo plan itself is left as it is: the chemist edits a duplicate.
 * Screenshots of the editor, the alternatives and the vial map are kept as test artifacts.
 *
 * Checks and their sources:
 * - a central composite design in k = 3 factors has 2^3 factorial, 2k = 6 axial and the
 *   given 3 centre runs: 17 (Montgomery, Design and Analysis of Experiments, §11.4.2); the
 *   rotatable α is (2^k)^¼ = 8^¼ = 1.682 (NIST/SEMATECH e-Handbook §5.3.3.6.1), so the +α
 *   temperature is 100 + 1.682 × 15 = 125.2 °C (computed here);
 * - a face-centred CCD puts its axial runs on the faces (α = 1, same handbook section), so
 *   no temperature leaves the 85–115 °C box and the run count stays 17;
 * - the run that blocks is the vial's pressure limit, TL-V02: the demo's reasoning in
 *   lib/demo/steps/40-unsafe-ccd.ts (about 5.3 bar estimated against 10 bar × 0.5).
 */
const LAB = "kestrel-bay";
const STUDY = "Study A — Suzuki–Miyaura coupling of 4-bromoanisole with pyridin-3-ylboronic acid";
const PLAN = "Study A — CCD in THF/water (solvent switch), rotatable";
const PLUS_ALPHA_C = 100 + Math.pow(8, 0.25) * 15;

const runNumbers = (text: string | null) => (text ?? "").match(/\d+/g)?.map(Number) ?? [];

async function openDemoPlan(page: Page) {
  await page.getByRole("navigation", { name: "Lab sections" }).getByRole("link", { name: "Studies", exact: true }).click();
  await page.getByTestId("study-search").fill("Suzuki–Miyaura coupling of 4-bromoanisole");
  await page.getByTestId(`study-row-${STUDY}`).getByRole("link", { name: STUDY }).click();
  await expect(page.getByTestId("study-name")).toHaveText(STUDY);
  await page.getByTestId(`plan-row-${PLAN}`).getByRole("link", { name: PLAN }).click();
  await expect(page.getByTestId("plan-name")).toHaveText(PLAN);
}

test("a chemist opens the unsafe CCD demo plan, sees the blocking runs named, applies an alternative and sees no blocking caution", async ({ page }, testInfo) => {
  test.setTimeout(180_000);
  // The panel's requests and the preview's panes run under the production Content-Security-Policy.
  const violations: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error" && /Content Security Policy/i.test(m.text())) violations.push(m.text());
  });
  await signIn(page, DEMO.chemist);
  await openDemoPlan(page);

  // The plan page: one blocking caution, the vial's pressure limit, on the +α temperature run.
  const blocking = page.locator('[data-testid="plan-cautions-list-item"][data-severity="blocking"]');
  await expect(blocking).toHaveCount(1);
  await expect(blocking).toHaveAttribute("data-code", "TL-V02");
  const blockedRuns = runNumbers(await blocking.getByTestId("plan-cautions-list-runs").textContent());
  expect(blockedRuns.length).toBeGreaterThan(0);
  await expect(page.getByTestId("plan-cautions-list-notice")).toContainText("planning aids");
  // The vial map rings the blocked run; pointing at it shows its conditions and what goes into it.
  const hot = page.getByTestId("plan-vial-map").locator(`g[role="button"][data-run="${blockedRuns[0]}"]`);
  await hot.hover();
  await expect(page.getByTestId("plan-vial-map")).toContainText(`Run ${blockedRuns[0]} · vial`);
  await expect(page.getByTestId("plan-vial-map")).toContainText(`${PLUS_ALPHA_C.toFixed(1)} °C`);
  await expect(page.getByTestId("plan-vial-map").getByRole("table")).toContainText("µL");
  await page.getByTestId("plan-vial-map").screenshot({ path: testInfo.outputPath("unsafe-ccd-vial-map.png") });

  // The chemist works on a duplicate, so the demo keeps its unsafe plan.
  const demoUrl = page.url();
  await page.getByTestId("duplicate-plan").click();
  await expect.poll(() => page.url()).not.toBe(demoUrl);
  await expect(page.getByTestId("plan-state")).toContainText("Draft");
  await page.getByTestId("edit-plan").click();
  await expect(page.getByTestId("plan-editor")).toBeVisible();
  await upToDate(page);

  // The safe-design panel names the same runs, with their conditions and what blocks them.
  const panel = page.getByTestId("safe-design-panel");
  await expect(panel).toBeVisible({ timeout: 30_000 });
  await expect(panel.getByRole("heading", { level: 2 })).toContainText(blockedRuns.length === 1 ? "1 run of 17 blocks" : `${blockedRuns.length} runs of 17 block`);
  await expect(page.getByTestId("safe-design-notice")).toContainText("planning aids");
  const named = page.locator('[data-testid^="safe-design-run-"]');
  await expect(named).toHaveCount(blockedRuns.length);
  for (const run of blockedRuns) {
    const item = page.getByTestId(`safe-design-run-${run}`);
    await expect(item).toContainText("axial");
    await expect(item).toContainText("TL-V02");
  }
  await expect(page.getByTestId(`safe-design-run-${blockedRuns[0]}`)).toContainText(`temperature ${PLUS_ALPHA_C.toFixed(1)} °C`);

  // The alternatives side by side, the D-optimal search included once it has answered.
  const alternatives = page.getByTestId("safe-design-alternatives");
  for (const kind of ["face-centered", "inscribed", "smaller-alpha", "narrower-range", "d-optimal"]) await expect(alternatives.getByTestId(`safe-design-alt-${kind}`)).toBeVisible();
  await expect(page.getByTestId("apply-d-optimal")).toBeVisible({ timeout: 60_000 });
  const face = alternatives.getByTestId("safe-design-alt-face-centered");
  await expect(face).toContainText("α 1.682 → 1");
  await expect(face).toContainText("17");
  await expect(face).toContainText("none");
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: testInfo.outputPath("safe-design-editor.png") });
  await panel.screenshot({ path: testInfo.outputPath("safe-design-alternatives.png") });

  // One click applies the face-centred design; the preview has nothing blocking.
  await page.getByTestId("apply-face-centered").click();
  await expect(page.getByTestId("dirty-state")).toHaveText("Unsaved changes");
  await expect(page.getByTestId("design-type")).toHaveValue("central-composite");
  await expect(panel).toContainText("no run of the design blocks now", { timeout: 30_000 });
  await upToDate(page);
  await expect(page.getByTestId("preview-summary")).toHaveText(/^17 runs/);
  await expect(page.getByTestId("preview-summary")).not.toContainText("blocking");
  await page.getByRole("tab", { name: /^Cautions/ }).click();
  await expect(page.getByTestId("preview-cautions-summary")).toContainText("Nothing blocks release");
  await expect(page.locator('[data-testid="preview-cautions-item"][data-severity="blocking"]')).toHaveCount(0);
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: testInfo.outputPath("safe-design-applied.png") });

  // The vial map of the applied design: one 24-position block per set temperature (85, 100, 115 °C), no ringed run.
  await page.getByRole("tab", { name: "Vial map" }).click();
  const map = page.getByTestId("vial-map");
  await expect(map).toBeVisible();
  await expect(map.getByRole("list", { name: "Legend: temperature groups" }).getByRole("listitem")).toHaveCount(3);
  await map.screenshot({ path: testInfo.outputPath("safe-design-vial-map.png") });

  // Saved, the plan has no blocking caution and every temperature is inside 85–115 °C.
  await page.getByTestId("save-plan").click();
  await expect(page.getByTestId("plan-saved")).toBeVisible();
  await expect(page.getByTestId("plan-cautions-list-summary")).toContainText("Nothing blocks release");
  await expect(page.locator('[data-testid="plan-cautions-list-item"][data-severity="blocking"]')).toHaveCount(0);
  const planId = page.url().replace(/\?.*$/, "").split("/").pop()!;
  const saved = await page.evaluate(async (url) => ((await (await fetch(url)).json()) as { plan: { runCount: number; runSheet: { runs: Array<{ natural: Record<string, number> }> } } }).plan, `/api/labs/${LAB}/plans/${planId}`);
  expect(saved.runCount).toBe(17);
  const temperatures = saved.runSheet.runs.map((r) => r.natural.temperature!);
  expect(Math.max(...temperatures)).toBeCloseTo(115, 6);
  expect(Math.min(...temperatures)).toBeCloseTo(85, 6);
  await page.getByTestId("plan-vial-map").screenshot({ path: testInfo.outputPath("safe-design-saved-vial-map.png") });
  // As printed: the map in print colours, without the hover panel.
  await page.emulateMedia({ media: "print" });
  await page.getByTestId("plan-vial-map").screenshot({ path: testInfo.outputPath("safe-design-saved-vial-map-print.png") });
  await page.screenshot({ path: testInfo.outputPath("safe-design-saved-plan-print.png"), fullPage: true });
  expect(violations).toEqual([]);
});
