import { randomUUID } from "node:crypto";
import { expect, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";
import { addChemical, openEdit } from "./support/chemicals";
import { openSection } from "./support/nav";

const LAB = "/labs/kestrel-bay";

test("the audit log shows readable changes and filters by record and by person, on the server", async ({ page }) => {
  const name = `E2E audit ${randomUUID().slice(0, 6)}`;
  await signIn(page, DEMO.admin);
  await page.goto(`${LAB}/inventory/chemicals`);
  await addChemical(page, { name, notes: "cold room" });
  const dialog = await openEdit(page, name);
  await dialog.locator("#edit-notes").fill("freezer −20 °C");
  await dialog.getByRole("button", { name: "Save changes" }).click();
  await expect(page.getByText(`${name} saved.`)).toBeVisible();

  await openSection(page, "Audit log");
  const table = page.getByTestId("audit");
  const newest = table.locator("tbody tr").first();
  await expect(newest).toContainText("Chemical updated");
  await expect(newest).toContainText(name);
  await expect(newest).toContainText("Gareth Lune");
  // field: before → after, only what changed, no raw JSON.
  const changes = newest.getByTestId("audit-changes");
  await expect(changes.locator("li")).toHaveCount(1);
  await expect(changes).toContainText("storage notes:");
  await expect(changes).toContainText("cold room");
  await expect(changes).toContainText("freezer −20 °C");
  await expect(changes).toContainText("→");
  await expect(table).not.toContainText("{");

  const results = page.getByTestId("audit-results");
  /** Chooses a filter and waits for the server's page of entries to be shown. */
  const filter = async (testId: string, option: string | { label: string }, param: RegExp) => {
    const answered = page.waitForResponse((r) => r.url().includes("/api/labs/kestrel-bay/audit?") && param.test(r.url()));
    await page.getByTestId(testId).selectOption(option);
    expect((await answered).status()).toBe(200);
    await expect(results).toHaveAttribute("aria-busy", "false");
  };

  // By record: every entry is a chemical's; the filter is in the address and survives a reload.
  await filter("audit-filter-entity", "chemical", /entity=chemical/);
  await expect(page).toHaveURL(/entity=chemical/);
  await expect(table.locator("tbody tr").first()).toContainText(name);
  for (const what of await table.locator("tbody tr td:nth-child(3)").allTextContents()) expect(what).toMatch(/^Chemical /);

  await filter("audit-filter-actor", { label: "Gareth Lune" }, /actor=user%3A/);
  await expect(page).toHaveURL(/actor=user%3A/);
  await expect(table.locator("tbody tr").first()).toContainText(name);
  for (const who of await table.locator("tbody tr td:nth-child(2)").allTextContents()) expect(who).toBe("Gareth Lune");

  await page.reload();
  await expect(page.getByTestId("audit-filter-entity")).toHaveValue("chemical");
  await expect(table.locator("tbody tr").first()).toContainText(name);

  // Another person's entries exclude the admin's (the demo chemist: the demo steps act as her, so she is always in the log).
  await filter("audit-filter-actor", { label: "Ines Marlowe" }, /actor=user%3A/);
  await expect(results).not.toContainText(name);
  for (const who of await table.locator("tbody tr td:nth-child(2)").allTextContents()) expect(who).toBe("Ines Marlowe");
  await page.getByRole("button", { name: "Clear filters" }).click();
  await expect(page).not.toHaveURL(/entity=/);
});

test("the audit log pages on the server", async ({ page }) => {
  await signIn(page, DEMO.viewer);
  await page.goto(`${LAB}/audit?pageSize=1`);
  const count = page.getByTestId("audit-count");
  await expect(count).toContainText(/^1–1 of \d+ entries · page 1 of \d+/);
  const total = Number(/of (\d+) entries/.exec((await count.textContent()) ?? "")![1]);
  expect(total).toBeGreaterThan(1);
  const first = await page.getByTestId("audit").locator("tbody tr").first().getAttribute("data-testid");
  const next = page.waitForResponse((r) => r.url().includes("/api/labs/kestrel-bay/audit?") && r.url().includes("page=2"));
  await page.getByRole("button", { name: "Next" }).click();
  expect((await next).status()).toBe(200);
  await expect(count).toContainText(`2–2 of ${total} entries · page 2 of ${total}`);
  // The count follows the page at once; the rows follow when page 2's answer has rendered.
  await expect(page.getByTestId("audit").locator("tbody tr").first()).not.toHaveAttribute("data-testid", first!);
  await expect(page.getByRole("button", { name: "Previous" })).toBeEnabled();
});

test("a chemist cannot open the audit log (404)", async ({ page }) => {
  await signIn(page, DEMO.chemist);
  expect((await page.goto(`${LAB}/audit`))?.status()).toBe(404);
});
