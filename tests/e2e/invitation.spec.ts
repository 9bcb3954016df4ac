import { expect, test } from "@playwright/test";
import { SMTPServer } from "smtp-server";
import { DEMO, signIn } from "./support/auth";
import { openSection } from "./support/nav";

/**
 * A lab admin invites someone; the app queues the e-mail, the job worker delivers it to an
 * in-test SMTP server on the port the worker was started with (E2E_SMTP_PORT, set by
 * scripts/test.mjs); its link lets the invitee set a password and sign in.
 */
const received: string[] = [];
let server: SMTPServer;

test.beforeAll(async () => {
  server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    onData(stream, _session, callback) {
      let raw = "";
      stream.on("data", (c: Buffer) => (raw += c.toString("utf8")));
      stream.on("end", () => {
        received.push(raw);
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(Number(process.env.E2E_SMTP_PORT), "127.0.0.1", resolve));
});

test.afterAll(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

test("an invitation e-mail arrives and its link lets the invitee join and sign in", async ({ page }) => {
  const email = `new.chemist.${Date.now()}@kestrelbay.example`;
  await signIn(page, DEMO.admin);
  await openSection(page, "Members", "Settings");
  await page.getByLabel("E-mail", { exact: true }).fill(email);
  await page.getByLabel("Role", { exact: true }).selectOption("chemist");
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByTestId("invite-result")).toContainText(`Invitation sent to ${email}`);

  await expect.poll(() => received.find((m) => m.includes(email)), { timeout: 15_000 }).toBeTruthy();
  const message = received.find((m) => m.includes(email))!.replace(/=\r?\n/g, "");
  const link = message.match(/https?:\/\/[^\s]+\/invite\/[A-Za-z0-9_-]+/)?.[0];
  expect(link, "the message carries an invitation link").toBeTruthy();

  await page.context().clearCookies();
  await page.goto(link!);
  await expect(page.getByRole("heading", { name: "Join Kestrel Bay Process Chemistry" })).toBeVisible();
  await page.getByLabel("Your name").fill("Wren Halloway");
  await page.getByLabel("Choose a password").fill("short");
  await page.getByLabel("Repeat the password").fill("short");
  await page.getByRole("button", { name: "Set password and join" }).click();
  await expect(page.getByTestId("error-password")).toContainText("at least 10");

  await page.getByLabel("Choose a password").fill("a-long-enough-password");
  await page.getByLabel("Repeat the password").fill("a-long-enough-password");
  await page.getByRole("button", { name: "Set password and join" }).click();
  await expect(page).toHaveURL(/\/signin/);
  await signIn(page, email, "a-long-enough-password");
  await expect(page.getByTestId("user-name")).toContainText("Wren Halloway");

  // The link works once.
  await page.context().clearCookies();
  await page.goto(link!);
  await expect(page.getByRole("heading", { name: "Invitation not valid" })).toBeVisible();
});
