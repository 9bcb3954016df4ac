import { execFileSync } from "node:child_process";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { expect, test, type Browser, type Page } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";

/**
 * Issue 11 in the browser: a chemist submits a plan that a rule of the lab flags, the
 * safety officer finds it in the review queue and signs it on the review page (the
 * meaning shown before signing, the password entered again), the chemist releases it —
 * stock reserved — and downloads the prep sheet and the worklist. The PDF is read with
 * Debian's poppler tools (pdftotext for its text, pdftoppm for a picture of page 1),
 * outside the app: it must be a PDF holding the plan's name and a dispense row.
 * Screenshots of the queue, the review page (before and after signing), the released plan
 * page and the PDF's first page (pdftoppm, 100 dpi) are kept as artifacts in this test's
 * Playwright output folder (test-results/<test>/), with the PDF and the CSV.
 *
 * The plan is the demo's Suzuki–Miyaura screen (examples/plan-suzuki.json) run up to
 * 110 °C — sealed above 1,4-dioxane's boiling point, so sign-off is required — with its
 * base and dioxane taken from the demo inventory (seeders/20261201001000-demo-inventory.cjs).
 */
const LAB = "kestrel-bay";
const K3PO4 = "c4e10000-0000-4000-8000-000000000005"; // Potassium phosphate tribasic: KB-000501 (500 g), …
const DIOXANE = "c4e10000-0000-4000-8000-000000000006"; // 1,4-Dioxane: KB-000601 (1 L), KB-000602 (2.5 L)

function planDocument(name: string): Record<string, unknown> {
  const doc = JSON.parse(readFileSync(join(process.cwd(), "examples/plan-suzuki.json"), "utf8")) as {
    name: string;
    factors: Array<Record<string, unknown>>;
    recipe: { components: Array<Record<string, unknown>>; solvents: Array<Record<string, unknown>> };
  };
  doc.name = name;
  doc.factors[0]!.high = 110;
  for (const c of doc.recipe.components) if (c.id === "base") c.chemicalId = K3PO4;
  for (const s of doc.recipe.solvents) if (s.name === "1,4-dioxane") s.chemicalId = DIOXANE;
  return doc;
}

async function session(browser: Browser, email: string): Promise<Page> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, email);
  return page;
}

/** pdftotext / pdftoppm from poppler-utils (installed by scripts/test.mjs). */
function poppler(tool: "pdftotext" | "pdftoppm", args: string[]): string {
  return execFileSync(`/usr/bin/${tool}`, args, { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
}

test("a chemist submits, the safety officer signs in the queue, the chemist releases and downloads the prep sheet and the worklist", async ({ browser }, testInfo) => {
  test.setTimeout(180_000);
  const name = `E2E review ${Date.now().toString(36)}`;
  const chemist = await session(browser, DEMO.chemist);

  // The chemist's plan, made through the API the editor also uses.
  const study = await chemist.request.post(`/api/labs/${LAB}/studies`, { data: { name: `${name} study`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] } });
  expect(study.status()).toBe(201);
  const studyId = ((await study.json()) as { study: { id: string } }).study.id;
  const created = await chemist.request.post(`/api/labs/${LAB}/studies/${studyId}/plans`, { data: { document: planDocument(name) } });
  expect(created.status()).toBe(201);
  const plan = ((await created.json()) as { plan: { id: string; signOffRequired: boolean; runSheet: { runs: Array<{ run: number; runOrder: number; temperatureC: number; dispense: Array<{ kind: string; massMg: number | null; volumeUl: number | null }> }> } } }).plan;
  expect(plan.signOffRequired).toBe(true);
  const planUrl = `/labs/${LAB}/studies/${studyId}/plans/${plan.id}`;

  // Release is not offered while sign-off is missing; submit is.
  await chemist.goto(planUrl);
  const actions = chemist.getByTestId("plan-state-actions");
  await expect(actions.getByTestId("plan-release")).toBeDisabled();
  await expect(actions).toContainText("sign-off");
  await actions.getByTestId("plan-submit").click();
  await expect(chemist.getByTestId("plan-state-result")).toContainText("Submitted");
  await expect(chemist.getByTestId("plan-state")).toContainText("In review");

  // The safety officer: Review in the header, the plan in the queue, its review page.
  const safety = await session(browser, DEMO.safety);
  await safety.getByRole("navigation", { name: "Lab sections" }).getByRole("link", { name: "Review" }).click();
  await expect(safety).toHaveURL(new RegExp(`/labs/${LAB}/review$`));
  const row = safety.getByTestId("review-queue-row").filter({ hasText: name });
  await expect(row).toHaveCount(1);
  await expect(row).toContainText("Ines Marlowe");
  await expect(safety.getByTestId("planning-notice")).toContainText("planning aids");
  await safety.screenshot({ path: testInfo.outputPath("review-queue.png"), fullPage: true });
  await row.getByTestId("review-queue-link").click();
  await expect(safety).toHaveURL(new RegExp(`/review/${plan.id}$`));
  await expect(safety.getByTestId("review-cautions")).toContainText("TL-V01");
  await expect(safety.getByTestId("pressure-row")).toHaveCount(plan.runSheet.runs.length);
  await expect(safety.getByRole("region", { name: "Vial map" })).toBeVisible();
  await expect(safety.getByTestId("changes-first-review")).toBeVisible();
  await safety.screenshot({ path: testInfo.outputPath("review-page.png"), fullPage: true });

  // The sign dialog: the meaning is shown before signing; a wrong password is named on the field.
  await safety.getByTestId("open-sign-dialog").click();
  await safety.getByTestId("decision-approve").check();
  await expect(safety.getByTestId("sign-meaning")).toContainText("approved for execution as planned");
  await safety.getByLabel("Comment (optional)").fill("Blast shield on; vent after cooling.");
  await safety.getByLabel("Your password").fill("not-my-password");
  await safety.getByTestId("sign-submit").click();
  await expect(safety.getByTestId("error-password")).toBeVisible();
  await safety.getByLabel("Your password").fill("tareline-demo");
  await safety.getByTestId("sign-submit").click();
  await expect(safety.getByTestId("sign-result")).toContainText("approved for execution as planned");
  await expect(safety.getByTestId("review-not-waiting")).toContainText("approved");
  await expect(safety.getByTestId("open-sign-dialog")).toHaveCount(0);
  await safety.screenshot({ path: testInfo.outputPath("review-signed.png"), fullPage: true });

  // Back to the chemist: the signature is valid, release reserves the stock.
  await chemist.reload();
  await expect(chemist.getByTestId("signature-validity")).toHaveText("Valid");
  await expect(chemist.getByTestId("signature-meaning")).toContainText("Approved for execution as planned");
  await chemist.getByTestId("plan-release").click();
  await expect(chemist.getByTestId("plan-state-result")).toContainText("Released");
  await expect(chemist.getByTestId("plan-state")).toContainText("Released");
  await expect(chemist.getByTestId("timeline")).toContainText("Signed: approved for execution as planned");
  await expect(chemist.getByTestId("timeline")).toContainText("Reserved stock");
  // The stock now held for it: the base and the dioxane, each from one container.
  await expect(chemist.getByTestId("plan-reservation")).toHaveCount(2);
  await expect(chemist.getByTestId("plan-reservations")).toContainText("Potassium phosphate tribasic");
  await expect(chemist.getByTestId("plan-reservations")).toContainText("1,4-Dioxane");
  await chemist.screenshot({ path: testInfo.outputPath("plan-released.png"), fullPage: true });

  // The prep sheet: a PDF whose text holds the plan's name and the first vial's first dispense row.
  const [pdfDownload] = await Promise.all([chemist.waitForEvent("download"), chemist.getByTestId("download-prep-sheet").click()]);
  const pdfPath = testInfo.outputPath("prep-sheet.pdf");
  await pdfDownload.saveAs(pdfPath);
  const pdf = readFileSync(pdfPath);
  expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
  const text = poppler("pdftotext", ["-layout", "-enc", "UTF-8", pdfPath, "-"]);
  expect(text.replace(/\s+/g, " ")).toContain(name);
  // By the vial-map rule (lib/plans/vial-map.ts): block 1, A1 holds the earliest run in run order at the lowest temperature.
  const coldest = Math.min(...plan.runSheet.runs.map((r) => r.temperatureC));
  const first = plan.runSheet.runs.filter((r) => r.temperatureC === coldest).sort((a, b) => a.runOrder - b.runOrder)[0]!;
  const d = first.dispense[0]!;
  const v = d.kind === "solid" ? d.massMg! : d.volumeUl!;
  const amount = `${v < 10 ? v.toFixed(2) : v < 100 ? v.toFixed(1) : v.toFixed(0)} ${d.kind === "solid" ? "mg" : "µL"}`;
  expect(text).toMatch(new RegExp(`\\n\\s*1:A1\\s+${first.run}\\s+${amount.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}\\s*\\n`));
  const png = testInfo.outputPath("prep-sheet-page-1");
  mkdirSync(dirname(png), { recursive: true });
  poppler("pdftoppm", ["-f", "1", "-l", "1", "-r", "100", "-png", "-singlefile", pdfPath, png]);
  expect(readFileSync(`${png}.png`).subarray(1, 4).toString("latin1")).toBe("PNG");

  // The worklist: one row per dispense step of every vial.
  const [csvDownload] = await Promise.all([chemist.waitForEvent("download"), chemist.getByTestId("download-worklist").click()]);
  const csvPath = testInfo.outputPath("worklist.csv");
  await csvDownload.saveAs(csvPath);
  const lines = readFileSync(csvPath, "utf8").trim().split(/\r\n/);
  expect(lines[0]).toBe("order,step,block,vial position,vial,run,add,amount,unit,from,source");
  expect(lines).toHaveLength(1 + plan.runSheet.runs.reduce((a, r) => a + r.dispense.length, 0));
  writeFileSync(testInfo.outputPath("artifacts.txt"), "review-queue.png, review-page.png, review-signed.png, plan-released.png, prep-sheet.pdf, prep-sheet-page-1.png, worklist.csv\n");

  // The released plan holds stock for its base and dioxane.
  const after = (await (await chemist.request.get(`/api/labs/${LAB}/plans/${plan.id}`)).json()) as { plan: { state: string; reservations: Array<{ chemicalId: string; status: string }> } };
  expect(after.plan.state).toBe("released");
  expect(new Set(after.plan.reservations.filter((r) => r.status === "held").map((r) => r.chemicalId))).toEqual(new Set([K3PO4, DIOXANE]));
});

test("the review queue and review page are for safety officers; a chemist gets a 404", async ({ page }) => {
  await signIn(page, DEMO.chemist);
  expect((await page.goto(`/labs/${LAB}/review`))?.status()).toBe(404);
  await expect(page.getByRole("navigation", { name: "Lab sections" }).getByRole("link", { name: "Review" })).toHaveCount(0);
});
