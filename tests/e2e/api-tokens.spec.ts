import { randomUUID } from "node:crypto";
import { expect, request as playwrightRequest, test } from "@playwright/test";
import { DEMO, signIn } from "./support/auth";
import { openSection } from "./support/nav";

const LAB = "/labs/kestrel-bay";

/**
 * A lab admin creates an API token in the browser, sees its secret once, and a script uses
 * it against the running server (Authorization: Bearer); the change it makes is in the
 * audit log under the token's name; once revoked it is refused.
 */
test("create a token, use it from a script, find its change in the audit log, revoke it", async ({ page, baseURL }) => {
  const name = `E2E pipeline ${randomUUID().slice(0, 6)}`;
  await signIn(page, DEMO.admin);
  await openSection(page, "API tokens", "Settings");
  await expect(page.getByRole("heading", { name: "API tokens", level: 1 })).toBeVisible();
  await page.getByLabel("Name").fill(name);
  await page.getByLabel("Role").selectOption("stockkeeper");
  await page.getByLabel("Expires after").selectOption("30");
  await page.getByRole("button", { name: "Create token" }).click();
  const secret = ((await page.getByTestId("token-secret").textContent()) ?? "").trim();
  expect(secret).toMatch(/^trl_[A-Za-z0-9_-]{43}$/);
  const row = page.getByTestId(`token-${name}`);
  await expect(row).toContainText("Stockkeeper");
  await expect(row).toContainText(secret.slice(0, 12));
  await expect(row).toContainText("never");
  await page.getByRole("button", { name: "I have copied it" }).click();
  await expect(page.getByTestId("token-secret")).toHaveCount(0);
  // The secret is nowhere on the page once dismissed, nor after a reload.
  await page.reload();
  await expect(page.locator("body")).not.toContainText(secret);

  const script = await playwrightRequest.newContext({ baseURL, extraHTTPHeaders: { Authorization: `Bearer ${secret}` } });
  expect((await script.get(`/api${LAB}/containers`)).status()).toBe(200);
  const shelf = `E2E token shelf ${randomUUID().slice(0, 6)}`;
  const made = await script.post(`/api${LAB}/locations`, { data: { name: shelf } });
  expect(made.status()).toBe(201);
  expect((await script.get("/api/labs/harrow-fen/containers")).status()).toBe(404);
  expect((await script.post(`/api${LAB}/tokens`, { data: { name: "from a script", role: "viewer", expiresInDays: 7 } })).status()).toBe(403);

  await page.reload();
  await expect(page.getByTestId(`token-${name}`)).toContainText("UTC");
  await expect(page.getByTestId(`token-${name}`)).not.toContainText("never");

  await openSection(page, "Audit log");
  await page.getByTestId("audit-filter-actor").selectOption({ label: `API token “${name}”` });
  const entry = page.getByTestId("audit").locator("tbody tr").first();
  await expect(entry).toContainText("Location created");
  await expect(entry).toContainText(shelf);
  await expect(entry.getByTestId("audit-token-actor")).toContainText(name);
  await expect(entry.getByTestId("audit-token-actor")).toContainText("for Gareth Lune");

  await openSection(page, "API tokens", "Settings");
  page.once("dialog", (d) => void d.accept());
  await page.getByTestId(`revoke-${name}`).click();
  await expect(page.getByTestId(`token-${name}`)).toContainText("revoked");
  const refused = await script.get(`/api${LAB}/containers`);
  expect(refused.status()).toBe(401);
  expect(((await refused.json()) as { error: { code: string } }).error.code).toBe("unauthenticated");
  await script.dispose();
});

test("a bad token name is shown on its field; members other than lab admins cannot open the page", async ({ page }) => {
  await signIn(page, DEMO.admin);
  await page.goto(`${LAB}/settings/tokens`);
  await page.getByRole("button", { name: "Create token" }).click();
  await expect(page.getByTestId("error-token-name")).toContainText("give the token a name");
  await expect(page.getByTestId("token-secret")).toHaveCount(0);

  await page.context().clearCookies();
  await signIn(page, DEMO.stockkeeper);
  expect((await page.goto(`${LAB}/settings/tokens`))?.status()).toBe(404);
  // The settings overview is read-only for them (lib/lab-settings), with no link to the tokens.
  expect((await page.goto(`${LAB}/settings`))?.status()).toBe(200);
  await expect(page.getByRole("link", { name: "API tokens" })).toHaveCount(0);
});
