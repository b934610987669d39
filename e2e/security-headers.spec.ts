/**
 * Security headers on the built app, and a Content-Security-Policy the app's own pages pass: every
 * main area is visited while recording `securitypolicyviolation` events and CSP console errors.
 */
import { expect, test, type Page } from "@playwright/test";
import { signInAs } from "./support/accounts";

const RECORD_VIOLATIONS = () => {
  const w = window as unknown as { __cspViolations?: string[] };
  w.__cspViolations = [];
  document.addEventListener("securitypolicyviolation", (e) => w.__cspViolations!.push(`${e.violatedDirective} blocked ${e.blockedURI || "inline"} at ${location.pathname}`));
};

function watchConsole(page: Page): string[] {
  const messages: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to (load|execute|apply|connect|frame)/i.test(m.text())) messages.push(`${page.url()}: ${m.text()}`);
  });
  return messages;
}

async function violationsOn(page: Page): Promise<string[]> {
  await page.waitForLoadState("networkidle");
  return page.evaluate(() => (window as unknown as { __cspViolations?: string[] }).__cspViolations ?? []);
}

test("the sign-in page passes its own Content-Security-Policy", async ({ page }) => {
  const console = watchConsole(page);
  await page.addInitScript(RECORD_VIOLATIONS);
  await page.goto("/sign-in");
  await expect(page.getByRole("button", { name: "Sign in" })).toBeVisible();
  expect(await violationsOn(page)).toEqual([]);
  expect(console).toEqual([]);
});

test("every main area renders with no CSP violation, charts and the label's QR code included", async ({ page }) => {
  test.setTimeout(120_000);
  const console = watchConsole(page);
  await page.addInitScript(RECORD_VIOLATIONS);
  await signInAs(page, "admin");

  await page.goto("/sweeps?coil=KM-04");
  const sweepHref = await page.locator('a[href^="/sweeps/"]').filter({ hasNotText: /new|import/i }).first().getAttribute("href");
  await page.goto("/sessions?coil=KM-04");
  const sessionHref = await page.locator('a[href^="/sessions/"]').filter({ hasNotText: /new|log/i }).first().getAttribute("href");
  expect(sweepHref).toMatch(/^\/sweeps\/[^/]+$/);
  expect(sessionHref).toMatch(/^\/sessions\/[^/]+$/);

  const pages = [
    "/",
    "/coils",
    "/coils/KM-04",
    "/coils/KM-04/label",
    sweepHref!,
    "/sweeps/new?coil=KM-04",
    sessionHref!,
    "/sessions/new",
    "/failures",
    "/clearances",
    "/loans",
    "/fleet/reliability",
    "/fleet/KM-04/trends",
    "/admin",
    "/admin/policy",
  ];
  const found: string[] = [];
  for (const path of pages) {
    const response = await page.goto(path);
    expect(response?.status(), path).toBe(200);
    found.push(...(await violationsOn(page)));
    if (path === sweepHref || path === "/fleet/KM-04/trends") {
      // The charts are drawn by client scripts: a canvas with pixels shows the scripts ran under the policy.
      await expect(page.locator("canvas").first(), `${path} draws its chart`).toBeVisible();
    }
    if (path === "/coils/KM-04/label") await expect(page.locator("svg").first()).toBeVisible();
  }
  expect(found).toEqual([]);
  expect(console).toEqual([]);

  // The recorder itself works: an image from another origin is blocked and reported.
  await page.evaluate(() => {
    const img = document.createElement("img");
    img.src = "http://csp-probe.invalid/pixel.png";
    document.body.append(img);
  });
  await expect.poll(() => page.evaluate(() => (window as unknown as { __cspViolations: string[] }).__cspViolations)).toEqual([expect.stringContaining("img-src")]);
});

test("pages carry the security headers, with a fresh script nonce each time", async ({ page, request }) => {
  const first = await request.get("/sign-in");
  const second = await request.get("/sign-in");
  const headers = first.headers();
  const csp = headers["content-security-policy"]!;
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toContain("object-src 'none'");
  expect(csp).toContain("base-uri 'self'");
  // Only this origin's scripts may run as workers (the session form's public/sw.js).
  expect(csp).toContain("worker-src 'self'");
  expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
  expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
  const nonce = /'nonce-([^']+)'/.exec(csp)![1]!;
  expect(second.headers()["content-security-policy"]).not.toContain(nonce);
  // Next puts the nonce on its own inline scripts.
  expect(await first.text()).toContain(`nonce="${nonce}"`);
  expect(headers["x-content-type-options"]).toBe("nosniff");
  expect(headers["x-frame-options"]).toBe("DENY");
  expect(headers["referrer-policy"]).toBe("same-origin");
  expect(headers["permissions-policy"]).toContain("camera=()");
  expect(headers["x-powered-by"]).toBeUndefined();
  // Plain http: no HSTS (it would pin a lab laptop's address to https it does not serve).
  expect(headers["strict-transport-security"]).toBeUndefined();

  await signInAs(page, "member");
  const api = await page.request.get("/api/coils");
  expect(api.headers()["content-security-policy"]).toBe("default-src 'none'; frame-ancestors 'none'");
  expect(api.headers()["x-content-type-options"]).toBe("nosniff");
});

test("Strict-Transport-Security is sent only when the visitor came over https", async ({ request }) => {
  const viaTls = await request.get("/sign-in", { headers: { "x-forwarded-proto": "https" } });
  expect(viaTls.headers()["strict-transport-security"]).toBe("max-age=31536000; includeSubDomains");
  expect(viaTls.headers()["content-security-policy"]).toContain("upgrade-insecure-requests");
  const plain = await request.get("/sign-in");
  expect(plain.headers()["strict-transport-security"]).toBeUndefined();
  expect(plain.headers()["content-security-policy"]).not.toContain("upgrade-insecure-requests");
});
