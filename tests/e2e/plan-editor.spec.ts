import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { expect, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";
import { LAB, buildPlan, masses, newStudy, planCount, upToDate } from "./support/plan-editor";

/**
 * The plan editor in the browser (Chromium), against the demo lab's catalogue
 * (seeders/20261201001000-demo-inventory.cjs): a chemist builds a 3-factor Box–Behnken
 * plan from scratch, picking chemicals from the catalogue, watches amounts and cautions
 * follow a factor range, saves and finds the same plan after a reload; bad input shows on
 * its field and saves nothing; a bad import shows its problems on the fields; leaving with
 * unsaved changes asks first. Screenshots of the editor and the plan page are kept as
 * test artifacts.
 *
 * Checks and their sources:
 * - a Box–Behnken design in 3 factors has 12 edge-midpoint runs plus centre points
 *   (Box & Behnken, Technometrics 2 (1960) 455; 3 centre points is the design engine's
 *   documented default, lib/doe/design-schema.ts);
 * - a reagent's mass is n × M / assay with n = equivalents × n(limiting)
 *   (docs/chemistry.md "Definitions used for amounts"), so raising the top of its
 *   equivalents range from 3.0 to 3.5 raises its largest mass by 3.5/3.0;
 * - a run at or above the lab's sign-off temperature needs a safety officer's sign-off
 *   (the lab's default threshold 120 °C, lib/hazards/thresholds.ts).
 */
test("a chemist builds a Box–Behnken plan from the catalogue, sees amounts and cautions follow a factor range, saves and reloads it", async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  await signIn(page, DEMO.chemist);
  const studyId = await newStudy(page);
  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/new`);
  await expect(page.getByTestId("plan-editor")).toBeVisible();
  await buildPlan(page);

  await upToDate(page);
  await page.getByRole("tab", { name: "Design" }).click();
  await expect(page.getByTestId("preview-design-count")).toHaveText("15 runs");
  const baseBefore = await masses(page, "potassium");
  await page.getByRole("tab", { name: "Cautions" }).click();
  await expect(page.getByTestId("preview-cautions-signoff")).toHaveText("No sign-off needed");
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: testInfo.outputPath("plan-editor.png") });
  await page.screenshot({ path: testInfo.outputPath("plan-editor-full.png"), fullPage: true });

  // A wider range: the base's largest mass follows its equivalents, and a 140 °C run needs sign-off.
  await page.getByTestId("factor-1-high").fill("3.5");
  await page.getByTestId("factor-0-high").fill("140");
  await upToDate(page);
  await expect.poll(async () => Math.max(...(await masses(page, "potassium"))), { timeout: 20_000 }).not.toBe(Math.max(...baseBefore));
  const baseAfter = await masses(page, "potassium");
  expect(Math.max(...baseAfter) / Math.max(...baseBefore)).toBeCloseTo(3.5 / 3, 2);
  await page.getByRole("tab", { name: "Cautions" }).click();
  await expect(page.getByTestId("preview-cautions-signoff")).toHaveText("Needs a safety officer's sign-off");
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: testInfo.outputPath("plan-editor-wider-range.png") });

  // Save: the plan page shows the saved plan; after a reload it is the same plan.
  await page.getByTestId("save-plan").click();
  await expect(page.getByTestId("plan-saved")).toBeVisible();
  const planUrl = page.url().replace(/\?.*$/, "");
  await expect(page.getByTestId("plan-name")).toHaveText("Box–Behnken on temperature, base and Pd");
  await expect(page.getByTestId("plan-version")).toHaveText("version 1");
  const hash = await page.getByTestId("plan-hash").textContent();
  await page.goto(planUrl);
  await expect(page.getByTestId("plan-hash")).toHaveText(hash!);
  await expect(page.getByTestId("plan-design-table-count")).toHaveText("15 runs");
  const saved = (await page.locator('[data-testid^="plan-run-sheet-table-"][data-testid$="-potassium-mg"]').allTextContents()).map((t) => Number(t.replace(/[^\d.]/g, "")));
  expect(Math.max(...saved)).toBeCloseTo(Math.max(...baseAfter), 1);
  await expect(page.getByTestId("plan-cautions-list-signoff")).toHaveText("Needs a safety officer's sign-off");
  await expect(page.getByTestId("plan-cautions-list-notice")).toContainText("planning aids");
  await page.screenshot({ path: testInfo.outputPath("plan-page.png"), fullPage: true });

  // The editor opens the saved plan with the same values.
  await page.getByTestId("edit-plan").click();
  await expect(page.getByTestId("factor-0-high")).toHaveValue("140");
  await expect(page.getByTestId("factor-1-high")).toHaveValue("3.5");
  await expect(page.getByTestId("component-0-linked")).toContainText("4-Bromoanisole");
  await upToDate(page);
  await expect(page.getByTestId("dirty-state")).toHaveText("Saved · version 1");
});

test("bad input shows on its field, and nothing is saved", async ({ page }) => {
  await signIn(page, DEMO.chemist);
  const studyId = await newStudy(page);
  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/new`);
  await buildPlan(page);
  await upToDate(page);
  // The browser's check: a high below the low.
  await page.getByTestId("factor-2-high").fill("0.2");
  await page.getByTestId("save-plan").click();
  await expect(page.getByTestId("error-factors.2.high")).toContainText("greater than low");
  await expect(page.getByTestId("editor-message")).toContainText("Not saved");
  await expect(page.getByTestId("preview-status")).toHaveAttribute("data-status", "waiting");
  await page.getByTestId("factor-2-high").fill("2");
  // The server's check (the design engine): a fractional factorial generator naming no factor.
  await page.getByTestId("design-type").selectOption("fractional-factorial");
  await page.getByLabel("Generators").fill("C=ABZ");
  await expect(page.getByTestId("error-design.generators")).toBeVisible({ timeout: 20_000 });
  await page.getByTestId("save-plan").click();
  await expect(page.getByTestId("editor-message")).toContainText("Not saved");
  expect(await planCount(page, studyId)).toBe(0);
});

test("importing a bad plan document shows every problem on its field; a file that is not JSON changes nothing", async ({ page }) => {
  await signIn(page, DEMO.chemist);
  const studyId = await newStudy(page);
  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/new`);
  await page.getByTestId("plan-name").fill("Kept while the import fails");

  await page.getByTestId("import-file").setInputFiles({ name: "broken.json", mimeType: "application/json", buffer: Buffer.from("{ \"recipe\": ") });
  await expect(page.getByTestId("editor-message")).toContainText("Nothing imported");
  await expect(page.getByTestId("plan-name")).toHaveValue("Kept while the import fails");

  const doc = {
    name: "Imported with mistakes",
    recipe: {
      limitingReagent: "arBr",
      scaleMmol: 0.2,
      concentrationM: 0.2,
      components: [
        { id: "arBr", name: "aryl bromide", role: "reagent", formula: "C7H7BrO", form: { state: "liquid", purityWtPercent: 99 }, hazards: { ghs: ["H315", "H3l9"] } },
        { id: "base", name: "K3PO4", role: "reagent", formula: "K3PO4", equivalents: 2, form: { state: "solid" } },
      ],
      solvents: [{ name: "1,4-dioxane", volumeFraction: 1 }],
    },
    factors: [
      { name: "temperature", low: 60, high: 100, unit: "degC", binding: { kind: "temperature" } },
      { name: "baseEquiv", low: 3, high: 1.5, unit: "equiv", binding: { kind: "equivalents", component: "base" } },
    ],
    design: { design: "full-factorial", centerPoints: 2, seed: 3 },
  };
  await page.getByTestId("import-file").setInputFiles({ name: "mistakes.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(doc)) });
  await expect(page.getByTestId("editor-message")).toContainText("need attention");
  await expect(page.getByTestId("plan-name")).toHaveValue("Imported with mistakes");
  await expect(page.getByTestId("error-factors.1.high")).toContainText("greater than low");
  await expect(page.getByTestId("error-recipe.components.0.form.densityGPerMl")).toBeVisible();
  await expect(page.getByTestId("error-recipe.components.0.hazards.ghs")).toContainText("H3l9");
  expect(await planCount(page, studyId)).toBe(0);
  // The import can be undone: the plan typed before comes back.
  await page.getByRole("button", { name: "Undo the import" }).click();
  await expect(page.getByTestId("plan-name")).toHaveValue("Kept while the import fails");
});

test("leaving with unsaved changes asks first", async ({ page }) => {
  await signIn(page, DEMO.chemist);
  const studyId = await newStudy(page);
  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/new`);
  await page.getByTestId("plan-name").fill(`Unsaved ${randomUUID().slice(0, 4)}`);
  await expect(page.getByTestId("dirty-state")).toHaveText("Unsaved changes");
  // A link inside the app: held, with the choice to stay.
  await page.getByRole("navigation", { name: "Lab sections" }).getByRole("link", { name: "Studies", exact: true }).click();
  await expect(page.getByTestId("leave-dialog")).toBeVisible();
  await page.getByRole("button", { name: "Stay and keep editing" }).click();
  await expect(page.getByTestId("leave-dialog")).toHaveCount(0);
  await expect(page).toHaveURL(/\/plans\/new$/);
  // Closing the page: the browser's own prompt (beforeunload).
  const dialog = page.waitForEvent("dialog");
  await page.close({ runBeforeUnload: true });
  const d = await dialog;
  expect(d.type()).toBe("beforeunload");
  await d.dismiss();
});

test("a save over someone else's newer version is refused (409) and keeps the chemist's edits to re-apply", async ({ page }) => {
  await signIn(page, DEMO.chemist);
  const studyId = await newStudy(page);
  const example = JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Record<string, unknown>;
  const planId = await page.evaluate(
    async ({ url, document }) => ((await (await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ document }) })).json()) as { plan: { id: string } }).plan.id,
    { url: `/api/labs/${LAB}/studies/${studyId}/plans`, document: example },
  );
  await page.goto(`/labs/${LAB}/studies/${studyId}/plans/${planId}/edit`);
  await upToDate(page);
  // Someone else saves version 2 meanwhile.
  const status = await page.evaluate(
    async ({ url, document }) => (await fetch(url, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ document: { ...document, name: "Their name" }, version: 1 }) })).status,
    { url: `/api/labs/${LAB}/plans/${planId}`, document: example },
  );
  expect(status).toBe(200);
  await page.getByTestId("plan-name").fill("My name");
  await page.getByTestId("save-plan").click();
  await expect(page.getByTestId("save-conflict")).toContainText("Version 2");
  await expect(page.getByTestId("plan-name")).toHaveValue("My name");
  await page.getByRole("button", { name: "Load their version" }).click();
  await expect(page.getByTestId("plan-name")).toHaveValue("Their name");
  await page.getByRole("button", { name: "Re-apply my edits" }).click();
  await expect(page.getByTestId("plan-name")).toHaveValue("My name");
  await page.getByTestId("save-plan").click();
  await expect(page.getByTestId("plan-saved")).toBeVisible();
  await expect(page.getByTestId("plan-name")).toHaveText("My name");
  await expect(page.getByTestId("plan-version")).toHaveText("version 3");
});
