/**
 * Role and site enforcement, by enumeration: every mutating entry point is discovered from the file tree, and
 * each must appear in ENTRY_POINT_ROLES (test/support/entry-points.ts) with the role it needs, and in SITE_PROBES
 * below with an input that names another site's records. Every page that shows one record (a dynamic segment under
 * app/(app), or a GET route with one) must appear in RECORD_PAGES. A new action, route or record page that is not
 * in its table fails the first tests, so nothing ships unchecked; a row whose entry point is gone fails too.
 *
 * How they are checked: the exported functions (and page components) are called directly, in-process, against
 * the integration database, each user signed in by a real session cookie (a token encoded with the app's secret)
 * and a site cookie naming a site, handed to the code through a mocked next/headers (next/cache mocked too, as
 * there is no Next request around them). This runs
 * every entry point for every role in seconds, and lets the test count every table's rows before and after a
 * refusal — "nothing stored" is checked for the whole database, not one table. The HTTP side of the route
 * handlers (cookies, real sessions, status codes on the wire) is covered again against the built app in
 * e2e/security-routes.spec.ts and e2e/two-schools.spec.ts; the action protocol's Origin check in
 * e2e/security-origin.spec.ts.
 *
 * The site dimension: a user who is admin at site A (so no role check stands in the way) calls every entry point
 * with site B's record ids and tags, holding a site cookie that names B. Each call must answer exactly as it does
 * for ids and tags that exist nowhere (so B's records do not leak), leave every row of site B as it was, and the
 * same input from B's own admin must answer differently (so the probe really reaches a record).
 */
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { encode } from "next-auth/jwt";
import { hasRole, ROLES, type Role } from "../lib/auth/roles";
import { DEFAULT_CLEARANCE_POLICY } from "../lib/calc/clearance-policy";
import { countAllRows, testDb } from "./support/db";
import { discoverEntryPoints, discoverListRoutes, discoverRecordPages, ENTRY_POINT_ROLES } from "./support/entry-points";
import { sessionCookieName } from "../lib/auth/session-token";
import { appEnv } from "../lib/config/env";
import { PLAN_VARIANT } from "./support/plan-fixtures";
import {
  deleteSiteRecords,
  loadSiteRows,
  makeSite,
  makeSiteUser,
  recordsOf,
  resetSites,
  siteCopy,
  siteSnapshot,
  snapshotDifference,
  type SiteRecords,
} from "./support/site-fixtures";

const session = vi.hoisted(() => ({ userId: null as string | null, headers: new Headers(), siteSlug: undefined as string | undefined }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));
vi.mock("next/headers", () => ({ headers: vi.fn(async () => session.headers), cookies: vi.fn(async () => requestCookies()) }));

/** The request's cookies: next-auth's session cookie for `session.userId`, as the sign-in would have set it, and the site cookie. */
async function requestCookies() {
  const all = session.userId ? [{ name: sessionCookieName(), value: await encode({ token: { sub: session.userId }, secret: appEnv().NEXTAUTH_SECRET }) }] : [];
  if (session.siteSlug) all.push({ name: "coilyard-site", value: session.siteSlug });
  const get = (name: string) => all.find((cookie) => cookie.name === name);
  return { get, getAll: () => all, has: (name: string) => get(name) !== undefined, set: vi.fn(), delete: vi.fn() };
}

const ROOT = path.resolve(__dirname, "..");

const ROLE_REFUSAL = /Sign in to continue|needs the (member|steward|admin) role/;
type Outcome = { status: number; message: string; body?: string };

type Handler = (...args: unknown[]) => Promise<unknown>;
async function loadExport(file: string, name: string): Promise<Handler> {
  const mod = (await import(path.join(ROOT, file))) as Record<string, Handler>;
  const fn = mod[name];
  if (!fn) throw new Error(`${file}#${name} is not exported`);
  return fn;
}

/**
 * Calls an action or route as the mocked user. `throws: "record"` turns an error thrown by the entry point into an
 * outcome (status 500) instead of failing the test, so the site dimension can compare it with a missing record's.
 */
async function callEntryPoint(key: string, body: unknown, options: { params?: Record<string, string>; throws?: "record" } = {}): Promise<Outcome> {
  const [file, name] = key.split("#") as [string, string];
  const fn = await loadExport(file, name);
  try {
    if (file.endsWith("/route.ts")) {
      const init: RequestInit = { method: name, headers: { "content-type": "application/json", host: "lab.test" } };
      if (name !== "GET") init.body = JSON.stringify(body);
      const request = new Request("http://lab.test/x", init);
      session.headers = request.headers;
      const response = (await fn(request, { params: Promise.resolve(options.params ?? {}) })) as Response;
      const text = await response.text();
      let message = "";
      try {
        message = (JSON.parse(text) as { message?: string }).message ?? "";
      } catch {
        // a CSV or other file: no message
      }
      return { status: response.status, message, body: text };
    }
    const form = new FormData();
    for (const [k, v] of Object.entries((body ?? {}) as Record<string, string>)) form.set(k, v);
    const result = (name === "recordTypedSweep" ? await fn(body) : await fn(null, form)) as { ok: boolean; message?: string };
    return { status: result.ok ? 200 : ROLE_REFUSAL.test(result.message ?? "") ? (/Sign in/.test(result.message!) ? 401 : 403) : 422, message: result.message ?? "" };
  } catch (error) {
    // redirect() after a successful action throws NEXT_REDIRECT; anything else is a real failure.
    if ((error as { digest?: string }).digest?.startsWith("NEXT_REDIRECT")) return { status: 303, message: "redirect" };
    if (options.throws === "record") return { status: 500, message: `${(error as Error).name}: ${(error as Error).message}` };
    throw error;
  }
}

// Inputs that would succeed if the guard let them through, so a refusal that stores nothing means something.
const VALID_COIL = { tag: "SEC-01", name: "Guard probe", builderName: "Test", formDiameterM: "50 mm", windingLengthM: "200 mm", turns: "900", wireDiameterM: "0.2 mm" };
const VALID_INPUT: Record<string, unknown> = {
  "app/(app)/admin/actions.ts#addUser": { name: "Probe", email: "probe@lab.test", role: "member", password: "probe-pass-1234" },
  "app/(app)/admin/sites/actions.ts#addSite": { name: "Probe school", slug: "probe-school" },
  "app/(app)/admin/policy/actions.ts#saveDefaultPolicyAction": tighterPolicyForm(),
  "app/(app)/admin/policy/actions.ts#saveSitePolicyAction": tighterPolicyForm(),
  "app/(app)/coils/actions.ts#createCoilAction": VALID_COIL,
  "app/(app)/coils/plan/actions.ts#savePlanAction": { tag: "SEC-02", name: "Planned probe", builderName: "Test", chosenVariant: "0", variantsJson: JSON.stringify([PLAN_VARIANT]) },
  "app/api/coils/route.ts#POST": { ...VALID_COIL, formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002 },
};

const HOME_SITE = { slug: "home-lab", name: "Home lab" };
const users: Partial<Record<Role | "organisation", string>> = {};
let homeSiteName = "";

async function makeRoleUsers() {
  await resetSites();
  const home = await makeSite(HOME_SITE.slug, HOME_SITE.name);
  homeSiteName = home.name;
  for (const role of ROLES) users[role] = (await makeSiteUser(`${role}@lab.test`, { [home.id]: role })).id;
  // An organisation admin belongs to no site and is admin at each.
  users.organisation = (await makeSiteUser("organisation@lab.test", {}, true)).id;
}

beforeAll(makeRoleUsers);
afterAll(() => {
  session.userId = null;
  session.siteSlug = undefined;
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

const guarded = Object.entries(ENTRY_POINT_ROLES).filter((entry): entry is [string, Role | "organisation"] => entry[1] !== "public");
const ORGANISATION_REFUSAL = /organisation admin/i;

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
    if (required === "organisation") {
      // No role at a site is enough: even the site's admin is refused, and nothing is stored.
      const outcome = await callEntryPoint(key, VALID_INPUT[key] ?? {});
      expect([200, 201, 303], outcome.message).not.toContain(outcome.status);
      // A site's admin is told it needs an organisation admin; lower roles may be stopped by the site role first.
      expect(outcome.message).toMatch(role === "admin" ? ORGANISATION_REFUSAL : new RegExp(`${ORGANISATION_REFUSAL.source}|${ROLE_REFUSAL.source}`, "i"));
      expect(await countAllRows()).toEqual(before);
      return;
    }
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
      expect(outcome.message).toBe(`This needs the ${required} role at ${homeSiteName}; you are a ${role} there.`);
      expect(await countAllRows()).toEqual(before);
    }
  });

  it("as an organisation admin (admin at every site): never refused for the role", async () => {
    session.userId = users.organisation!;
    session.siteSlug = HOME_SITE.slug;
    const outcome = await callEntryPoint(key, {});
    session.siteSlug = undefined;
    expect(outcome.status, outcome.message).not.toBe(401);
    expect(outcome.status, outcome.message).not.toBe(403);
    expect(outcome.message).not.toMatch(ROLE_REFUSAL);
    expect(outcome.message).not.toMatch(ORGANISATION_REFUSAL);
  });
});

describe("the valid probes really would store something", () => {
  it.each(Object.keys(VALID_INPUT))("%s succeeds for its role", async (key) => {
    await makeRoleUsers();
    session.userId = users[ENTRY_POINT_ROLES[key] as Role | "organisation"]!;
    session.siteSlug = HOME_SITE.slug;
    const outcome = await callEntryPoint(key, VALID_INPUT[key]);
    expect([200, 201, 303], outcome.message).toContain(outcome.status);
  });
});

// ───────────────────────── the site dimension ─────────────────────────

/** A date-time as the forms take it (local, to the minute), `days` from now. */
function localMinute(days: number): string {
  const at = new Date(Date.now() + days * 86_400_000);
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${at.getFullYear()}-${pad(at.getMonth() + 1)}-${pad(at.getDate())}T${pad(at.getHours())}:${pad(at.getMinutes())}`;
}
const localDay = (days: number) => localMinute(days).slice(0, 10);

/** The policy form for the organisation's default rules, one step tighter (a site may only tighten). */
function tighterPolicyForm() {
  const rules = DEFAULT_CLEARANCE_POLICY;
  return {
    minVoltageHeadroomPct: String(Math.min(100, rules.minVoltageHeadroom * 100 + 5)),
    minCurrentHeadroomPct: String(Math.min(100, rules.minCurrentHeadroom * 100 + 5)),
    minThermalHeadroomPct: String(Math.min(100, rules.minThermalHeadroom * 100 + 5)),
    minJunctionMarginK: String(rules.minJunctionMarginK + 5),
    acceptEstimatedMargins: "",
    ituRegion: String(rules.ituRegion),
    maxSweepAgeDays: String(Math.max(1, rules.maxSweepAgeDays - 1)),
    minFailureFreeSessions: String(rules.minFailureFreeSessions + 1),
    validityDays: String(Math.max(1, rules.validityDays - 1)),
    checklist: rules.requiredChecklist.map((item) => `${item.id} | ${item.text} | ${item.source}`).join("\n"),
    note: "Tighter at this site.",
  };
}

interface SiteWorld {
  /** The site that holds the records, its own admin, and a member there (for access changes). */
  target: SiteRecords;
  targetSlug: string;
  targetAdmin: string;
  targetMember: Person;
  /** The same shape of ids and tags, with nothing behind them anywhere. */
  ghost: SiteRecords;
  ghostMember: Person;
  /** Admin at the caller's site only. */
  caller: string;
  callerSiteId: string;
  callerSlug: string;
  /** An organisation admin (who may switch to either site) working at the caller's site. */
  organiser: string;
}

interface Person {
  id: string;
  email: string;
}

type Probe =
  | {
      /** The input naming the target site's records (run again with the ghost's, which exist nowhere). */
      input: (site: SiteRecords, world: SiteWorld, member: Person) => unknown | Promise<unknown>;
      /** What the target site's own admin gets for the same input: it is stored, or refused because the record is really there (a tag taken). */
      atTargetSite: "stored" | "refused";
      /**
       * Set (with the reason) when there is no "missing record" to answer like: the input names no record of either
       * site, or names an account, which belongs to the organisation rather than a site. Then only "nothing changed at
       * the other site" and the other site's own answer are checked.
       */
      notComparedWithMissing?: string;
    }
  | { exempt: string };

/** Every mutating entry point, with an input that names the other site's records. */
const SITE_PROBES: Record<string, Probe> = {
  "app/(app)/admin/actions.ts#addUser": {
    // A new account at the caller's site with the e-mail of the other site's member: e-mail addresses are unique in the organisation.
    input: (_s, _w, member) => ({ name: "Probe", email: member.email, role: "member", password: "probe-pass-1234" }),
    atTargetSite: "refused",
    notComparedWithMissing: "accounts belong to the organisation, and one address names one account: the caller is told to add the existing account instead",
  },
  "app/(app)/admin/actions.ts#addExistingMember": {
    input: (_s, _w, member) => ({ email: member.email, role: "member" }),
    atTargetSite: "refused",
    notComparedWithMissing: "by design a site's admin finds an existing account by e-mail to add it to their own site; its membership of the other site stays as it was",
  },
  "app/(app)/admin/actions.ts#changeAccess": { input: (_s, _w, member) => ({ userId: member.id, role: "steward" }), atTargetSite: "stored" },
  "app/(app)/admin/actions.ts#removeSiteMember": { input: (_s, _w, member) => ({ userId: member.id }), atTargetSite: "stored" },
  "app/(app)/admin/sites/actions.ts#addSite": {
    input: () => ({ name: "Probe school", slug: "probe-school" }),
    atTargetSite: "refused",
    notComparedWithMissing: "organisation admins only: no site's admin may create a site, and no site's rows change",
  },
  "app/(app)/admin/sites/actions.ts#changeSiteName": {
    input: (s, w) => ({ siteId: s === w.target ? s.siteId : "site-nowhere", name: "Renamed", slug: "renamed-school" }),
    atTargetSite: "refused",
    notComparedWithMissing: "organisation admins only: refused for every site's admin alike",
  },
  "app/(app)/admin/sites/actions.ts#changeOrganisationAdmin": {
    input: (_s, _w, member) => ({ userId: member.id, organisationAdmin: "true" }),
    atTargetSite: "refused",
    notComparedWithMissing: "organisation admins only: refused for every site's admin alike",
  },
  "app/(app)/site-actions.ts#switchSite": { input: (s) => ({ slug: s.siteSlug }), atTargetSite: "stored" },
  "app/(app)/admin/policy/actions.ts#saveSitePolicyAction": {
    input: () => tighterPolicyForm(),
    atTargetSite: "stored",
    notComparedWithMissing: "a site's own lending policy: the caller's site gets a new version, the other site's policies must stay as they were",
  },
  "app/(app)/admin/policy/actions.ts#saveDefaultPolicyAction": {
    input: () => tighterPolicyForm(),
    atTargetSite: "refused",
    notComparedWithMissing: "the organisation's default policy: no site admin may save it (an organisation admin may), and no site's rows change",
  },
  "app/(app)/clearances/actions.ts#signClearanceAction": { input: (s) => ({ coilId: s.coilId, verdict: "refused", conditions: "Probe" }), atTargetSite: "stored" },
  "app/(app)/coils/[tag]/actions.ts#changeCoilStatus": { input: (s) => ({ coilId: s.coilId, status: "repair" }), atTargetSite: "stored" },
  "app/(app)/coils/[tag]/actions.ts#addTopLoadAction": { input: (s) => ({ coilId: s.coilId, name: "Probe sphere", shape: "sphere", diameterM: "100 mm" }), atTargetSite: "stored" },
  "app/(app)/coils/[tag]/actions.ts#retireTopLoadAction": { input: (s) => ({ topLoadId: s.topLoadId }), atTargetSite: "stored" },
  "app/(app)/coils/[tag]/actions.ts#addComponentAction": {
    input: (s) => ({ coilId: s.coilId, kind: "snubber", partNumber: "RC-PROBE", resistanceOhm: "100", capacitanceF: "2n2", installedAt: "" }),
    atTargetSite: "stored",
  },
  "app/(app)/coils/[tag]/actions.ts#replaceComponentAction": {
    input: (s) => ({ oldComponentId: s.componentId, coilId: s.coilId, removalReason: "upgrade", kind: "heat_sink", partNumber: "HS-PROBE", sinkThermalResistanceKPerW: "1.5", installedAt: "" }),
    atTargetSite: "stored",
  },
  // A tag the other site has taken is free at the caller's site (tags are unique per site).
  "app/(app)/coils/actions.ts#createCoilAction": { input: (s) => ({ ...VALID_COIL, tag: s.tags[0] }), atTargetSite: "refused" },
  "app/(app)/coils/actions.ts#updateCoilAction": {
    input: async (s) => {
      const version = (await testDb.coil.findUnique({ where: { id: s.coilId }, select: { version: true } }))?.version ?? 0;
      const { tag: _tag, ...fields } = VALID_COIL;
      return { ...fields, coilId: s.coilId, version: String(version) };
    },
    atTargetSite: "stored",
  },
  // The other site's logbook file, imported at the caller's site: a copy there (ids re-keyed), the original untouched.
  "app/(app)/coils/actions.ts#importLogbookAction": { input: async (s, w) => ({ json: await exportedLogbook(s, w), asTag: "" }), atTargetSite: "refused" },
  "app/(app)/coils/plan/actions.ts#comparePlanAction": { exempt: "stores nothing and names no record: it works a plan out from the form alone" },
  "app/(app)/coils/plan/actions.ts#savePlanAction": {
    input: (s) => ({ tag: s.tags[1], name: "Planned probe", builderName: "Test", chosenVariant: "0", variantsJson: JSON.stringify([PLAN_VARIANT]) }),
    atTargetSite: "refused",
  },
  "app/(app)/failures/actions.ts#recordFailure": {
    input: (s) => ({ coilId: s.coilId, sessionId: s.sessionId, componentId: "", mode: "unknown", occurredAt: localMinute(-0.01), symptoms: "Smelled hot and stopped." }),
    atTargetSite: "stored",
  },
  "app/(app)/failures/actions.ts#completePostMortemAction": {
    input: (s) => ({ failureId: s.openFailureId, rootCause: "Gate drive supply sagged at start-up.", correctiveAction: "Fitted a larger gate drive supply capacitor." }),
    atTargetSite: "stored",
  },
  "app/(app)/loans/actions.ts#lendCoilAction": {
    input: (s) => ({ coilId: s.coilId, borrower: "North school", borrowerContact: "", event: "Science fair", expectedBackAt: localDay(7) }),
    atTargetSite: "stored",
  },
  "app/(app)/loans/actions.ts#returnLoanAction": { input: (s) => ({ loanId: s.outLoanId, returnedAt: localDay(-1), returnCondition: "As lent", returnNotes: "" }), atTargetSite: "stored" },
  "app/(app)/sessions/actions.ts#logSession": { input: (s) => sessionForm(s), atTargetSite: "stored" },
  "app/(app)/sweeps/actions.ts#recordTypedSweep": {
    input: (s) => ({
      coilId: s.coilId,
      topLoadId: "",
      takenAt: new Date(Date.now() - 3_600_000).toISOString(),
      seriesResistanceOhm: "22k",
      sourceAmplitudeV: "20",
      amplitudeConvention: "peak",
      points: [
        { frequency: "100k", amplitude: "1" },
        { frequency: "200k", amplitude: "2" },
        { frequency: "300k", amplitude: "1" },
      ],
    }),
    atTargetSite: "stored",
  },
  "app/api/coils/route.ts#POST": { input: (s) => ({ ...(VALID_INPUT["app/api/coils/route.ts#POST"] as object), tag: s.tags[2] }), atTargetSite: "refused" },
  "app/api/import/json/route.ts#POST": { input: async (s, w) => JSON.parse(await exportedLogbook(s, w)) as unknown, atTargetSite: "refused" },
  "app/api/sessions/route.ts#POST": { input: (s) => ({ ...sessionForm(s), supplyCurrentA: 1.2, ambientTempC: 21 }), atTargetSite: "stored" },
  "app/api/sweeps/import/route.ts#POST": {
    input: (s) => ({
      coilId: s.coilId,
      topLoadId: "",
      takenAt: new Date(Date.now() - 3_600_000).toISOString(),
      seriesResistanceOhm: "22k",
      sourceAmplitudeV: "20",
      amplitudeConvention: "peak",
      frequenciesHz: [100_000, 200_000, 300_000],
      amplitudesV: [1, 2, 1],
    }),
    atTargetSite: "stored",
  },
  "app/api/auth/[...nextauth]/route.ts#POST": { exempt: "next-auth's sign-in/sign-out endpoint: it names no site's record" },
};

function sessionForm(s: SiteRecords) {
  return {
    coilId: s.coilId,
    startedAt: localMinute(-0.05),
    supplyVoltageV: "24 V",
    supplyCurrentA: "1.2 A",
    durationS: "10 min",
    ambientTempC: "21",
    heatSinkStartC: "21",
    heatSinkEndC: "30",
    runningFrequencyHz: "300k",
    notes: "Site probe",
    samples: "",
  };
}

/** The logbook file of a site's coil as its own admin exports it (the ghost's: the same file with the ghost's ids and tag). */
async function exportedLogbook(site: SiteRecords, world: SiteWorld): Promise<string> {
  const asTarget = { userId: session.userId, siteSlug: session.siteSlug };
  session.userId = world.targetAdmin;
  session.siteSlug = world.targetSlug;
  const exported = await callEntryPoint("app/api/export/coils/[tag]/route.ts#GET", undefined, { params: { tag: `${world.target.coilTag}.json` } });
  Object.assign(session, asTarget);
  expect(exported.status, exported.message).toBe(200);
  return site === world.target ? exported.body! : swapSite(exported.body!, world.target, site);
}

/** `text` with every id and tag of `from`'s copy written as `to`'s. */
function swapSite(text: string, from: SiteRecords, to: SiteRecords): string {
  let out = text.split(from.idPrefix).join(to.idPrefix);
  for (const [i, tag] of from.tags.entries()) out = out.split(tag).join(to.tags[i]!);
  return out;
}

/** An outcome with the site's own ids and tags written as the ghost's, so the two can be compared. */
function asGhost(outcome: Outcome, world: SiteWorld): Omit<Outcome, "body"> {
  return { status: outcome.status, message: swapSite(outcome.message, world.target, world.ghost).split(world.targetMember.id).join(world.ghostMember.id).split(world.targetMember.email).join(world.ghostMember.email) };
}

const world = {} as SiteWorld;

/** Two sites, each with its own copy of part of the demo club (the target's tags differ, so a tag names one coil). */
async function buildWorld(): Promise<void> {
  await resetSites();
  const callerSite = await makeSite("north-school", "North school");
  const targetSite = await makeSite("south-school", "South school");
  const callerRows = siteCopy({ siteId: callerSite.id, idPrefix: "sa-", thin: true });
  const targetRows = siteCopy({ siteId: targetSite.id, idPrefix: "sb-", tagPrefix: "B-", thin: true });
  await loadSiteRows(callerRows);
  await loadSiteRows(targetRows);
  Object.assign(world, {
    target: recordsOf(targetRows, targetSite, "sb-", "B-"),
    targetSlug: targetSite.slug,
    targetAdmin: (await makeSiteUser("admin@south.test", { [targetSite.id]: "admin" })).id,
    targetMember: await makeSiteUser("member@south.test", { [targetSite.id]: "member" }),
    ghost: recordsOf(siteCopy({ siteId: "site-nowhere", idPrefix: "sg-", tagPrefix: "G-" }), { id: "site-nowhere", slug: "nowhere-school" }, "sg-", "G-"),
    ghostMember: { id: "sg-user", email: "member@nowhere.test" },
    caller: (await makeSiteUser("admin@north.test", { [callerSite.id]: "admin" })).id,
    callerSiteId: callerSite.id,
    callerSlug: callerSite.slug,
    organiser: (await makeSiteUser("organiser@district.test", {}, true)).id,
  } satisfies SiteWorld);
}

/**
 * Both sites' records as built, again: a control run may have lent, returned or retired something at the target,
 * and a probe may have created coils at the caller's site (an import keeps the ids in its file, so importing the
 * ghost's file would make the ghost's ids real there).
 */
async function restoreSites(): Promise<void> {
  await deleteSiteRecords(world.target.siteId);
  await deleteSiteRecords(world.callerSiteId);
  await loadSiteRows(siteCopy({ siteId: world.callerSiteId, idPrefix: "sa-", thin: true }));
  await loadSiteRows(siteCopy({ siteId: world.target.siteId, idPrefix: "sb-", tagPrefix: "B-", thin: true }));
  // The other site's member as built: a member there, of no other site, not an organisation admin.
  await testDb.siteMembership.deleteMany({ where: { userId: world.targetMember.id } });
  await testDb.siteMembership.create({ data: { userId: world.targetMember.id, siteId: world.target.siteId, role: "member" } });
  await testDb.user.update({ where: { id: world.targetMember.id }, data: { organisationAdmin: false, active: true } });
  await testDb.site.updateMany({ where: { id: world.target.siteId }, data: { slug: world.targetSlug, name: "South school" } });
  await testDb.user.deleteMany({ where: { email: world.ghostMember.email } });
}

const asCaller = () => Object.assign(session, { userId: world.caller, siteSlug: world.targetSlug });
const asTargetAdmin = () => Object.assign(session, { userId: world.targetAdmin, siteSlug: world.targetSlug });

describe("every mutating entry point has a site probe", () => {
  it("SITE_PROBES names exactly the entry points in the file tree", () => {
    const discovered = discoverEntryPoints(ROOT);
    expect(discovered.filter((key) => !(key in SITE_PROBES)), "entry points with no probe in SITE_PROBES — add an input naming another site's records").toEqual([]);
    expect(Object.keys(SITE_PROBES).filter((key) => !discovered.includes(key)), "SITE_PROBES names entry points that no longer exist").toEqual([]);
  });
});

describe("a site's admin cannot reach another site's records through any entry point", () => {
  beforeAll(buildWorld);

  const probed = Object.entries(SITE_PROBES).filter((entry): entry is [string, Extract<Probe, { input: unknown }>] => "input" in entry[1]);

  it.each(probed)("%s: answers as for a record that does not exist, and changes nothing at the other site", async (key, probe) => {
    await restoreSites();
    const targetBefore = await siteSnapshot(world.target.siteId);
    asCaller();
    const crossSite = await callEntryPoint(key, await probe.input(world.target, world, world.targetMember), { throws: "record" });
    expect(snapshotDifference(targetBefore, await siteSnapshot(world.target.siteId)), `${key} changed the other site's records`).toEqual({});
    if (!probe.notComparedWithMissing) {
      const ghost = await callEntryPoint(key, await probe.input(world.ghost, world, world.ghostMember), { throws: "record" });
      expect(asGhost(crossSite, world), "the answer for another site's record differs from the answer for one that does not exist").toEqual(asGhost(ghost, world));
    }

    // The control: the same input from the other site's own admin reaches the record.
    asTargetAdmin();
    const atTarget = await callEntryPoint(key, await probe.input(world.target, world, world.targetMember), { throws: "record" });
    if (probe.atTargetSite === "stored") expect([200, 201, 303], `${key} as the site's own admin: ${atTarget.message}`).toContain(atTarget.status);
    else expect([409, 422], `${key} as the site's own admin should be refused (the record is there): ${atTarget.message}`).toContain(atTarget.status);
    if (!probe.notComparedWithMissing) expect(asGhost(atTarget, world), "the site's own admin gets the same answer: the probe never reached a record").not.toEqual(asGhost(crossSite, world));
  });
});

// ───────────────────────── pages that show a record ─────────────────────────

interface RecordPage {
  params: (site: SiteRecords) => Record<string, string>;
  searchParams?: (site: SiteRecords) => Record<string, string>;
  /** Why an organisation admin working at another site is answered (without the record) rather than "not found". */
  answersOrganiser?: string;
}

/** Every page (and GET route) that shows one record, with how to name a site's record. */
const RECORD_PAGES: Record<string, RecordPage> = {
  "app/(app)/clearances/[id]/page.tsx": { params: (s) => ({ id: s.clearanceId }) },
  "app/(app)/clearances/[id]/sheet/page.tsx": { params: (s) => ({ id: s.clearanceId }) },
  "app/(app)/coils/[tag]/edit/page.tsx": { params: (s) => ({ tag: s.coilTag }) },
  "app/(app)/coils/[tag]/label/page.tsx": { params: (s) => ({ tag: s.coilTag }) },
  "app/(app)/coils/[tag]/page.tsx": { params: (s) => ({ tag: s.coilTag }) },
  "app/(app)/coils/[tag]/parts/[id]/replace/page.tsx": { params: (s) => ({ tag: s.coilTag, id: s.componentId }) },
  "app/(app)/coils/[tag]/parts/new/page.tsx": { params: (s) => ({ tag: s.coilTag }) },
  "app/(app)/coils/[tag]/top-loads/new/page.tsx": { params: (s) => ({ tag: s.coilTag }) },
  "app/(app)/failures/[id]/page.tsx": { params: (s) => ({ id: s.failureId }) },
  "app/(app)/failures/[id]/report/page.tsx": { params: (s) => ({ id: s.failureId }) },
  "app/(app)/fleet/[tag]/trends/page.tsx": { params: (s) => ({ tag: s.coilTag }) },
  "app/(app)/loans/[id]/return/page.tsx": { params: (s) => ({ id: s.outLoanId }) },
  "app/(app)/loans/[id]/sheet/page.tsx": { params: (s) => ({ id: s.outLoanId }) },
  "app/(app)/sessions/[id]/page.tsx": { params: (s) => ({ id: s.sessionId }) },
  "app/(app)/sweeps/[id]/page.tsx": { params: (s) => ({ id: s.sweepId }) },
  "app/api/export/coils/[tag]/[table]/route.ts#GET": { params: (s) => ({ tag: s.coilTag, table: "sessions.csv" }) },
  "app/api/export/coils/[tag]/route.ts#GET": { params: (s) => ({ tag: `${s.coilTag}.json` }) },
};

/**
 * Pages that take a record named in the query string (listed by hand: a page that only filters a list by it, such as
 * /sessions?coil=, shows the scope's records only, which test/site-isolation-reads.test.ts proves of every read).
 * "file?what" for a page of RECORD_PAGES opened with a query.
 */
const QUERY_RECORD_PAGES: Record<string, RecordPage> = {
  "app/(app)/clearances/new/page.tsx": { params: () => ({}), searchParams: (s) => ({ coil: s.coilTag }) },
  "app/(app)/loans/new/page.tsx": { params: () => ({}), searchParams: (s) => ({ coil: s.coilTag }) },
  "app/(app)/sweeps/new/page.tsx": { params: () => ({}), searchParams: (s) => ({ coil: s.coilTag }) },
  "app/(app)/sweeps/import/page.tsx": { params: () => ({}), searchParams: (s) => ({ coil: s.coilTag }) },
  // A label's link names its site: for a site the caller does not belong to, the coil page is not found either.
  "app/(app)/coils/[tag]/page.tsx?site": {
    params: (s) => ({ tag: s.coilTag }),
    searchParams: (s) => ({ site: s.siteSlug }),
    answersOrganiser: "someone who may reach the label's site is told to switch to it; the page reads nothing of the coil",
  },
};

type PageAnswer = "found" | "not-found" | "forbidden" | "redirect";

async function openRecordPage(key: string, page: RecordPage, site: SiteRecords): Promise<PageAnswer> {
  const file = key.split("?")[0]!;
  if (file.includes("#")) {
    const outcome = await callEntryPoint(file, undefined, { params: page.params(site) });
    if (outcome.status === 200) return "found";
    if (outcome.status === 404) return "not-found";
    throw new Error(`${file} answered ${outcome.status}: ${outcome.message}`);
  }
  const render = await loadExport(file, "default");
  try {
    await render({ params: Promise.resolve(page.params(site)), searchParams: Promise.resolve(page.searchParams?.(site) ?? {}) });
    return "found";
  } catch (error) {
    const digest = (error as { digest?: string }).digest ?? "";
    if (digest === "NEXT_HTTP_ERROR_FALLBACK;404") return "not-found";
    if (digest === "NEXT_HTTP_ERROR_FALLBACK;403") return "forbidden";
    if (digest.startsWith("NEXT_REDIRECT")) return "redirect";
    throw error;
  }
}

/** Every GET route without a dynamic segment: a list or whole-fleet export (checked below), or why it reads no site's records. */
const LIST_ROUTES: Record<string, "lists records" | { exempt: string }> = {
  "app/api/coils/route.ts#GET": "lists records",
  "app/api/export/fleet.csv/route.ts#GET": "lists records",
  "app/api/export/fleet.json/route.ts#GET": "lists records",
  "app/api/export/sessions.csv/route.ts#GET": "lists records",
  "app/api/bench-floor/route.ts#GET": { exempt: "the benchmark's floor: reads no data at all (and answers 404 unless the benchmark started the server)" },
};

describe("every page that shows a record is in the record-page table", () => {
  it("LIST_ROUTES names exactly the GET routes without a dynamic segment", () => {
    const discovered = discoverListRoutes(ROOT);
    expect(discovered.filter((key) => !(key in LIST_ROUTES)), "GET routes missing from LIST_ROUTES").toEqual([]);
    expect(Object.keys(LIST_ROUTES).filter((key) => !discovered.includes(key)), "LIST_ROUTES names routes that no longer exist").toEqual([]);
  });

  it("RECORD_PAGES names exactly the record pages in the file tree", () => {
    const discovered = discoverRecordPages(ROOT);
    expect(discovered.filter((file) => !(file in RECORD_PAGES)), "record pages missing from RECORD_PAGES — add how to name a site's record").toEqual([]);
    expect(Object.keys(RECORD_PAGES).filter((file) => !discovered.includes(file)), "RECORD_PAGES names pages that no longer exist").toEqual([]);
  });
});

describe("a site's admin gets not-found for another site's record on every record page", () => {
  beforeAll(buildWorld);

  it.each(Object.entries({ ...RECORD_PAGES, ...QUERY_RECORD_PAGES }))("%s", async (file, page) => {
    asTargetAdmin();
    expect(await openRecordPage(file, page, world.target), "the site's own admin sees the record (the control)").toBe("found");
    asCaller();
    expect(await openRecordPage(file, page, world.target)).toBe("not-found");
    // An organisation admin may switch to the other site, but while working at this one its records are not found here either.
    if (!page.answersOrganiser) {
      Object.assign(session, { userId: world.organiser, siteSlug: world.callerSlug });
      expect(await openRecordPage(file, page, world.target)).toBe("not-found");
    }
    expect(await openRecordPage(file, page, world.ghost)).toBe("not-found");
  });

  it.each(Object.entries(LIST_ROUTES).filter(([, reason]) => reason === "lists records").map(([key]) => key))("%s: a site's answer names none of the other site's records", async (key) => {
    asTargetAdmin();
    const own = await callEntryPoint(key, undefined);
    expect(own.status).toBe(200);
    expect(own.body, "the control: the other site's own answer names its records").toContain(world.target.coilTag);
    asCaller();
    const outcome = await callEntryPoint(key, undefined);
    expect(outcome.status).toBe(200);
    expect(outcome.body).not.toContain(world.target.idPrefix);
    for (const tag of world.target.tags) expect(outcome.body).not.toContain(tag);
  });

  it("a coil lent to the caller's site: its loan sheet and clearance sheet are visible there, nothing else of the lending site", async () => {
    await testDb.loan.update({ where: { id: world.target.outLoanId }, data: { borrowerSiteId: world.callerSiteId } });
    asCaller();
    const borrowed: SiteRecords = { ...world.target, clearanceId: world.target.outLoanClearanceId, coilTag: world.target.outLoanCoilTag };
    expect(await openRecordPage("app/(app)/loans/[id]/sheet/page.tsx", RECORD_PAGES["app/(app)/loans/[id]/sheet/page.tsx"]!, borrowed)).toBe("found");
    expect(await openRecordPage("app/(app)/clearances/[id]/sheet/page.tsx", RECORD_PAGES["app/(app)/clearances/[id]/sheet/page.tsx"]!, borrowed)).toBe("found");
    for (const file of ["app/(app)/coils/[tag]/page.tsx", "app/(app)/coils/[tag]/label/page.tsx", "app/(app)/loans/[id]/return/page.tsx", "app/(app)/clearances/[id]/page.tsx", "app/api/export/coils/[tag]/route.ts#GET"]) {
      expect(await openRecordPage(file, RECORD_PAGES[file]!, borrowed), file).toBe("not-found");
    }
    await testDb.loan.update({ where: { id: world.target.outLoanId }, data: { borrowerSiteId: null } });
  });
});
