/**
 * Server actions and cross-site requests: Next checks a server action's Origin against Host before
 * running it. Proved on a real action: the admin's add-user request is captured from the browser,
 * then replayed (new e-mail) once with the app's own Origin — which works, so the replay is a valid
 * call — and once with a foreign Origin, which is refused and stores nothing.
 */
import { expect, test, type Page, type Request } from "@playwright/test";
import { signInAs } from "./support/accounts";

async function addUserThroughForm(page: Page, email: string): Promise<Request> {
  await page.goto("/admin");
  await page.getByLabel("Name").fill("Origin probe");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Initial password").fill("origin-probe-pass-1");
  const captured = page.waitForRequest((r) => r.method() === "POST" && !!r.headers()["next-action"]);
  await page.getByRole("button", { name: "Add user" }).click();
  const request = await captured;
  await expect(page.getByText(`Added Origin probe as member.`)).toBeVisible();
  return request;
}

test("a server action posted with a foreign Origin is refused and stores nothing", async ({ page, baseURL }) => {
  await signInAs(page, "admin");
  const original = await addUserThroughForm(page, "origin-a@lab.example");
  const body = original.postDataBuffer()!;
  const headers = await original.allHeaders();
  const replay = (email: string, origin: string) =>
    page.request.post(original.url(), {
      headers: { "content-type": headers["content-type"]!, "next-action": headers["next-action"]!, accept: "text/x-component", origin },
      data: Buffer.from(body.toString("latin1").replace("origin-a@lab.example", email), "latin1"),
    });

  const sameSite = await replay("origin-b@lab.example", baseURL!);
  expect(sameSite.status()).toBe(200);

  const foreign = await replay("origin-c@lab.example", "https://evil.example");
  expect(foreign.status()).toBeGreaterThanOrEqual(400);

  await page.goto("/admin");
  const users = page.getByRole("region", { name: /users/i }).or(page.locator("section[aria-labelledby='users-heading']"));
  await expect(users.getByText("origin-b@lab.example")).toBeVisible();
  await expect(users.getByText("origin-c@lab.example")).toHaveCount(0);
});
