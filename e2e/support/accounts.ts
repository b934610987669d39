import { expect, type Page } from "@playwright/test";

/** The demo club's sign-ins (prisma/demo/people.ts), and the demo network's organisation admin. */
export const DEMO = {
  admin: { email: "admin@kettlewell.example", password: "demo-admin-pass" },
  steward: { email: "steward@kettlewell.example", password: "demo-steward-pass" },
  member: { email: "member@kettlewell.example", password: "demo-member-pass" },
  organiser: { email: "coordinator@northmoor.example", password: "demo-organisation-pass" },
} as const;

export type DemoRole = keyof typeof DEMO;

/** The sign-in page, as a small page object. */
export class SignInPage {
  constructor(private readonly page: Page) {}

  async goto() {
    await this.page.goto("/sign-in");
  }

  async signIn(email: string, password: string) {
    await this.page.getByLabel("E-mail").fill(email);
    await this.page.getByLabel("Password").fill(password);
    await this.page.getByRole("button", { name: "Sign in" }).click();
  }

  error() {
    return this.page.locator("#sign-in-error");
  }
}

export async function signInAs(page: Page, role: DemoRole) {
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(DEMO[role].email, DEMO[role].password);
  await expect(page.getByRole("button", { name: "Sign out" })).toBeVisible();
}
