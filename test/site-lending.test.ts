/**
 * Lending across sites and keeping sites apart: a coil lent to another site's event is seen there only through the
 * loan and its clearance sheet; clearances, loans, failures, the fleet and the audit log of one site are not found
 * from another, for reads and writes alike.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { createSite, makeUser, siteScope, testDb } from "./support/db";
import { makeTwoSites, resetToDefaultSite, type TwoSites } from "./support/lending-sites";
import { ALL_YES, makeCleanCoil } from "./fleet-fixtures";
import {
  ClearanceRefusedError,
  getClearance,
  getClearanceSheet,
  getClearanceStateById,
  getCoilClearanceState,
  getCoilHealthForClearance,
  listClearancesWithState,
  loadClearanceHistory,
  recordClearanceLapse,
  signClearance,
} from "@/lib/db/clearances";
import { createLoan, getLoan, getLoanHandover, listBorrowedLoans, listBorrowerSites, listLoans, listLoansNeedingRecall, listSessionsInLoanWindow, LoanRefusedError, returnLoan } from "@/lib/db/loans";
import { completePostMortem, createFailure, getFailureDetail, listFailures } from "@/lib/db/failures";
import { getFleetOverview, getPartReliability, readLatestClearances } from "@/lib/db/fleet";
import { getCoilFigures } from "@/lib/db/coil-summary";
import { getCurrentPolicy } from "@/lib/db/policy";
import { listAuditEntities, listAuditEvents } from "@/lib/db/audit";
import { readCoilPage } from "@/lib/db/coil-page";
import { getSessionDetail, listSessions } from "@/lib/db/sessions";
import { RecordRefusedError } from "@/lib/db/record-refused";
import { clearanceDecisionSchema } from "@/lib/validation/clearance";
import { failureSchema, postMortemSchema } from "@/lib/validation/failure";
import { toLocalDateTimeValue } from "@/lib/validation/session";

beforeEach(resetToDefaultSite);

const DAY = 86_400_000;
const clear = (coilId: string) => clearanceDecisionSchema.parse({ coilId, verdict: "cleared", checklist: ALL_YES, conditions: "Indoors only" });
const loanTo = (coilId: string, now: Date, borrowerSiteId: string | null = null) => ({
  coilId,
  borrower: "North school physics club",
  borrowerContact: "",
  event: "North open evening",
  expectedBackAt: new Date(now.getTime() + 5 * DAY),
  borrowerSiteId,
});

/** A cleared coil at the default site lent to North's event. */
async function lendAcross(sites: TwoSites) {
  const signedAt = new Date(Date.now() - 10 * 60_000);
  const coil = await makeCleanCoil("M-1", signedAt, sites.mainSteward.id);
  const clearance = await signClearance(sites.main, clear(coil.id), signedAt);
  const now = new Date();
  const loan = await createLoan(sites.main, loanTo(coil.id, now, sites.northId), now);
  return { coil, clearance, loan, now };
}

describe("a coil lent to another site's event", () => {
  it("is listed at the borrowing site with its loan sheet and its clearance sheet", async () => {
    const sites = await makeTwoSites();
    const { coil, clearance, loan, now } = await lendAcross(sites);
    expect(loan.borrowerSiteId).toBe(sites.northId);

    const borrowed = await listBorrowedLoans(sites.north, {}, now);
    expect(borrowed).toHaveLength(1);
    expect(borrowed[0]).toMatchObject({ id: loan.id, clearanceId: clearance.id, coil: { tag: "M-1" }, lendingSite: "Main site", borrower: "North school physics club" });
    expect(borrowed[0]!.clearanceState.kind).toBe("valid");
    // Only the sheet's columns travel: no coil id to look anything else up by.
    expect(Object.keys(borrowed[0]!).sort()).toEqual(["borrower", "clearanceId", "clearanceState", "coil", "event", "expectedBackAt", "id", "lendingSite", "outAt", "returnedAt"]);

    const handover = await getLoanHandover(sites.north, loan.id);
    expect(handover).toMatchObject({ viewer: "borrowing-site", borrower: "North school physics club", clearance: { id: clearance.id }, borrowerSite: { name: "North" } });
    const sheet = await getClearanceSheet(sites.north, clearance.id, now);
    expect(sheet).toMatchObject({ viewer: "borrowing-site", coilId: coil.id, conditions: "Indoors only" });
    expect(sheet!.state.kind).toBe("valid");
    expect(sheet!.health).not.toBeNull();
    // The lending site reads the same sheets as their owner.
    expect((await getLoanHandover(sites.main, loan.id))?.viewer).toBe("lending-site");
    expect((await getClearanceSheet(sites.main, clearance.id, now))?.viewer).toBe("lending-site");
  });

  it("shows nothing else of the lending site to the borrowing one: decision page, state, health, loan record, fleet, lists", async () => {
    const sites = await makeTwoSites();
    const { coil, clearance, loan, now } = await lendAcross(sites);
    const { north } = sites;
    expect(await getClearance(north, clearance.id)).toBeNull();
    expect(await getClearanceStateById(north, clearance.id, now)).toBeNull();
    expect(await getCoilHealthForClearance(north, coil.id, now)).toBeNull();
    expect(await loadClearanceHistory(north, coil.id)).toBeNull();
    expect((await getCoilClearanceState(north, coil.id, now)).kind).toBe("none");
    expect(await getLoan(north, loan.id)).toBeNull();
    expect(await listSessionsInLoanWindow(north, { coilId: coil.id, outAt: new Date(0) }, now)).toEqual([]);
    expect((await listLoans(north, {}, {}, now)).total).toBe(0);
    expect(await listLoansNeedingRecall(north, now)).toEqual([]);
    expect(await listClearancesWithState(north, now)).toEqual([]);
    expect(await getFleetOverview(north, now)).toEqual([]);
    // Only the lending site takes it back.
    const back = { loanId: loan.id, returnedAt: now, returnCondition: "Good", returnNotes: "", sessionIds: [] };
    await expect(returnLoan(north, back, now)).rejects.toMatchObject({ reason: "not-found" });
    expect((await testDb.loan.findUniqueOrThrow({ where: { id: loan.id } })).returnedAt).toBeNull();
  });

  it("keeps the coil page and the coil's sessions not found at the borrowing site", async () => {
    const sites = await makeTwoSites();
    const { coil } = await lendAcross(sites);
    const session = await testDb.runSession.findFirstOrThrow({ where: { coilId: coil.id } });
    expect(await readCoilPage(sites.north, coil.tag)).toBeNull();
    expect(await getSessionDetail(sites.north, session.id)).toBeNull();
    expect((await listSessions(sites.north, {})).total).toBe(0);
  });

  it("leaves the lender's dashboard and loans as for any loan, audited at the lending site; a third site sees nothing", async () => {
    const sites = await makeTwoSites();
    const { coil, clearance, loan, now } = await lendAcross(sites);
    const [row] = await getFleetOverview(sites.main, now);
    expect(row).toMatchObject({ id: coil.id, activeLoan: { id: loan.id, borrower: "North school physics club", overdue: false } });
    const listed = await listLoans(sites.main, { state: "out" }, {}, now);
    expect(listed.rows.map((l) => [l.id, l.borrowerSite?.name])).toEqual([[loan.id, "North"]]);
    expect(await listBorrowedLoans(sites.main, {}, now)).toEqual([]);
    expect(await testDb.auditEvent.findFirstOrThrow({ where: { entity: "Loan", entityId: loan.id } })).toMatchObject({ siteId: sites.main.siteId, actorId: sites.mainSteward.id });

    const south = await createSite("south");
    const southScope = siteScope(south.id, null);
    expect(await getLoanHandover(southScope, loan.id)).toBeNull();
    expect(await getClearanceSheet(southScope, clearance.id, now)).toBeNull();
    expect(await listBorrowedLoans(southScope, {}, now)).toEqual([]);
  });

  it("is refused for the lending site itself, an unknown site, or a coil of another site", async () => {
    const sites = await makeTwoSites();
    const now = new Date();
    const coil = await makeCleanCoil("M-2", new Date(now.getTime() - 60_000), sites.mainSteward.id);
    await signClearance(sites.main, clear(coil.id), new Date(now.getTime() - 60_000));
    await expect(createLoan(sites.main, loanTo(coil.id, now, sites.main.siteId), now)).rejects.toMatchObject({ reason: "bad-site", field: "borrowerSiteId" });
    await expect(createLoan(sites.main, loanTo(coil.id, now, "site-nowhere"), now)).rejects.toMatchObject({ reason: "bad-site", field: "borrowerSiteId" });
    const foreign = await createLoan(sites.north, loanTo(coil.id, now), now).catch((e: unknown) => e);
    expect(foreign).toBeInstanceOf(LoanRefusedError);
    expect((foreign as LoanRefusedError).reason).toBe("no-coil");
    expect(await testDb.loan.count()).toBe(0);
    expect((await listBorrowerSites(sites.main)).map((s) => s.name)).toEqual(["North"]);
  });
});

describe("site isolation of the lending records", () => {
  /** Each site with a cleared coil out on loan and an open failure. */
  async function twoFleets() {
    const sites = await makeTwoSites();
    const signedAt = new Date(Date.now() - 10 * 60_000);
    const made = [];
    for (const [scope, tag] of [
      [sites.main, "M-1"],
      [sites.north, "N-1"],
    ] as const) {
      const coil = await makeCleanCoil(tag, signedAt, scope.actorId!, scope.siteId);
      const clearance = await signClearance(scope, clear(coil.id), signedAt);
      const loan = await createLoan(scope, loanTo(coil.id, new Date()), new Date());
      const sw = await testDb.component.findFirstOrThrow({ where: { coilId: coil.id, kind: "switch" } });
      const failure = await createFailure(
        scope,
        failureSchema.parse({ coilId: coil.id, componentId: sw.id, mode: "over_voltage", occurredAt: toLocalDateTimeValue(new Date(Date.now() - 60_000)), symptoms: `${tag} went pop.` }),
      );
      made.push({ coil, clearance, loan, failure });
    }
    const [main, north] = made as [(typeof made)[0], (typeof made)[0]];
    return { sites, main, north };
  }

  it("lists and reads each site's own clearances, loans, failures and fleet only", async () => {
    const { sites, main, north } = await twoFleets();
    const now = new Date();
    for (const [scope, own, other] of [
      [sites.main, main, north],
      [sites.north, north, main],
    ] as const) {
      expect((await listClearancesWithState(scope, now)).map((c) => c.id)).toEqual([own.clearance.id]);
      expect((await readLatestClearances(scope)).map((c) => c.id)).toEqual([own.clearance.id]);
      expect((await listLoans(scope, {}, {}, now)).rows.map((l) => l.id)).toEqual([own.loan.id]);
      expect((await listLoansNeedingRecall(scope, now)).map((r) => r.loanId)).toEqual([own.loan.id]);
      expect((await listFailures(scope)).rows.map((f) => f.id)).toEqual([own.failure.id]);
      expect((await getFleetOverview(scope, now)).map((r) => r.id)).toEqual([own.coil.id]);
      expect((await getPartReliability(scope)).parts.reduce((n, p) => n + p.failures, 0)).toBe(1);
      expect([...(await getCoilFigures(scope, [own.coil.id, other.coil.id], await getCurrentPolicy(scope), now)).keys()]).toEqual([own.coil.id]);

      expect(await getClearance(scope, other.clearance.id)).toBeNull();
      expect(await getClearanceSheet(scope, other.clearance.id, now)).toBeNull();
      expect(await getClearanceStateById(scope, other.clearance.id, now)).toBeNull();
      expect(await getLoan(scope, other.loan.id)).toBeNull();
      expect(await getLoanHandover(scope, other.loan.id)).toBeNull();
      expect(await getFailureDetail(scope, other.failure.id)).toBeNull();
    }
  });

  it("answers writes on another site's records as not found and changes nothing", async () => {
    const { sites, main } = await twoFleets();
    const { north } = sites;
    const now = new Date();
    const before = await testDb.auditEvent.count();
    const signing = await signClearance(north, clearanceDecisionSchema.parse({ coilId: main.coil.id, verdict: "refused", checklist: {} }), now).catch((e: unknown) => e);
    expect(signing).toBeInstanceOf(ClearanceRefusedError);
    expect((signing as Error).message).toBe("That coil does not exist.");
    await expect(
      createFailure(north, failureSchema.parse({ coilId: main.coil.id, mode: "unknown", occurredAt: toLocalDateTimeValue(new Date(now.getTime() - 60_000)), symptoms: "Not ours." })),
    ).rejects.toMatchObject({ field: "coilId" });
    const postMortem = await completePostMortem(north, postMortemSchema.parse({ failureId: main.failure.id, rootCause: "Someone else's coil.", correctiveAction: "Nothing to do here." })).catch((e: unknown) => e);
    expect(postMortem).toBeInstanceOf(RecordRefusedError);
    expect((postMortem as RecordRefusedError).message).toBe("That failure does not exist.");
    await expect(returnLoan(north, { loanId: main.loan.id, returnedAt: now, returnCondition: "Good", returnNotes: "", sessionIds: [] }, now)).rejects.toMatchObject({ reason: "not-found" });
    const lapse = (await getClearanceStateById(sites.main, main.clearance.id, now))!;
    expect(await recordClearanceLapse(north, main.clearance.id, { ...lapse, kind: "expired", endedAt: now })).toBe(false);
    expect(await testDb.auditEvent.count()).toBe(before);
    expect((await testDb.failure.findUniqueOrThrow({ where: { id: main.failure.id } })).status).toBe("open");
    expect((await testDb.loan.findUniqueOrThrow({ where: { id: main.loan.id } })).returnedAt).toBeNull();
  });

  it("keeps each site's audit log to its own events, each event carrying its record's site", async () => {
    const { sites, main, north } = await twoFleets();
    const mainEvents = await listAuditEvents(sites.main, { take: 100 });
    const northEvents = await listAuditEvents(sites.north, { take: 100 });
    expect(mainEvents.length).toBeGreaterThan(0);
    expect(mainEvents.every((e) => e.siteId === sites.main.siteId)).toBe(true);
    expect(northEvents.every((e) => e.siteId === sites.north.siteId)).toBe(true);
    const ids = (events: { entityId: string }[]) => new Set(events.map((e) => e.entityId));
    for (const record of [main.clearance, main.loan, main.failure]) {
      expect(ids(mainEvents).has(record.id)).toBe(true);
      expect(ids(northEvents).has(record.id)).toBe(false);
    }
    for (const record of [north.clearance, north.loan, north.failure]) expect(ids(northEvents).has(record.id)).toBe(true);
    // The failure's lapse of the clearance is the coil's site's too, by whoever recorded the failure.
    expect(await testDb.auditEvent.findFirstOrThrow({ where: { entity: "Clearance", entityId: north.clearance.id, action: "lapse" } })).toMatchObject({
      siteId: sites.north.siteId,
      actorId: sites.northSteward.id,
    });
    expect(await listAuditEntities(sites.north)).toEqual(["Clearance", "Failure", "Loan"]);
    // An event of no site (organisation-wide) is in neither site's log.
    const orgAdmin = await makeUser("someone@main.test", "member");
    await testDb.auditEvent.create({ data: { siteId: null, actorId: orgAdmin.id, action: "sign-in", entity: "User", entityId: orgAdmin.id, summary: "Signed in" } });
    expect((await listAuditEvents(sites.main, { take: 100 })).some((e) => e.entity === "User")).toBe(false);
  });
});
