/**
 * Password rules on the admin's add-user form, and the sign-in throttle locking an account after
 * repeated wrong passwords (lib/auth/throttle-policy.ts: 8 failures, growing delays from the third).
 * A fresh account is used so the demo accounts other specs sign in with are never locked.
 */
import { expect, test } from "@playwright/test";
import { SignInPage, signInAs } from "./support/accounts";

const EMAIL = "lockout-probe@lab.example";
const PASSWORD = "lockout-probe-pass-1";

test("the add-user form enforces the password rules, then repeated wrong passwords lock the account", async ({ page, browser }) => {
  test.setTimeout(120_000);
  await signInAs(page, "admin");
  await page.goto("/admin");
  await page.getByLabel("Name").fill("Lockout probe");
  await page.getByLabel("E-mail").fill(EMAIL);
  const password = page.getByLabel("Initial password");
  const add = page.getByRole("button", { name: "Add user" });

  for (const [weak, rule] of [
    ["short1", "Use at least 10 characters."],
    ["aaaaaaaaaaaa", "Use at least 4 different characters."],
    [EMAIL, "The password must not be the e-mail address."],
  ] as const) {
    await password.fill(weak);
    await add.click();
    await expect(page.locator("#new-password-error")).toContainText(rule);
    await expect(page.getByLabel("Initial password")).toHaveAttribute("aria-invalid", "true");
    // The form echoes what was typed (but never the password): fill it again for the next try.
    await expect(page.getByLabel("E-mail")).toHaveValue(EMAIL);
    await page.getByLabel("Name").fill("Lockout probe");
  }
  await expect(page.getByRole("cell", { name: EMAIL })).toHaveCount(0);
  await password.fill(PASSWORD);
  await add.click();
  await expect(page.getByText("Added Lockout probe as member.")).toBeVisible();

  const context = await browser.newContext();
  const visitor = await context.newPage();
  const signIn = new SignInPage(visitor);
  await signIn.goto();
  // Each attempt waits for next-auth's answer, so the message checked is that attempt's, not the last one's.
  const attempt = async (password: string) => {
    const answered = visitor.waitForResponse((r) => r.url().includes("/api/auth/callback/credentials"), { timeout: 15_000 });
    await signIn.signIn(EMAIL, password);
    await answered;
  };
  for (let n = 1; n <= 8; n++) {
    await attempt(`wrong-password-${n}`);
    await expect(signIn.error()).toContainText("do not match an active account");
  }
  // Locked now: even the right password is refused, with a message that says why and for how long.
  await attempt(PASSWORD);
  await expect(signIn.error()).toContainText(/Too many failed sign-ins for this account\. Try again in \d+ minutes?\./, { timeout: 15_000 });
  await expect(visitor).toHaveURL(/\/sign-in/);
  await context.close();
});
