/**
 * The mutating JSON route handlers over HTTP against the built app, with real sessions. The routes are
 * discovered from the file tree and their roles read from the same committed table as
 * test/security-roles.test.ts (test/support/entry-points.ts), so a new route is checked here too: it fails until
 * it has a valid body below. Then the cross-site rule of lib/auth/same-origin.ts on the wire.
 */
import { fileURLToPath } from "node:url";
import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { signInAs, type DemoRole } from "./support/accounts";
import { localMinute } from "./support/http-client";
import { discoverMutatingRoutes, ENTRY_POINT_ROLES } from "../test/support/entry-points";

// The organisation admin is admin at every site.
const RANK: Record<DemoRole, number> = { member: 1, steward: 2, admin: 3, organiser: 4 };

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
const validSession = { coilId: "coil-KM-06", startedAt: localMinute(90), supplyVoltageV: "24 V", supplyCurrentA: 1.2, durationS: "10 min", ambientTempC: 21, notes: "Guard probe", samples: "0, 21\n300, 30" };

/** Per discovered route: a body that would be stored if the caller were allowed (and a query string, if needed). */
const VALID: Record<string, { query?: string; body: (request: APIRequestContext) => Promise<unknown> }> = {
  "app/api/coils/route.ts#POST": { body: async () => validCoil },
  "app/api/import/json/route.ts#POST": { query: "?asTag=SEC-E2E-COPY", body: async (request) => (await request.get("/api/export/coils/KM-05.json")).json() },
  "app/api/sessions/route.ts#POST": { body: async () => validSession },
  "app/api/sweeps/import/route.ts#POST": { body: async () => validSweep },
};

const ROUTES = discoverMutatingRoutes(fileURLToPath(new URL("..", import.meta.url)))
  .filter((route) => ENTRY_POINT_ROLES[route.key] !== "public")
  .map((route) => ({ ...route, role: ENTRY_POINT_ROLES[route.key] as DemoRole | undefined }));

test("every mutating route in the file tree has a role and a valid probe body here", () => {
  expect(ROUTES.length).toBeGreaterThanOrEqual(4);
  for (const route of ROUTES) {
    expect(route.role, `${route.key}: add it to ENTRY_POINT_ROLES in test/support/entry-points.ts`).toBeDefined();
    expect(VALID[route.key], `${route.key}: add a body that would be stored to VALID in this spec`).toBeDefined();
    expect(route.path, `${route.key}: a dynamic segment needs a value here`).not.toMatch(/\[/);
  }
});

/** What the app holds, as the fleet summary shows it: one row per coil with its counts. */
async function fleetSnapshot(page: Page): Promise<string> {
  const response = await page.request.get("/api/export/fleet.csv");
  expect(response.status()).toBe(200);
  return response.text();
}

for (const route of ROUTES.filter((r) => r.role && VALID[r.key])) {
  const required = route.role!;
  const url = route.path + (VALID[route.key]!.query ?? "");
  const send = (request: APIRequestContext, data: unknown) => request.fetch(url, { method: route.method, data });

  test(`${route.method} ${route.path} (needs ${required}): anonymous and lower roles are refused and nothing is stored`, async ({ page, request, browser }) => {
    await signInAs(page, "admin");
    const body = await VALID[route.key]!.body(page.request);
    const before = await fleetSnapshot(page);

    const anonymous = await send(request, body);
    expect(anonymous.status()).toBe(401);
    expect(await anonymous.json()).toMatchObject({ ok: false, message: "Sign in to continue." });

    for (const role of (["member", "steward", "admin"] as const).filter((r) => RANK[r] < RANK[required])) {
      const context = await browser.newContext();
      const rolePage = await context.newPage();
      await signInAs(rolePage, role);
      const refused = await send(rolePage.request, body);
      expect(refused.status()).toBe(403);
      // Roles are per site: the demo's people sign in at the club's site.
      expect(await refused.json()).toMatchObject({ ok: false, message: `This needs the ${required} role at Kettlewell Maker Collective; you are a ${role} there.` });
      await context.close();
    }
    expect(await fleetSnapshot(page)).toBe(before);
  });

  test(`${route.method} ${route.path}: the roles that may use it are not refused for their role`, async ({ browser }) => {
    for (const role of (["member", "steward", "admin"] as const).filter((r) => RANK[r] >= RANK[required])) {
      const context = await browser.newContext();
      const page = await context.newPage();
      await signInAs(page, role);
      // An empty body: refused for its content (400/422), never for the role, and nothing is stored.
      const response = await send(page.request, {});
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

test.describe("the benchmark's floors", () => {
  test("answer not found, to a signed-in admin too, on a server the benchmark did not start", async ({ page }) => {
    await signInAs(page, "admin");
    expect((await page.request.get("/api/bench-floor")).status()).toBe(404);
    expect((await page.request.get("/api/bench-floor?authCounts")).status()).toBe(404);
    const pageFloor = await page.goto("/bench-floor");
    expect(pageFloor!.status()).toBe(404);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Not found");
  });
});
