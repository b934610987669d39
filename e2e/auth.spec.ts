import { expect, test } from "@playwright/test";
import { DEMO, SignInPage, signInAs } from "./support/accounts";

test("an anonymous visitor is sent to the sign-in page, never shown data", async ({ page }) => {
  await page.goto("/coils");
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Fcoils/);
  await expect(page.getByRole("heading", { name: /Coilyard/ })).toBeVisible();
});

test("a wrong password is refused with a clear message", async ({ page }) => {
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(DEMO.member.email, "not-the-password");
  await expect(signIn.error()).toContainText("do not match an active account");
  await expect(page).toHaveURL(/\/sign-in/);
});

test("a member signs in, lands on the fleet, and signs out", async ({ page }) => {
  await signInAs(page, "member");
  await expect(page.getByRole("heading", { name: "Fleet", level: 1 })).toBeVisible();
  await expect(page.getByRole("link", { name: "KM-02" })).toBeVisible();
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/sign-in/);
  await page.goto("/");
  await expect(page).toHaveURL(/\/sign-in/);
});

test("after sign-in the visitor returns to the page they asked for", async ({ page }) => {
  await page.goto("/failures");
  const signIn = new SignInPage(page);
  await signIn.signIn(DEMO.member.email, DEMO.member.password);
  await expect(page).toHaveURL(/\/failures$/);
  await expect(page.getByRole("heading", { name: "Failures and post-mortems" })).toBeVisible();
});
