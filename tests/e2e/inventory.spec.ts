import { randomUUID } from "node:crypto";
import { expect, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";
import { openSection } from "./support/nav";

const LAB = "/labs/kestrel-bay";

test("the stockkeeper imports a CSV, finds a container by barcode and sees its ledger", async ({ page }) => {
  const tag = randomUUID().slice(0, 6).toUpperCase();
  const barcode = `E2E-${tag}-1`;
  const csv = [
    "Chemical,CAS number,Barcode,Amount,Unit,Location,Expiry",
    `Sodium chloride,7647-14-5,${barcode},250.5,g,E2E shelf ${tag},2028-06-30`,
    `"Lithium chloride, 0.5 M in THF",7447-41-8,E2E-${tag}-2,100,mL,E2E shelf ${tag},`,
  ].join("\n");

  await signIn(page, DEMO.stockkeeper);
  await openSection(page, "Containers", "Inventory");
  await page.getByRole("link", { name: "Import CSV" }).click();
  await expect(page.getByRole("heading", { name: "Import containers from CSV" })).toBeVisible();
  await page.getByTestId("import-file").setInputFiles({ name: "containers.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
  await expect(page.getByTestId("import-rows")).toContainText(barcode);
  await expect(page.getByTestId("import-rows")).toContainText("250.5 g");
  await page.getByTestId("import-confirm").click();
  await expect(page.getByTestId("import-done")).toContainText("Imported 2 containers");

  await openSection(page, "Containers", "Inventory");
  await page.getByTestId("container-search").fill(barcode);
  await expect(page.getByTestId("containers-count")).toContainText("1 container");
  await expect(page.getByTestId(`container-${barcode}`)).toContainText("Sodium chloride");
  await page.getByTestId(`open-${barcode}`).click();

  await expect(page.getByTestId("container-heading")).toContainText(barcode);
  await expect(page.getByTestId("container-amount")).toHaveText("250.5 g");
  const ledger = page.getByTestId("ledger");
  await expect(ledger).toContainText("Imported");
  await expect(ledger).toContainText("Imported from CSV (row 1)");
  await expect(ledger).toContainText("250.5 g");
});

test("a bad CSV is refused with row and column named, and nothing is imported", async ({ page }) => {
  const csv = ["Name,CAS,Barcode,Amount,Unit", "Mystery,7732-18-4,E2E-BAD-1,5,g", "Negative,7732-18-5,E2E-BAD-2,-5,g"].join("\n");
  await signIn(page, DEMO.stockkeeper);
  await page.goto(`${LAB}/inventory/import`);
  await page.getByTestId("import-file").setInputFiles({ name: "bad.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
  const issues = page.getByTestId("import-issues");
  await expect(issues).toContainText("check digit should be 5");
  await expect(issues).toContainText("negative");
  await expect(page.getByTestId("import-confirm")).toBeDisabled();
  await page.goto(`${LAB}/inventory/containers`);
  await page.getByTestId("container-search").fill("E2E-BAD");
  await expect(page.getByTestId("containers-empty")).toBeVisible();
});

test("a viewer reads stock but has no manage controls, and the server refuses changes", async ({ page }) => {
  await signIn(page, DEMO.viewer);
  await page.goto(`${LAB}/inventory/containers`);
  await expect(page.getByTestId("container-KB-000101")).toBeVisible();
  await expect(page.getByRole("link", { name: "Import CSV" })).toHaveCount(0);
  await expect(page.getByText("Receive a container")).toHaveCount(0);
  const res = await page.request.post(`/api${LAB}/reservations`, { data: { planRef: "viewer", lines: [{ containerId: "c0a10000-0000-4000-8000-000000000001", amount: "1", unit: "mL" }] } });
  expect(res.status()).toBe(403);
  const page404 = await page.goto(`${LAB}/inventory/import`);
  expect(page404?.status()).toBe(404);
});
