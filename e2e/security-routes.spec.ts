/**
 * The mutating JSON route handlers over HTTP against the built app, with real sessions: the same role
 * table as test/security-roles.test.ts (which also fails when a route is missing from it), then the
 * cross-site rule of lib/auth/same-origin.ts on the wire.
 */
import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { signInAs, type DemoRole } from "./support/accounts";

const RANK: Record<DemoRole, number> = { member: 1, steward: 2, admin: 3 };

const validCoil = { tag: "SEC-E2E-01", name: "Guard probe", builderName: "Test runner", formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002 };
const validSweep = {
  coilId: "coil-KM-07", // the demo loader's id for KM-07 (prisma/demo/generate.ts)
  topLoadId: "",
  takenAt: "2025-01-01T12:00:00.000Z",
  seriesResistanceOhm: "22k",
  sourceAmplitudeV: "20",
  amplitudeConvention: "peak",
  frequenciesHz: [100_000, 200_000, 300_000],
  amplitudesV: [1, 2, 1],
};

interface MutatingRoute {
  path: string;
  role: DemoRole;
  /** A body that would be stored if the caller were allowed. */
  valid: (request: APIRequestContext) => Promise<unknown>;
}

const ROUTES: MutatingRoute[] = [
  { path: "/api/coils", role: "steward", valid: async () => validCoil },
  { path: "/api/import/json?asTag=SEC-E2E-COPY", role: "steward", valid: async (request) => (await request.get("/api/export/coils/KM-05.json")).json() },
  { path: "/api/sweeps/import", role: "member", valid: async () => validSweep },
];

/** What the app holds, as the fleet summary shows it: one row per coil with its counts. */
async function fleetSnapshot(page: Page): Promise<string> {
  const response = await page.request.get("/api/export/fleet.csv");
  expect(response.status()).toBe(200);
  return response.text();
}

for (const route of ROUTES) {
  test(`POST ${route.path} (needs ${route.role}): anonymous and lower roles are refused and nothing is stored`, async ({ page, request, browser }) => {
    await signInAs(page, "admin");
    const body = await route.valid(page.request);
    const before = await fleetSnapshot(page);

    const anonymous = await request.post(route.path, { data: body });
    expect(anonymous.status()).toBe(401);
    expect(await anonymous.json()).toMatchObject({ ok: false, message: "Sign in to continue." });

    for (const role of (["member", "steward", "admin"] as const).filter((r) => RANK[r] < RANK[route.role])) {
      const context = await browser.newContext();
      const rolePage = await context.newPage();
      await signInAs(rolePage, role);
      const refused = await rolePage.request.post(route.path, { data: body });
      expect(refused.status()).toBe(403);
      expect(await refused.json()).toMatchObject({ ok: false, message: `This needs the ${route.role} role; you are signed in as a ${role}.` });
      await context.close();
    }
    expect(await fleetSnapshot(page)).toBe(before);
  });

  test(`POST ${route.path}: the roles that may use it are not refused for their role`, async ({ browser }) => {
    for (const role of (["member", "steward", "admin"] as const).filter((r) => RANK[r] >= RANK[route.role])) {
      const context = await browser.newContext();
      const page = await context.newPage();
      await signInAs(page, role);
      // An empty body: refused for its content (400/422), never for the role, and nothing is stored.
      const response = await page.request.post(route.path, { data: {} });
      expect([400, 422], `${role}: ${await response.text()}`).toContain(response.status());
      await context.close();
    }
  });
}

test.describe("cross-site requests to the JSON routes", () => {
  test("a foreign Origin is refused with 403 before anything is stored; the app's own origin is not", async ({ page, baseURL }) => {
    await signInAs(page, "steward");
    const before = await fleetSnapshot(page);
    for (const origin of ["https://evil.example", "null", `${baseURL!.replace("localhost", "127.0.0.1")}`]) {
      const response = await page.request.post("/api/coils", { data: validCoil, headers: { origin } });
      expect(response.status(), origin).toBe(403);
      expect((await response.json()).message).toMatch(/came from another site/);
    }
    const crossSiteFetch = await page.request.post("/api/sweeps/import", { data: validSweep, headers: { "sec-fetch-site": "cross-site", "sec-fetch-mode": "cors" } });
    expect(crossSiteFetch.status()).toBe(403);
    // What an old browser's cross-site form would send: the session cookie, a text/plain body, no Origin.
    const formShaped = await page.request.post("/api/coils", { data: JSON.stringify(validCoil), headers: { "content-type": "text/plain" } });
    expect(formShaped.status()).toBe(403);
    expect(await fleetSnapshot(page)).toBe(before);

    const sameOrigin = await page.request.post("/api/coils", { data: { ...validCoil, tag: "SEC-E2E-02" }, headers: { origin: baseURL! } });
    expect(sameOrigin.status()).toBe(201);
  });

  test("the app's own pages still post to the routes: a same-origin fetch from the browser passes the check", async ({ page }) => {
    await signInAs(page, "member");
    await page.goto("/sweeps");
    const status = await page.evaluate(async () => {
      const response = await fetch("/api/sweeps/import", { method: "POST", headers: { "Content-Type": "application/json" }, body: "{}" });
      return response.status;
    });
    expect(status).toBe(422);
  });
});
