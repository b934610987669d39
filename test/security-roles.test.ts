/**
 * Role enforcement, by enumeration: every mutating entry point is discovered from the file tree, and
 * each must appear in ENTRY_POINT_ROLES (test/support/entry-points.ts) with the role it needs. A new action or route that is
 * not in the table fails the first test, so nothing ships unchecked; a table row whose entry point
 * is gone fails it too.
 *
 * How they are checked: the exported functions are called directly, in-process, against the
 * integration database, each demo role signed in by a real session cookie (a token encoded with the app's
 * secret, handed to the code through a mocked next/headers, with next/cache mocked too, as there is no Next
 * request around them). This runs every entry
 * point for every role in seconds, and lets the test count every table's rows before and after a
 * refusal — "nothing stored" is checked for the whole database, not one table. The HTTP side of the
 * route handlers (cookies, real sessions, status codes on the wire) is covered again against the
 * built app in e2e/security-routes.spec.ts; the action protocol's Origin check in
 * e2e/security-origin.spec.ts.
 */
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { encode } from "next-auth/jwt";
import { hasRole, ROLES, type Role } from "../lib/auth/roles";
import { sessionCookieName } from "../lib/auth/session-token";
import { appEnv } from "../lib/config/env";
import { countAllRows, makeUser, resetDatabase } from "./support/db";
import { discoverEntryPoints, ENTRY_POINT_ROLES } from "./support/entry-points";
import { PLAN_VARIANT } from "./support/plan-fixtures";

const session = vi.hoisted(() => ({ userId: null as string | null, headers: new Headers() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));
vi.mock("next/headers", () => ({ headers: vi.fn(async () => session.headers), cookies: vi.fn(async () => signedInCookies()) }));

/** The request's cookies: next-auth's session cookie for `session.userId`, as the sign-in would have set it. */
async function signedInCookies() {
  const all = session.userId ? [{ name: sessionCookieName(), value: await encode({ token: { sub: session.userId }, secret: appEnv().NEXTAUTH_SECRET }) }] : [];
  return { getAll: () => all, get: (name: string) => all.find((cookie) => cookie.name === name) };
}

const ROOT = path.resolve(__dirname, "..");

const ROLE_REFUSAL = /Sign in to continue|needs the (member|steward|admin) role/;
type Outcome = { status: number; message: string };

async function callEntryPoint(key: string, body: unknown): Promise<Outcome> {
  const [file, name] = key.split("#") as [string, string];
  const mod = (await import(path.join(ROOT, file))) as Record<string, (...args: unknown[]) => Promise<unknown>>;
  const fn = mod[name];
  if (!fn) throw new Error(`${key} is not exported`);
  if (file.endsWith("/route.ts")) {
    const request = new Request("http://lab.test/x", { method: name, headers: { "content-type": "application/json", host: "lab.test" }, body: JSON.stringify(body) });
    session.headers = request.headers;
    const response = (await fn(request, { params: Promise.resolve({}) })) as Response;
    const json = (await response.json()) as { message?: string };
    return { status: response.status, message: json.message ?? "" };
  }
  const form = new FormData();
  for (const [k, v] of Object.entries((body ?? {}) as Record<string, string>)) form.set(k, v);
  try {
    const result = (name === "recordTypedSweep" ? await fn(body) : await fn(null, form)) as { ok: boolean; message?: string };
    return { status: result.ok ? 200 : ROLE_REFUSAL.test(result.message ?? "") ? (/Sign in/.test(result.message!) ? 401 : 403) : 422, message: result.message ?? "" };
  } catch (error) {
    // redirect() after a successful action throws NEXT_REDIRECT; anything else is a real failure.
    if ((error as { digest?: string }).digest?.startsWith("NEXT_REDIRECT")) return { status: 303, message: "redirect" };
    throw error;
  }
}


// Inputs that would succeed if the guard let them through, so a refusal that stores nothing means something.
const VALID_COIL = { tag: "SEC-01", name: "Guard probe", builderName: "Test", formDiameterM: "50 mm", windingLengthM: "200 mm", turns: "900", wireDiameterM: "0.2 mm" };
const VALID_INPUT: Record<string, unknown> = {
  "app/(app)/admin/actions.ts#addUser": { name: "Probe", email: "probe@lab.test", role: "member", password: "probe-pass-1234" },
  "app/(app)/coils/actions.ts#createCoilAction": VALID_COIL,
  "app/(app)/coils/plan/actions.ts#savePlanAction": { tag: "SEC-02", name: "Planned probe", builderName: "Test", chosenVariant: "0", variantsJson: JSON.stringify([PLAN_VARIANT]) },
  "app/api/coils/route.ts#POST": { ...VALID_COIL, formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002 },
};

const users: Partial<Record<Role, string>> = {};

beforeAll(async () => {
  await resetDatabase();
  for (const role of ROLES) users[role] = (await makeUser(`${role}@lab.test`, role)).id;
});
afterAll(() => {
  session.userId = null;
});

describe("every mutating entry point is in the role table", () => {
  it("the table names exactly the entry points in the file tree", () => {
    const discovered = discoverEntryPoints(ROOT);
    const missing = discovered.filter((key) => !(key in ENTRY_POINT_ROLES));
    const stale = Object.keys(ENTRY_POINT_ROLES).filter((key) => !discovered.includes(key));
    expect(missing, "entry points with no role in ENTRY_POINT_ROLES — add them with the role they need").toEqual([]);
    expect(stale, "ENTRY_POINT_ROLES names entry points that no longer exist").toEqual([]);
  });
});

const guarded = Object.entries(ENTRY_POINT_ROLES).filter((entry): entry is [string, Role] => entry[1] !== "public");

describe.each(guarded)("%s (needs %s)", (key, required) => {
  it("refuses an anonymous caller and stores nothing", async () => {
    session.userId = null;
    const before = await countAllRows();
    const outcome = await callEntryPoint(key, VALID_INPUT[key] ?? {});
    expect(outcome.status).toBe(401);
    expect(outcome.message).toMatch(/Sign in to continue/);
    expect(await countAllRows()).toEqual(before);
  });

  it.each(ROLES)("as %s: refused only when the role is too low", async (role) => {
    session.userId = users[role]!;
    const before = await countAllRows();
    const allowed = hasRole(role, required);
    // A refused caller gets the input that would succeed; an allowed one gets an empty form, so it is
    // refused for the input (422) and not for its role, and the database is left as the next test needs it.
    const outcome = await callEntryPoint(key, allowed ? {} : (VALID_INPUT[key] ?? {}));
    if (allowed) {
      expect(outcome.status, outcome.message).not.toBe(401);
      expect(outcome.status, outcome.message).not.toBe(403);
      expect(outcome.message).not.toMatch(ROLE_REFUSAL);
    } else {
      expect(outcome.status).toBe(403);
      expect(outcome.message).toBe(`This needs the ${required} role; you are signed in as a ${role}.`);
      expect(await countAllRows()).toEqual(before);
    }
  });
});

describe("the valid probes really would store something", () => {
  it.each(Object.keys(VALID_INPUT))("%s succeeds for its role", async (key) => {
    await resetDatabase();
    for (const role of ROLES) users[role] = (await makeUser(`${role}@lab.test`, role)).id;
    session.userId = users[ENTRY_POINT_ROLES[key] as Role]!;
    const outcome = await callEntryPoint(key, VALID_INPUT[key]);
    expect([200, 201, 303], outcome.message).toContain(outcome.status);
  });
});
