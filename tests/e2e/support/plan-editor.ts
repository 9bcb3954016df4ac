import { expect, type Page } from "@playwright/test";

/** Helpers of the plan editor's browser tests (tests/e2e/plan-editor.spec.ts). */
export const LAB = "kestrel-bay";

export async function newStudy(page: Page): Promise<string> {
  const res = await page.evaluate(async (url) => {
    const r = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name: `Editor study ${Math.random().toString(36).slice(2, 8)}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }) });
    return (await r.json()) as { study: { id: string } };
  }, `/api/labs/${LAB}/studies`);
  return res.study.id;
}

export async function planCount(page: Page, studyId: string): Promise<number> {
  return page.evaluate(async (url) => ((await (await fetch(url)).json()) as { plans: unknown[] }).plans.length, `/api/labs/${LAB}/studies/${studyId}`);
}

/** Picks a chemical of the catalogue into the component card `i`. */
export async function pick(page: Page, i: number, search: string, name: string) {
  const card = page.getByTestId(`component-${i}`);
  await card.getByTestId(`component-${i}-pick`).fill(search);
  await card.getByRole("option", { name: new RegExp(`^${name.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}`) }).click();
  await expect(card.getByTestId(`component-${i}-linked`)).toContainText(name);
}

export async function upToDate(page: Page) {
  await expect(page.getByTestId("preview-status")).toHaveAttribute("data-status", "ready", { timeout: 20_000 });
}

/** The masses (mg) of one component in every run of the preview's run sheet. */
export async function masses(page: Page, id: string): Promise<number[]> {
  await page.getByRole("tab", { name: "Run sheet" }).click();
  const cells = page.locator(`[data-testid^="preview-run-sheet-"][data-testid$="-${id}-mg"]`);
  await expect(cells.first()).toBeVisible();
  return (await cells.allTextContents()).map((t) => Number(t.replace(/[^\d.]/g, "")));
}

export async function buildPlan(page: Page) {
  await page.getByTestId("plan-name").fill("Box–Behnken on temperature, base and Pd");
  // Components from the catalogue: the aryl bromide (limiting), the boronic acid, the base, the precatalyst.
  await pick(page, 0, "bromoanisole", "4-Bromoanisole");
  await expect(page.getByTestId("component-0-limiting")).toBeVisible();
  await page.getByTestId("add-component").click();
  await pick(page, 1, "boronic", "Pyridin-3-ylboronic acid");
  await page.getByTestId("component-1-equivalents").fill("1.3");
  await page.getByTestId("add-component").click();
  await pick(page, 2, "phosphate", "Potassium phosphate tribasic");
  await page.getByTestId("component-2-equivalents").fill("2");
  await page.getByTestId("add-component").click();
  await pick(page, 3, "XPhos Pd", "XPhos Pd G3");
  await page.getByTestId("component-3").getByLabel("Role").selectOption("catalyst");
  // Solvents: 1,4-dioxane / water 4:1.
  await page.getByTestId("solvent-0-name").fill("1,4-dioxane");
  await page.getByTestId("solvent-0-fraction").fill("0.8");
  await page.getByTestId("add-solvent").click();
  await page.getByTestId("solvent-1-name").fill("water");
  await page.getByTestId("solvent-1-fraction").fill("0.2");
  // Three factors: temperature, base equivalents, Pd loading.
  await page.getByTestId("add-factor").click();
  await page.getByTestId("factor-0-low").fill("60");
  await page.getByTestId("factor-0-high").fill("100");
  await page.getByTestId("add-factor").click();
  await page.getByTestId("factor-1-drives").selectOption({ label: "Equivalents of Potassium phosphate tribasic" });
  await page.getByTestId("factor-1-low").fill("1.5");
  await page.getByTestId("factor-1-high").fill("3");
  await page.getByTestId("add-factor").click();
  await page.getByTestId("factor-2-drives").selectOption({ label: "Loading (mol % of metal) of XPhos Pd G3" });
  await page.getByTestId("factor-2-low").fill("0.5");
  await page.getByTestId("factor-2-high").fill("2");
  await expect(page.getByTestId("design-type")).toHaveValue("box-behnken");
}

