import { expect, type Page } from "@playwright/test";

/** Adds a chemical through the catalogue's "Add a chemical" form (the page must be the chemicals page). */
export async function addChemical(page: Page, fields: { name: string; cas?: string; molarMass?: string; ghs?: string; notes?: string; state?: "solid" | "liquid" | "gas" | "solution" }): Promise<void> {
  await page.getByText("Add a chemical").click();
  await page.locator("#ch-name").fill(fields.name);
  if (fields.cas) await page.locator("#ch-cas").fill(fields.cas);
  if (fields.molarMass) await page.locator("#ch-mm").fill(fields.molarMass);
  if (fields.ghs) await page.locator("#ch-ghs").fill(fields.ghs);
  if (fields.notes) await page.locator("#ch-notes").fill(fields.notes);
  if (fields.state) await page.locator("#ch-state").selectOption(fields.state);
  await page.getByRole("button", { name: "Add chemical" }).click();
  await expect(page.getByText(`${fields.name} added to the catalogue.`)).toBeVisible();
}

/** Opens the edit dialog of one chemical of the list. */
export async function openEdit(page: Page, name: string) {
  await page.getByLabel("Filter chemicals").fill(name);
  await page.getByRole("button", { name: `Edit ${name}` }).click();
  const dialog = page.getByTestId("chemical-edit");
  await expect(dialog).toBeVisible();
  return dialog;
}
