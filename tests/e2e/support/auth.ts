import { expect, type Page } from "@playwright/test";

/** The demo accounts (seeders/20261201000100-demo-labs-and-members.cjs); password from README.md. */
export const DEMO_PASSWORD = "tareline-demo";
export const DEMO = {
  chemist: "chemist@kestrelbay.example",
  safety: "safety@kestrelbay.example",
  stockkeeper: "stock@kestrelbay.example",
  admin: "admin@kestrelbay.example",
  viewer: "viewer@kestrelbay.example",
  harrow: "analyst@harrowfen.example",
} as const;

/** Signs in through the form and waits for the lab overview. */
export async function signIn(page: Page, email: string, password: string = DEMO_PASSWORD): Promise<void> {
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("lab-name")).toBeVisible();
}
