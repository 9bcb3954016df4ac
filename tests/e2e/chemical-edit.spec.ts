import { randomUUID } from "node:crypto";
import { expect, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";
import { addChemical, openEdit } from "./support/chemicals";

const LAB = "/labs/kestrel-bay";

test("a stockkeeper edits a chemical in the browser: only the changed fields are sent, the rest stays", async ({ page }) => {
  const name = `E2E solvent ${randomUUID().slice(0, 6)}`;
  await signIn(page, DEMO.stockkeeper);
  await page.goto(`${LAB}/inventory/chemicals`);
  // 2-Methyltetrahydrofuran, CAS 96-47-9 (check digit by hand: 7·1 + 4·2 + 6·3 + 9·4 = 69, so 9), M = 86.13 g/mol for C5H10O (from memory).
  await addChemical(page, { name, cas: "96-47-9", molarMass: "86.13", ghs: "H225 H302", state: "liquid" });

  const dialog = await openEdit(page, name);
  await expect(dialog.locator("#edit-cas")).toHaveValue("96-47-9");
  await expect(dialog.locator("#edit-mm")).toHaveValue("86.13");
  await dialog.locator("#edit-notes").fill("flammables cabinet F2");
  await dialog.locator("#edit-ghs").fill("H225 H302 EUH019");
  const patch = page.waitForRequest((r) => r.method() === "PATCH" && r.url().includes("/chemicals/"));
  await dialog.getByRole("button", { name: "Save changes" }).click();
  const sent = (await patch).postDataJSON() as Record<string, unknown>;
  expect(Object.keys(sent).filter((k) => k !== "version").sort()).toEqual(["ghsStatements", "storageNotes"]);
  expect(sent.storageNotes).toBe("flammables cabinet F2");

  await expect(dialog).toBeHidden();
  await expect(page.getByText(`${name} saved.`)).toBeVisible();
  const row = page.getByTestId("chemicals").getByRole("row").filter({ hasText: name });
  await expect(row).toContainText("EUH019");
  // EUH019 marks a peroxide former; with no class given it is shown as such (the caution rules
  // then use the shortest interval), and the CAS number and molar mass are unchanged.
  await expect(row).toContainText("peroxide, class not given");
  await expect(row).toContainText("96-47-9");
  await expect(row).toContainText("86.13");

  // Reopened, the form shows the saved record; a change of the notes alone leaves the rest as it was.
  const again = await openEdit(page, name);
  await expect(again.locator("#edit-notes")).toHaveValue("flammables cabinet F2");
  await again.locator("#edit-notes").fill("flammables cabinet F3");
  const second = page.waitForRequest((r) => r.method() === "PATCH" && r.url().includes("/chemicals/"));
  await again.getByRole("button", { name: "Save changes" }).click();
  expect(Object.keys((await second).postDataJSON() as object).filter((k) => k !== "version")).toEqual(["storageNotes"]);
  await expect(again).toBeHidden();
  await expect(row).toContainText("H225 H302 EUH019");
  const third = await openEdit(page, name);
  await expect(third.locator("#edit-state")).toHaveValue("liquid");
  await expect(third.locator("#edit-ghs")).toHaveValue("H225 H302 EUH019");
  await expect(third.locator("#edit-notes")).toHaveValue("flammables cabinet F3");
  await third.getByRole("button", { name: "Cancel" }).click();
  await expect(third).toBeHidden();
});

test("bad input in the edit form is shown on its field and nothing is saved", async ({ page }) => {
  const name = `E2E solid ${randomUUID().slice(0, 6)}`;
  await signIn(page, DEMO.stockkeeper);
  await page.goto(`${LAB}/inventory/chemicals`);
  await addChemical(page, { name, molarMass: "58.44" });
  const dialog = await openEdit(page, name);
  await dialog.locator("#edit-mm").fill("-3");
  await dialog.locator("#edit-cas").fill("7647-14-4");
  await dialog.getByRole("button", { name: "Save changes" }).click();
  await expect(dialog.getByTestId("error-edit-mm")).toContainText("greater than zero");
  await expect(dialog.getByTestId("error-edit-cas")).toBeVisible();
  await page.keyboard.press("Escape");
  await expect(page.getByTestId("chemicals").getByRole("row").filter({ hasText: name })).toContainText("58.44");
});

test("someone else's change in the meantime is a conflict: the form says so and reloads the newer record", async ({ page, browser }) => {
  const name = `E2E shared ${randomUUID().slice(0, 6)}`;
  await signIn(page, DEMO.stockkeeper);
  await page.goto(`${LAB}/inventory/chemicals`);
  await addChemical(page, { name, notes: "shelf 1" });
  const mine = await openEdit(page, name);

  // A lab admin, in another browser, changes the same chemical first.
  const other = await browser.newContext();
  const theirs = await other.newPage();
  await signIn(theirs, DEMO.admin);
  await theirs.goto(`${LAB}/inventory/chemicals`);
  const theirDialog = await openEdit(theirs, name);
  await theirDialog.locator("#edit-notes").fill("shelf 2 (moved by the admin)");
  await theirDialog.getByRole("button", { name: "Save changes" }).click();
  await expect(theirs.getByText(`${name} saved.`)).toBeVisible();
  await other.close();

  await mine.locator("#edit-notes").fill("shelf 3");
  await mine.getByRole("button", { name: "Save changes" }).click();
  await expect(mine.getByTestId("chemical-edit-problem")).toContainText("Someone else changed this chemical");
  await mine.getByRole("button", { name: "Reload" }).click();
  await expect(page.getByTestId("chemical-edit").locator("#edit-notes")).toHaveValue("shelf 2 (moved by the admin)");
});

test("a chemist sees the catalogue without edit controls", async ({ page }) => {
  await signIn(page, DEMO.chemist);
  await page.goto(`${LAB}/inventory/chemicals`);
  await expect(page.getByTestId("chemicals")).toBeVisible();
  await expect(page.getByRole("button", { name: /^Edit / })).toHaveCount(0);
});
