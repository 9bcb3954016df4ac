import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { expect, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";
import { openSection } from "./support/nav";

/**
 * Studies and lab settings in the browser (Chromium): a chemist starts a study through the
 * form (a field error shows on its field first), sees it in the list and on its page with a
 * plan made through the HTTP API; the settings page is editable per role. Screenshots of
 * the studies list, the study page and the settings page are kept as test artifacts.
 */
const LAB = "/labs/kestrel-bay";
const example = JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Record<string, unknown>;

test("a chemist creates a study and sees it in the list and on its page", async ({ page }, testInfo) => {
  const name = `Suzuki screen ${randomUUID().slice(0, 6)}`;
  await signIn(page, DEMO.chemist);
  await page.getByRole("navigation", { name: "Lab sections" }).getByRole("link", { name: "Studies", exact: true }).click();
  await expect(page.getByRole("heading", { name: "Studies", exact: true })).toBeVisible();
  await page.getByTestId("new-study").click();

  await page.getByLabel("Study name").fill(name);
  await page.getByLabel("Goal (optional)").fill("Maximise assay yield of the biaryl; keep the homocoupling impurity under 2 area %.");
  await page.getByLabel("Target product (optional)").fill("KB-Biaryl-1 (invented)");
  await page.getByRole("button", { name: "Add a response" }).click();
  const second = page.getByTestId("response-1");
  await second.getByLabel("Name").fill("homocoupling");
  await second.getByLabel("Unit").fill("area %");
  await second.getByLabel("Goal").selectOption("target");
  await second.getByLabel("Target").fill("0.5");
  await page.getByTestId("create-study").click();
  // A target needs its bounds: the error shows on the field, and nothing is created.
  await expect(page.getByTestId("error-responses.1.low")).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath("study-form.png"), fullPage: true });
  await second.getByLabel("Lowest").fill("0");
  await second.getByLabel("Highest").fill("2");
  await page.getByTestId("create-study").click();

  await expect(page.getByTestId("study-name")).toHaveText(name);
  await expect(page.getByTestId("study-responses")).toContainText("homocoupling");
  await expect(page.getByTestId("study-plans-empty")).toContainText("No plans in this study yet");

  // A plan made through the HTTP API shows on the study page with its state and run count.
  const studyId = page.url().split("/").pop()!;
  const status = await page.evaluate(
    async ({ url, document }) => (await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ document }) })).status,
    { url: `/api${LAB}/studies/${studyId}/plans`, document: example },
  );
  expect(status).toBe(201);
  await page.reload();
  const row = page.getByTestId(`plan-row-${String(example.name)}`);
  await expect(row).toContainText("Draft");
  await expect(row).toContainText("18");
  await page.screenshot({ path: testInfo.outputPath("study-detail.png"), fullPage: true });

  await page.getByRole("navigation", { name: "Lab sections" }).getByRole("link", { name: "Studies", exact: true }).click();
  await page.getByTestId("study-search").fill(name);
  await expect(page.getByTestId("studies-count")).toContainText("1 study");
  await expect(page.getByTestId(`study-row-${name}`)).toContainText("homocoupling");
  await page.getByTestId("study-search").fill("");
  await expect(page.getByTestId(`study-row-${name}`)).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath("studies-list.png"), fullPage: true });
});

test("a viewer reads studies with no way to start one", async ({ page }) => {
  await signIn(page, DEMO.viewer);
  await page.goto(`${LAB}/studies`);
  await expect(page.getByRole("heading", { name: "Studies", exact: true })).toBeVisible();
  await expect(page.getByTestId("new-study")).toHaveCount(0);
  const res = await page.goto(`${LAB}/studies/new`);
  expect(res?.status()).toBe(404);
});

test("settings: lab admins edit equipment, safety officers the thresholds, chemists read", async ({ page }, testInfo) => {
  await signIn(page, DEMO.admin);
  await openSection(page, "Lab settings", "Settings");
  await expect(page.getByRole("heading", { name: "Lab settings" })).toBeVisible();
  await expect(page.getByTestId("save-vessels")).toBeVisible();
  await expect(page.getByTestId("save-thresholds")).toHaveCount(0);
  await expect(page.getByTestId("settings-thresholds")).toContainText("read only · safety officers edit this");
  // A bad value is refused on its field and nothing is saved.
  await page.getByLabel("Smallest volume pipetted").fill("-5");
  await page.getByTestId("save-dispensing").click();
  await expect(page.getByTestId("error-minPipetteVolumeUl")).toBeVisible();
  await page.getByTestId("vessel-vial-4ml-screw-septum").click();
  await page.screenshot({ path: testInfo.outputPath("settings-admin.png"), fullPage: true });

  await page.context().clearCookies();
  await signIn(page, DEMO.safety);
  await page.goto(`${LAB}/settings`);
  await expect(page.getByTestId("save-thresholds")).toBeVisible();
  await expect(page.getByTestId("save-vessels")).toHaveCount(0);

  await page.context().clearCookies();
  await signIn(page, DEMO.chemist);
  await page.goto(`${LAB}/settings`);
  await expect(page.getByTestId("settings-vessels")).toContainText("read only");
  await expect(page.getByRole("button", { name: /^Save/ })).toHaveCount(0);
  await expect(page.getByLabel("Sign-off needed from")).toBeDisabled();
  await page.screenshot({ path: testInfo.outputPath("settings-chemist.png"), fullPage: false });
});

test("a lab admin's change to the blocks is saved, kept after a reload and in the audit log as before → after", async ({ page }, testInfo) => {
  const note = `checked with a calibrated probe ${randomUUID().slice(0, 6)}`;
  await signIn(page, DEMO.admin);
  await page.goto(`${LAB}/settings`);
  const blocks = page.getByTestId("settings-blocks");
  const source = blocks.locator('[id="blocks-types.0.source"]');
  await blocks.getByTestId("block-kb-al-24").click();
  const before = await source.inputValue();
  await source.fill(`${before} ${note}`);
  await page.getByTestId("save-blocks").click();
  await expect(page.getByTestId("settings-blocks-message")).toContainText("Blocks saved");

  await page.reload();
  await blocks.getByTestId("block-kb-al-24").click();
  await expect(source).toHaveValue(`${before} ${note}`);

  // The change is audited (lib/lab-settings/server/update-lab-settings.ts): the newest entry, by the admin, with the text before → after.
  await openSection(page, "Audit log");
  const newest = page.getByTestId("audit").locator("tbody tr").first();
  await expect(newest).toContainText("Gareth Lune");
  await expect(newest).toContainText(/lab settings/i);
  await expect(newest.getByTestId("audit-changes")).toContainText(note);
  await expect(newest.getByTestId("audit-changes")).toContainText("→");
  await page.screenshot({ path: testInfo.outputPath("settings-audited.png"), fullPage: false });

  // Put the demo's text back (other tests read the demo lab's settings).
  await page.goto(`${LAB}/settings`);
  await blocks.getByTestId("block-kb-al-24").click();
  await source.fill(before);
  await page.getByTestId("save-blocks").click();
  await expect(page.getByTestId("settings-blocks-message")).toContainText("Blocks saved");
});
