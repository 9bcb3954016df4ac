import type { Page } from "@playwright/test";

/**
 * Opens a lab section through the header (lib/navigation.ts): a top-level link, or a link
 * inside one of the header's menus ("Inventory", "Settings").
 */
export async function openSection(page: Page, label: string, menu?: string): Promise<void> {
  const nav = page.getByRole("navigation", { name: "Lab sections" });
  if (menu) await nav.getByRole("button", { name: menu }).click();
  await nav.getByRole("link", { name: label, exact: true }).click();
}
