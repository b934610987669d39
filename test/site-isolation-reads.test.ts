/**
 * No read through lib/db returns a record outside the caller's site, over random networks of sites.
 *
 * fast-check builds a few sites, each with its own copy of some demo coils (with the same tags at several sites,
 * as real schools would choose them) and everything recorded about them, its own lending policy or none, audit
 * events, loans lent to another site, and people with random memberships and roles (and sometimes an
 * organisation admin). Each person's scope is worked out the way a request works it out (lib/auth/session.ts,
 * with the site cookie naming any site, theirs or not); then every scoped read of lib/db is called with ids and
 * tags of records of every site. Every id of a site's record that appears anywhere in an answer must belong to the
 * scope's site; the only exceptions are what a borrowing site may see of a loan lent to it, and only through the
 * reads listed in BORROWER_READS.
 *
 * The reads are enumerated from the modules' source: every exported function of lib/db whose first parameter is a
 * `SiteScope` is in SCOPED_READS (with how to call it) or SCOPED_WRITES (their isolation is proven by the site
 * probes of test/security-roles.test.ts); every other exported function is in UNSCOPED with the reason it needs no
 * scope. A new function fails the first test until it is listed.
 */
import { readFileSync, readdirSync } from "node:fs";
import path from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { SiteScope } from "@/lib/db/site-scope";
import { encode } from "next-auth/jwt";
import { getCurrentUser } from "@/lib/auth/session";
import { sessionCookieName } from "@/lib/auth/session-token";
import { appEnv } from "@/lib/config/env";
import { testDb } from "./support/db";
import { loadSiteRows, makeSite, resetSites, siteCopy } from "./support/site-fixtures";

const session = vi.hoisted(() => ({ userId: null as string | null, siteSlug: undefined as string | undefined }));
vi.mock("next/headers", () => ({
  headers: vi.fn(async () => new Headers()),
  cookies: vi.fn(async () => requestCookies()),
}));

/** The request's cookies: the session cookie the sign-in would have set for `session.userId`, and the site cookie. */
async function requestCookies() {
  const all = session.userId ? [{ name: sessionCookieName(), value: await encode({ token: { sub: session.userId }, secret: appEnv().NEXTAUTH_SECRET }) }] : [];
  if (session.siteSlug) all.push({ name: "coilyard-site", value: session.siteSlug });
  const get = (name: string) => all.find((cookie) => cookie.name === name);
  return { get, getAll: () => all, has: (name: string) => get(name) !== undefined };
}

const LIB_DB = path.resolve(__dirname, "../lib/db");

/** What a read is called with besides the scope: ids and tags drawn from every site of the world. */
interface Picks {
  coilId(): string;
  coilTag(): string;
  sweepId(): string;
  sessionId(): string;
  failureId(): string;
  clearanceId(): string;
  loanId(): string;
  componentId(): string;
  now: Date;
}
type Call = (scope: SiteScope, pick: Picks, read: Record<string, (...args: unknown[]) => Promise<unknown>>) => Promise<unknown>;

const args =
  (...make: ((pick: Picks) => unknown)[]): Call =>
  (scope, pick, read) =>
    read.self!(scope, ...make.map((m) => m(pick)));

/**
 * Every scoped read and how to call it. `read.self` is the function itself; `read.<name>` another export of the same
 * module (a read whose input is another read's answer gets that answer for the same scope).
 */
const SCOPED_READS: Record<string, Call> = {
  "audit.ts#listAuditEvents": args(() => ({})),
  "audit.ts#listAuditEntities": args(),
  "clearances.ts#loadClearanceHistory": args((p) => p.coilId()),
  "clearances.ts#evaluateCoilForClearance": args((p) => p.coilId(), () => ({}), (p) => p.now),
  "clearances.ts#getClearance": args((p) => p.clearanceId()),
  "clearances.ts#listClearances": args(() => ({})),
  "clearances.ts#getCoilClearanceState": args((p) => p.coilId(), (p) => p.now),
  "clearances.ts#getClearanceStateById": args((p) => p.clearanceId(), (p) => p.now),
  "clearances.ts#listClearancesWithState": args((p) => p.now),
  "clearances.ts#getCoilHealthForClearance": args((p) => p.coilId(), (p) => p.now),
  "clearances.ts#getClearanceSheet": args((p) => p.clearanceId(), (p) => p.now),
  "coil-summary.ts#getCoilFigures": async (scope, pick, read) => {
    const policy = await (await import("@/lib/db/policy")).getCurrentPolicy(scope);
    return read.self!(scope, [pick.coilId(), pick.coilId(), pick.coilId()], policy, pick.now);
  },
  "coil-summary.ts#computeFiguresFor": async (scope, pick, read) => {
    const policy = await (await import("@/lib/db/policy")).getCurrentPolicy(scope);
    return read.self!(scope, [pick.coilId(), pick.coilId(), pick.coilId()], new Map(), policy, pick.now);
  },
  "coil-history.ts#getCoilHistory": args((p) => p.coilId()),
  "coil-history.ts#getCoilPageHistory": args((p) => p.coilId()),
  "coil-history.ts#getFleetHistory": args(),
  "coil-history.ts#getFleetHealthHistory": args((p) => [p.coilId(), p.coilId()]),
  "coil-page.ts#readCoilPage": args((p) => p.coilTag()),
  "coil-standing.ts#readCoilStanding": args((p) => p.coilId(), () => [], (p) => p.now),
  "coil-timeline.ts#getCoilTimeline": args((p) => p.coilId()),
  "coils.ts#listCoils": args(() => ({})),
  "coils.ts#listCoilChoices": args(),
  "coils.ts#getCoilByTag": args((p) => p.coilTag()),
  "components.ts#getComponent": args((p) => p.componentId()),
  "export.ts#exportCoil": args((p) => p.coilTag()),
  "export.ts#exportFleet": args(),
  "failures.ts#listFailures": args(() => ({})),
  "failures.ts#getFailureDetail": args((p) => p.failureId()),
  "fleet.ts#readLatestClearances": args(),
  "fleet.ts#getFleetOverview": args((p) => p.now),
  "fleet.ts#getPartReliability": args(),
  "loans.ts#listLoans": args(() => ({ state: "all" })),
  "loans.ts#listLoansNeedingRecall": args((p) => p.now),
  "loans.ts#getLoan": args((p) => p.loanId()),
  "loans.ts#getLoanHandover": args((p) => p.loanId()),
  "loans.ts#listBorrowedLoans": args(() => ({ state: "all" }), (p) => p.now),
  "loans.ts#listBorrowerSites": args(),
  "loans.ts#listSessionsInLoanWindow": args((p) => ({ coilId: p.coilId(), outAt: new Date(0) }), (p) => p.now),
  "plans.ts#listPlanStartingPoints": args(),
  "policy.ts#getCurrentPolicy": args(),
  "policy.ts#listPolicyVersions": args(),
  "prediction-history.ts#readRunningFrequencies": args((p) => p.coilId()),
  "prediction-history.ts#readFleetPredictionInputs": args(),
  "prediction-history.ts#readFleetRunningInputs": args(),
  "prediction-history.ts#readCoilComparison": async (scope, pick, read) => {
    const history = await (await import("@/lib/db/coil-history")).getCoilPageHistory(scope, pick.coilId());
    return history ? read.self!(scope, history) : null;
  },
  "sessions.ts#listSessions": args(() => ({})),
  "sessions.ts#findLastTopLoadId": args((p) => p.coilId()),
  "sessions.ts#getSessionDetail": args((p) => p.sessionId()),
  "sweep-thumbnail.ts#readSweepThumbnail": args((p) => p.sweepId()),
  "sweeps.ts#listSweeps": args(() => ({})),
  "sweeps.ts#getSweep": args((p) => p.sweepId()),
  "sweeps.ts#getCoilForSweepEntry": args((p) => p.coilTag()),
  "sweeps.ts#listCalibrationSweeps": args((p) => p.coilId()),
  "sites.ts#listSites": args(),
  "district.ts#getDistrictHealth": args((p) => p.now),
  "users.ts#listSiteMembers": args(),
  "users.ts#listAllUsers": args(),
  "fleet-summary.ts#readFleetSummaryRows": args(),
  "part-hours.ts#readPartFittedSeconds": args(),
  // The streamed export, drained page by page: every row it would send.
  "session-export.ts#openSessionExport": async (scope, _pick, read) => {
    const exported = (await read.self!(scope, {})) as { pages: AsyncIterable<unknown[]> };
    const rows: unknown[] = [];
    for await (const page of exported.pages) rows.push(...page);
    return rows;
  },
};

/** Reads of people: every person in the answer must belong to the scope's site (an organisation admin's listAllUsers excepted). */
const MEMBERSHIP_READS = new Set(["users.ts#listSiteMembers"]);

/** Scoped writes: their isolation is proven by the site probes of test/security-roles.test.ts (and each area's own tests). */
const SCOPED_WRITES = new Set([
  "clearances.ts#signClearance",
  "coils.ts#createCoil",
  "coils.ts#setCoilStatus",
  "coils.ts#updateCoil",
  "components.ts#addComponent",
  "components.ts#replaceComponent",
  "failures.ts#createFailure",
  "failures.ts#completePostMortem",
  "import.ts#importLogbook",
  "loans.ts#createLoan",
  "loans.ts#returnLoan",
  "plans.ts#savePlannedCoil",
  "policy.ts#saveDefaultPolicyVersion",
  "policy.ts#saveSitePolicyVersion",
  "coil-summary.ts#storeCoilFigures",
  "clearances.ts#recordClearanceLapse",
  "clearances.ts#recordLapseCausedByWrite",
  "session-fits.ts#backfillSessionFits",
  "sessions.ts#createSession",
  "sweeps.ts#recordSweep",
  "top-loads.ts#addTopLoad",
  "top-loads.ts#retireTopLoad",
  "sites.ts#createSite",
  "sites.ts#renameSite",
  "sites.ts#addMemberByEmail",
  "sites.ts#removeMember",
  "users.ts#createUser",
  "users.ts#updateUserAccess",
  "users.ts#setOrganisationAdmin",
]);

/** Functions that take a scope but read or write no record. */
const SCOPED_HELPERS: Record<string, string> = {
  "site-scope.ts#coilOfSite": "builds the scope's filter for a query",
  "site-scope.ts#recordOfSite": "builds the scope's filter for a query",
};

/** Exported functions that take no scope, and why none is needed. */
const UNSCOPED: Record<string, string> = {
  "adapter-read.ts#readRows": "runs the statement its scoped caller built (every caller narrows by the scope's site in its SQL)",
  "adapter-read.ts#adapterQuery": "pure: a statement in the driver adapter's form",
  "audit.ts#recordAudit": "writes inside a caller's transaction; the entry names its site",
  "clearances.ts#describeClearRefusal": "pure: words for failed rules",
  "client.ts#createPrismaClient": "the connection itself",
  "client.ts#connectedAdapter": "the connection itself (the session write's driver adapter)",
  "session-write.ts#adapterErrorKind": "pure: classifies a driver error",
  "session-write.ts#isAdapterWriteConflict": "pure: classifies a driver error",
  "session-write.ts#newRecordId": "pure: a new id",
  "session-write.ts#inAdapterTransaction": "runs the caller's statements in one transaction; the session write scopes its own statements (test/session-write.test.ts, and the role test's site probes of logging a session)",
  "coil-summary.ts#computeCoilFigures": "pure: figures from a history already read in scope",
  "coil-summary.ts#readCurrentFigures": "pure: checks a stored row's freshness",
  "copy-database.ts#copyDatabase": "the whole-database copy tool (db:copy), run by an operator, keeps every record's site",
  "copy-database.ts#verifyCopy": "the whole-database copy tool (db:copy)",
  "copy-database.ts#copyDatabaseByUrl": "the whole-database copy tool (db:copy)",
  "copy-database.ts#digestTable": "the whole-database copy tool (db:copy)",
  "demo-loader.ts#countUsersForSeed": "the seed script: counts accounts before loading the demo network",
  "demo-loader.ts#loadDemoDataset": "the seed script: writes the demo network, each record with its site",
  "demo-loader.ts#emptyDatabase": "the demo reset: empties everything",
  "demo-loader.ts#disconnect": "closes the connection",
  "fleet.ts#selectFleetRows": "pure: filters rows already read in scope",
  "fleet-summary.ts#fleetSummaryStatement": "pure: builds the statement for the site id its scoped caller (readFleetSummaryRows) or the benchmark passes; it runs nothing",
  "policy.ts#combinePolicies": "pure: the stricter of the organisation's default and a site's own rules",
  "policy.ts#getDefaultPolicy": "the organisation's default policy, the same for every site (a site's own rules only tighten it)",
  "pagination.ts#normalizePage": "pure",
  "pagination.ts#toPage": "pure",
  "pg-adapter.ts#createPostgresAdapter": "the connection itself",
  "raw-read.ts#rawDate": "pure: converts a raw SQL value",
  "raw-read.ts#rawDateOrNull": "pure: converts a raw SQL value",
  "raw-read.ts#rawCount": "pure: converts a raw SQL value",
  "serializable.ts#serializableTransaction": "runs a caller's transaction",
  "serializable.ts#isWriteConflict": "pure: classifies an error",
  "session-fits.ts#fitsBySession": "pure: fits from samples already read",
  "session-fits.ts#backfillSessionFitsEverySite": "the setup script: runs the scoped backfill once per site",
  "sign-in-throttle.ts#getThrottle": "before sign-in, no site is known: keyed by e-mail or client address",
  "sign-in-throttle.ts#recordThrottleFailure": "before sign-in, keyed by e-mail or client address",
  "sign-in-throttle.ts#clearThrottle": "before sign-in, keyed by e-mail or client address",
  "site-access.ts#getUserAccess": "who the user is and which sites they reach: what the scope is made from",
  "text-search.ts#textContains": "pure: builds a filter",
  "sites.ts#findReachableSite": "which site an actor may switch to: what the scope is made from",
  "sites.ts#findSiteBySlug": "for scripts run on the server, which have no actor to scope by",
  "users.ts#findUserForSignIn": "sign-in, before any site is known",
  "users.ts#getUserById": "the account itself, organisation-wide",
  "users.ts#countUsers": "the seed and setup scripts: is the database empty",
  "users.ts#markSignedIn": "sign-in, before any site is known",
  "users.ts#isOrganisationAdmin": "the actor's own standing, organisation-wide",
  "users.ts#assertMayManageSite": "a check inside a caller's transaction, given the caller's scope",
  "users.ts#assertOrganisationAdmin": "a check inside a caller's transaction",
  "users.ts#assertAdminsRemain": "a check inside a caller's transaction",
  "users.ts#createOrganisationAdmin": "scripts/create-admin.ts, run by an operator on the server",
  "coil-summary.ts#markCoilChanged": "writes inside a caller's transaction, for a coil the caller already found in scope",
};

/** Reads a borrowing site may use to see a loan lent to it, and the clearance it went out on. */
const BORROWER_READS = new Set(["loans.ts#listBorrowedLoans", "loans.ts#getLoan", "loans.ts#getLoanHandover", "clearances.ts#getClearanceSheet"]);

interface ExportedFunction {
  key: string;
  scoped: boolean;
}

/** Every exported function of lib/db (not the generated clients, not tests), and whether its first parameter is a SiteScope. */
function exportedFunctions(): ExportedFunction[] {
  const found: ExportedFunction[] = [];
  for (const file of readdirSync(LIB_DB).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts"))) {
    const source = readFileSync(path.join(LIB_DB, file), "utf8");
    for (const match of source.matchAll(/export\s+(?:async\s+)?function\*?\s+(\w+)\s*(?:<[^>]*>)?\(([^)]*)/g)) {
      found.push({ key: `${file}#${match[1]}`, scoped: /^\s*\w+\s*:\s*SiteScope\b/.test(match[2]!) });
    }
    for (const match of source.matchAll(/export\s+const\s+(\w+)\s*=\s*(?:async\s*)?(?:\(([^)]*)\)|\w+)\s*=>/g)) {
      found.push({ key: `${file}#${match[1]}`, scoped: /^\s*\w+\s*:\s*SiteScope\b/.test(match[2] ?? "") });
    }
  }
  return found.sort((a, b) => a.key.localeCompare(b.key));
}

describe("every exported function of lib/db is accounted for", () => {
  it("scoped reads are called below, scoped writes are probed by the role test, the rest say why they need no scope", () => {
    const functions = exportedFunctions();
    const unlisted = functions.filter(({ key, scoped }) => (scoped ? !(key in SCOPED_READS) && !SCOPED_WRITES.has(key) && !(key in SCOPED_HELPERS) : !(key in UNSCOPED)));
    expect(unlisted.map((f) => `${f.key}${f.scoped ? " (takes a scope: a read for SCOPED_READS or a write for SCOPED_WRITES)" : " (no scope: say why in UNSCOPED)"}`)).toEqual([]);
    const listedScoped = [...Object.keys(SCOPED_READS), ...SCOPED_WRITES, ...Object.keys(SCOPED_HELPERS)];
    const scopedNow = new Set(functions.filter((f) => f.scoped).map((f) => f.key));
    expect(listedScoped.filter((key) => !scopedNow.has(key)), "listed as scoped but gone, or no longer taking a scope first").toEqual([]);
    expect(Object.keys(UNSCOPED).filter((key) => !functions.some((f) => f.key === key && !f.scoped)), "UNSCOPED names functions that are gone or now take a scope").toEqual([]);
  });
});

// ───────────────────────── the world ─────────────────────────

const DEMO_TAGS = ["KM-01", "KM-02", "KM-03", "KM-04", "KM-05", "KM-06", "KM-07"];

interface WorldShape {
  sites: { tags: string[]; ownPolicy: boolean }[];
  people: { memberships: (null | "member" | "steward" | "admin")[]; organisationAdmin: boolean; cookieSite: number }[];
  /** Per site: lend its first out loan (if any) to the site at this index (null: a loan within the site). */
  lendTo: (number | null)[];
}

const worldShape: fc.Arbitrary<WorldShape> = fc.integer({ min: 2, max: 3 }).chain((siteCount) =>
  fc.record({
    sites: fc.array(fc.record({ tags: fc.subarray(DEMO_TAGS, { minLength: 1, maxLength: 3 }), ownPolicy: fc.boolean() }), { minLength: siteCount, maxLength: siteCount }),
    people: fc.array(
      fc.record({
        memberships: fc.array(fc.constantFrom(null, "member" as const, "steward" as const, "admin" as const), { minLength: siteCount, maxLength: siteCount }),
        organisationAdmin: fc.oneof({ arbitrary: fc.constant(false), weight: 4 }, { arbitrary: fc.constant(true), weight: 1 }),
        cookieSite: fc.integer({ min: 0, max: siteCount }),
      }),
      { minLength: 1, maxLength: 4 },
    ),
    lendTo: fc.array(fc.option(fc.integer({ min: 0, max: siteCount - 1 }), { nil: null }), { minLength: siteCount, maxLength: siteCount }),
  }),
);

interface World {
  siteIds: string[];
  slugs: string[];
  /** Record id → the site it belongs to. */
  siteOf: Map<string, string>;
  ids: Record<"coil" | "sweep" | "session" | "failure" | "clearance" | "loan" | "component", string[]>;
  tags: string[];
  /** Per borrowing site: ids it may see of loans lent to it (the loan, its clearance, the coil). */
  borrowed: Map<string, Set<string>>;
  people: { id: string; organisationAdmin: boolean; roles: Map<string, string>; cookieSlug: string | undefined }[];
}

let policyVersion = 100;

async function buildWorld(shape: WorldShape): Promise<World> {
  await resetSites();
  const world: World = {
    siteIds: [],
    slugs: [],
    siteOf: new Map(),
    ids: { coil: [], sweep: [], session: [], failure: [], clearance: [], loan: [], component: [] },
    tags: [],
    borrowed: new Map(),
    people: [],
  };
  const defaultPolicy = await testDb.clearancePolicy.findFirstOrThrow({ where: { siteId: null } });
  for (const [i, spec] of shape.sites.entries()) {
    const site = await makeSite(`site-${i}`, `Site ${i}`);
    world.siteIds.push(site.id);
    world.slugs.push(site.slug);
    const rows = siteCopy({ siteId: site.id, idPrefix: `s${i}-`, tags: spec.tags, thin: true });
    await loadSiteRows(rows);
    const note = (kind: keyof World["ids"], list: Record<string, unknown>[]) => {
      for (const row of list) {
        world.ids[kind].push(row.id as string);
        world.siteOf.set(row.id as string, site.id);
      }
    };
    note("coil", rows.coils);
    note("sweep", rows.sweeps);
    note("session", rows.sessions);
    note("failure", rows.failures);
    note("clearance", rows.clearances);
    note("loan", rows.loans);
    note("component", rows.components);
    for (const table of ["topLoads", "sweepResonances"] as const) for (const row of rows[table]) world.siteOf.set(row.id as string, site.id);
    world.tags.push(...rows.coils.map((c) => c.tag as string));
    if (spec.ownPolicy) {
      const id = `s${i}-policy`;
      await testDb.clearancePolicy.create({ data: { id, siteId: site.id, version: ++policyVersion, rulesJson: defaultPolicy.rulesJson, note: `Site ${i}'s own` } });
      world.siteOf.set(id, site.id);
    }
    // Audit events naming the site's records, so an audit read that ignored the site would show them.
    await testDb.auditEvent.createMany({
      data: rows.coils.map((coil) => ({ siteId: site.id, action: "update", entity: "Coil", entityId: coil.id as string, summary: `Probe on ${coil.tag as string}` })),
    });
    const lendTo = shape.lendTo[i];
    const loan = rows.loans.find((l) => !l.returnedAt);
    // Sites after this one are made later: the loan is lent once they all exist.
    if (lendTo !== null && lendTo !== undefined && lendTo !== i && loan) {
      pendingLoans.push({ loanId: loan.id as string, siteIndex: lendTo, visible: [loan.id as string, loan.clearanceId as string, loan.coilId as string] });
    }
  }
  for (const pending of pendingLoans.splice(0)) {
    const siteId = world.siteIds[pending.siteIndex]!;
    await testDb.loan.update({ where: { id: pending.loanId }, data: { borrowerSiteId: siteId } });
    const visible = world.borrowed.get(siteId) ?? new Set<string>();
    for (const id of pending.visible) visible.add(id);
    world.borrowed.set(siteId, visible);
  }
  for (const [n, person] of shape.people.entries()) {
    const memberships = person.memberships.map((role, i) => (role ? { siteId: world.siteIds[i]!, role } : null)).filter((m) => m !== null);
    const user = await testDb.user.create({
      data: { email: `person-${n}@network.test`, name: `Person ${n}`, passwordHash: "not-used", organisationAdmin: person.organisationAdmin, memberships: { create: memberships } },
    });
    world.people.push({ id: user.id, organisationAdmin: person.organisationAdmin, roles: new Map(memberships.map((m) => [m.siteId, m.role])), cookieSlug: world.slugs[person.cookieSite] });
  }
  return world;
}
const pendingLoans: { loanId: string; siteIndex: number; visible: string[] }[] = [];

/** A small deterministic generator for the picks (fast-check gives its seed). */
function picker(world: World, seed: number): Picks {
  let state = seed >>> 0 || 1;
  const next = () => {
    state = (state * 1_664_525 + 1_013_904_223) >>> 0;
    return state / 2 ** 32;
  };
  const from = (list: string[]) => list[Math.floor(next() * list.length)] ?? "no-such-record";
  return {
    coilId: () => from(world.ids.coil),
    coilTag: () => from(world.tags),
    sweepId: () => from(world.ids.sweep),
    sessionId: () => from(world.ids.session),
    failureId: () => from(world.ids.failure),
    clearanceId: () => from(world.ids.clearance),
    loanId: () => from(world.ids.loan),
    componentId: () => from(world.ids.component),
    now: new Date(),
  };
}

/** Every string anywhere in a value (objects, arrays, Maps, Sets), e.g. every id an answer names. */
function stringsIn(value: unknown, out: Set<string> = new Set(), seen: Set<object> = new Set()): Set<string> {
  if (typeof value === "string") out.add(value);
  else if (value && typeof value === "object" && !(value instanceof Date) && !seen.has(value)) {
    seen.add(value);
    const items = value instanceof Map ? [...value.keys(), ...value.values()] : value instanceof Set ? [...value] : Array.isArray(value) ? value : Object.values(value);
    for (const item of items) stringsIn(item, out, seen);
  }
  return out;
}

/** An error of a class that a lib/db module exports (its refusals), as opposed to a crash. */
async function isLibDbError(error: unknown): Promise<boolean> {
  for (const file of readdirSync(LIB_DB).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts"))) {
    const mod = await moduleOf(file);
    if (Object.values(mod).some((value) => typeof value === "function" && /^class\s/.test(Function.prototype.toString.call(value)) && error instanceof (value as unknown as new () => object))) return true;
  }
  return false;
}

const modules = new Map<string, Record<string, (...args: unknown[]) => Promise<unknown>>>();
async function moduleOf(file: string) {
  if (!modules.has(file)) modules.set(file, (await import(path.join(LIB_DB, file))) as Record<string, (...args: unknown[]) => Promise<unknown>>);
  return modules.get(file)!;
}

describe("no scoped read returns a record of another site", () => {
  beforeAll(() => {
    session.userId = null;
  });
  afterAll(() => {
    session.userId = null;
    session.siteSlug = undefined;
  });

  it("over random sites, people, memberships and records", { timeout: 300_000 }, async () => {
    let readsChecked = 0;
    let ownRecordsSeen = 0;
    let borrowedRecordsSeen = 0;
    await fc.assert(
      fc.asyncProperty(worldShape, fc.integer(), async (shape, seed) => {
        const world = await buildWorld(shape);
        const pick = picker(world, seed);
        for (const person of world.people) {
          session.userId = person.id;
          session.siteSlug = person.cookieSlug;
          const reachable = person.organisationAdmin ? world.siteIds : [...person.roles.keys()];
          let user;
          try {
            user = await getCurrentUser();
          } catch (error) {
            // An account with no site is refused outright (403), never given a site.
            expect(reachable).toEqual([]);
            expect((error as { status?: number }).status).toBe(403);
            continue;
          }
          expect(user, "an active account with a site is signed in").not.toBeNull();
          const scope = user!.scope;
          // The scope is a site the person may reach: the cookie's when reachable, else one of theirs.
          expect(reachable).toContain(scope.siteId);
          if (person.cookieSlug && reachable.includes(world.siteIds[world.slugs.indexOf(person.cookieSlug)]!)) expect(user!.site.slug).toBe(person.cookieSlug);
          expect(user!.role).toBe(person.organisationAdmin ? "admin" : person.roles.get(scope.siteId));
          expect(scope.actorId).toBe(person.id);

          for (const [key, call] of Object.entries(SCOPED_READS)) {
            const [file, name] = key.split("#") as [string, string];
            const mod = await moduleOf(file);
            let answer: unknown;
            try {
              answer = await call(scope, pick, { ...mod, self: mod[name]! });
            } catch (error) {
              // A refusal by the module's own error (another site's record not found, a read the role may not make) returns nothing.
              if (!(await isLibDbError(error))) throw error;
              answer = null;
            }
            readsChecked += 1;
            if (MEMBERSHIP_READS.has(key)) {
              const strangers = [...stringsIn(answer)].filter((s) => world.people.some((p) => p.id === s && !p.roles.has(scope.siteId)));
              expect(strangers, `${key} for ${scope.siteId} listed people of other sites`).toEqual([]);
            }
            const allowed = BORROWER_READS.has(key) ? (world.borrowed.get(scope.siteId) ?? new Set<string>()) : new Set<string>();
            const foreign = [...stringsIn(answer)].filter((s) => world.siteOf.has(s) && world.siteOf.get(s) !== scope.siteId && !allowed.has(s));
            expect(foreign, `${key} for ${scope.siteId} returned records of other sites`).toEqual([]);
            if ([...stringsIn(answer)].some((s) => allowed.has(s))) borrowedRecordsSeen += 1;
            if ([...stringsIn(answer)].some((s) => world.siteOf.get(s) === scope.siteId)) ownRecordsSeen += 1;
          }
        }
      }),
      {
        numRuns: Number(process.env.SITE_ISOLATION_RUNS ?? 12),
        // Always one world with everything in it, whatever the seed: a coil out on loan (KM-03) lent to the other site's
        // event, a site with its own policy, a person in both sites working at the lending one, an organisation admin.
        examples: [
          [
            {
              sites: [
                { tags: ["KM-02", "KM-03"], ownPolicy: false },
                { tags: ["KM-03", "KM-05"], ownPolicy: true },
              ],
              people: [
                { memberships: ["steward", "member"], organisationAdmin: false, cookieSite: 0 },
                { memberships: [null, "admin"], organisationAdmin: false, cookieSite: 0 },
                { memberships: [null, null], organisationAdmin: true, cookieSite: 1 },
              ],
              lendTo: [1, null],
            },
            7,
          ],
        ],
      },
    );
    // The reads really ran, and answered with records (of the caller's site): an answer that is always empty proves nothing.
    expect(readsChecked).toBeGreaterThan(Object.keys(SCOPED_READS).length);
    expect(ownRecordsSeen).toBeGreaterThan(readsChecked / 3);
    // The borrowing site's exception was really taken: it saw a loan lent to it, and only through BORROWER_READS.
    expect(borrowedRecordsSeen).toBeGreaterThan(0);
  });
});
