import { afterAll, beforeEach, describe, expect, it } from "vitest";
import { countAllRows, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
import { CoilNotFoundError, createCoil, DuplicateTagError, getCoilByTag, listCoilChoices, listCoils, setCoilStatus, updateCoil } from "@/lib/db/coils";
import { addComponent, ComponentStateError, getComponent, replaceComponent } from "@/lib/db/components";
import { addTopLoad, retireTopLoad, TopLoadStateError } from "@/lib/db/top-loads";
import { readCoilPage } from "@/lib/db/coil-page";
import { getCoilHistory, getCoilPageHistory, getFleetHealthHistory, getFleetHistory } from "@/lib/db/coil-history";
import { getCoilTimeline } from "@/lib/db/coil-timeline";
import { readCoilStanding } from "@/lib/db/coil-standing";
import { readSweepThumbnail } from "@/lib/db/sweep-thumbnail";
import { listPlanStartingPoints } from "@/lib/db/plans";
import { readFleetPredictionInputs, readRunningFrequencies } from "@/lib/db/prediction-history";
import { DEFAULT_SITE_ID, type SiteScope } from "@/lib/db/site-scope";
import { coilSchema, coilUpdateSchema } from "@/lib/validation/coil";
import { componentSchema, replaceComponentSchema } from "@/lib/validation/component";
import { topLoadSchema } from "@/lib/validation/top-load";
import { makeCleanCoil } from "./fleet-fixtures";
import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";

beforeEach(resetDatabase);

async function typedCoil(scope: SiteScope) {
  const input = coilSchema.parse({ tag: "ty-01", name: "Typed", builderName: "Ada", formDiameterM: "75 mm", windingLengthM: "8 in", wireDiameterM: "AWG 28", turns: "count from winding length" });
  return createCoil(scope, input);
}

/** A steward of the default site and the scope they act in. */
async function mainSteward() {
  const steward = await makeUser("s@club.test", "steward");
  return { steward, scope: mainScope(steward.id) };
}

describe("coils from typed quantities", () => {
  it("stores SI values, the gauge as typed and the counted turns, with an audit entry", async () => {
    const { steward, scope } = await mainSteward();
    const coil = await typedCoil(scope);
    expect(coil.tag).toBe("TY-01");
    expect(coil.siteId).toBe(DEFAULT_SITE_ID);
    expect(coil.formDiameterM).toBeCloseTo(0.075, 9);
    expect(coil.windingLengthM).toBeCloseTo(0.2032, 9);
    expect(coil.wireGaugeAwg).toBe(28);
    expect(coil.wireDiameterM).toBeCloseTo(0.000321, 5);
    // 203.2 mm / (0.3211 mm × 1.08) = 585.9 → 585 whole turns.
    expect(coil.turns).toBe(585);
    const created = await testDb.auditEvent.findMany({ where: { entityId: coil.id, action: "create" } });
    expect(created.map((e) => [e.siteId, e.actorId])).toEqual([[DEFAULT_SITE_ID, steward.id]]);
  });

  it("refuses nonsense naming the field and what was understood, storing nothing", () => {
    const result = coilSchema.safeParse({ tag: "TY-02", name: "Bad", builderName: "Ada", formDiameterM: "75 m", windingLengthM: "banana", wireDiameterM: "AWG 99", turns: "lots" });
    expect(result.success).toBe(false);
    const messages = result.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(messages.some((m) => m.startsWith("formDiameterM: Form diameter must be between") && m.includes("“75 m” was read as 75 m"))).toBe(true);
    expect(messages.some((m) => m.startsWith("windingLengthM: Winding length: Could not read “banana”"))).toBe(true);
    expect(messages.some((m) => m.startsWith("wireDiameterM:") && m.includes("AWG 99"))).toBe(true);
    expect(messages.some((m) => m.startsWith("turns:"))).toBe(true);
  });

  it("refuses more turns than fit in the winding length", () => {
    const result = coilSchema.safeParse({ tag: "TY-03", name: "Tight", builderName: "Ada", formDiameterM: 0.05, windingLengthM: 0.1, wireDiameterM: 0.0005, turns: 900 });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.message).toMatch(/need at least 450 mm of winding/);
  });

  it("updates the build and records what changed; the tag stays", async () => {
    const { scope } = await mainSteward();
    const coil = await typedCoil(scope);
    const input = coilUpdateSchema.parse({ coilId: coil.id, version: coil.version, name: "Typed", builderName: "Ada", formDiameterM: "3 in", windingLengthM: "203.2 mm", wireDiameterM: "0.4 mm", turns: "450 turns", measuredInductanceH: "4.2 mH" });
    const updated = await updateCoil(scope, input);
    expect(updated.tag).toBe("TY-01");
    expect(updated.wireGaugeAwg).toBeNull();
    expect(updated.measuredInductanceH).toBeCloseTo(0.0042, 9);
    const event = await testDb.auditEvent.findFirstOrThrow({ where: { entityId: coil.id, action: "update" } });
    expect(event.siteId).toBe(DEFAULT_SITE_ID);
    expect(event.summary).toContain("formDiameterM");
    expect(event.summary).not.toContain("name");
  });
});

describe("parts", () => {
  it("fits a switch with typed ratings and drops ratings of other kinds", async () => {
    const { scope } = await mainSteward();
    const coil = await typedCoil(scope);
    const input = componentSchema.parse({ coilId: coil.id, kind: "switch", partNumber: "IRFP460", switchType: "mosfet", voltageRatingV: "500 V", continuousCurrentA: "20 A", peakCurrentA: "80A", maxJunctionTempC: "150 °C", thermalResistanceJcKPerW: "0.45 K/W", sinkMassKg: "150 g", installedAt: "2025-01-10" });
    const { component } = await addComponent(scope, input);
    expect(component.voltageRatingV).toBe(500);
    expect(component.sinkMassKg).toBeNull();
    expect(component.installedAt.toISOString()).toBe("2025-01-10T00:00:00.000Z");
  });

  it("refuses a switch without its type", () => {
    const result = componentSchema.safeParse({ coilId: "x", kind: "switch", partNumber: "MJE13009" });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]).toMatchObject({ path: ["switchType"] });
  });

  it("replaces a part in one transaction: the old one keeps its dates, reason and successor", async () => {
    const { scope } = await mainSteward();
    const coil = await typedCoil(scope);
    const { component: old } = await addComponent(scope, componentSchema.parse({ coilId: coil.id, kind: "switch", partNumber: "IRFP260N", switchType: "mosfet", installedAt: "2025-01-10" }));
    const { fitted } = await replaceComponent(scope, replaceComponentSchema.parse({ oldComponentId: old.id, removalReason: "failed short after a long run", coilId: coil.id, kind: "switch", partNumber: "IRFP460", switchType: "mosfet", voltageRatingV: "500 V", installedAt: "2025-03-01" }));
    const after = await testDb.component.findUniqueOrThrow({ where: { id: old.id } });
    expect(after.removedAt?.toISOString()).toBe("2025-03-01T00:00:00.000Z");
    expect(after.removalReason).toBe("failed short after a long run");
    expect(after.replacedById).toBe(fitted.id);
    expect(await testDb.auditEvent.count({ where: { entity: "Component", entityId: old.id, action: "update" } })).toBe(1);

    // A second replacement of the removed part is refused and stores nothing.
    const count = await testDb.component.count();
    await expect(
      replaceComponent(scope, replaceComponentSchema.parse({ oldComponentId: old.id, removalReason: "again", coilId: coil.id, kind: "switch", partNumber: "X", switchType: "bjt", installedAt: "2025-04-01" })),
    ).rejects.toBeInstanceOf(ComponentStateError);
    expect(await testDb.component.count()).toBe(count);
  });

  it("refuses a replacement dated before the old part went in, storing nothing", async () => {
    const { scope } = await mainSteward();
    const coil = await typedCoil(scope);
    const { component: old } = await addComponent(scope, componentSchema.parse({ coilId: coil.id, kind: "heat_sink", partNumber: "SK-1", installedAt: "2025-02-01" }));
    await expect(
      replaceComponent(scope, replaceComponentSchema.parse({ oldComponentId: old.id, removalReason: "upgrade", coilId: coil.id, kind: "heat_sink", partNumber: "SK-2", installedAt: "2025-01-01" })),
    ).rejects.toThrow(/before the old one was fitted/);
    expect(await testDb.component.count()).toBe(1);
    expect((await testDb.component.findUniqueOrThrow({ where: { id: old.id } })).removedAt).toBeNull();
  });
});

describe("top loads", () => {
  it("adds a toroid from typed sizes, retires it once, refuses a second retirement", async () => {
    const { scope } = await mainSteward();
    const coil = await typedCoil(scope);
    const { topLoad } = await addTopLoad(scope, topLoadSchema.parse({ coilId: coil.id, name: "Spun toroid", shape: "toroid", diameterM: "6 in", tubeDiameterM: "40 mm" }));
    expect(topLoad.diameterM).toBeCloseTo(0.1524, 9);
    await retireTopLoad(scope, topLoad.id);
    await expect(retireTopLoad(scope, topLoad.id)).rejects.toBeInstanceOf(TopLoadStateError);
    expect((await testDb.auditEvent.findMany({ where: { entity: "TopLoad" } })).map((e) => e.siteId)).toEqual([DEFAULT_SITE_ID, DEFAULT_SITE_ID]);
  });

  it("refuses a toroid without its tube or with a tube too fat for a hole", () => {
    const missing = topLoadSchema.safeParse({ coilId: "c", name: "T", shape: "toroid", diameterM: "150 mm" });
    expect(missing.error!.issues.map((i) => i.path.join("."))).toContain("tubeDiameterM");
    const fat = topLoadSchema.safeParse({ coilId: "c", name: "T", shape: "toroid", diameterM: "100 mm", tubeDiameterM: "60 mm" });
    expect(fat.error!.issues[0]!.message).toMatch(/less than half the outer diameter/);
  });
});

describe("sites: a coil belongs to its site", () => {
  // Removed again when the file is done, so the files after this one start from the default site alone.
  const OTHER_SITE = { id: "site-coils-test-other", slug: "coils-test-other", name: "Other test site" };
  const DAY = 86_400_000;

  afterAll(async () => {
    await resetDatabase();
    await testDb.site.deleteMany({ where: { id: OTHER_SITE.id } });
  });

  /** A coil of the default site with a logbook (sessions, a sweep, parts, a top load, a clearance and a loan out) and a steward of a second site. */
  async function coilAndAnotherSite() {
    await testDb.site.upsert({ where: { id: OTHER_SITE.id }, create: OTHER_SITE, update: {} });
    const { steward, scope } = await mainSteward();
    const outsider = await makeUser("o@other.test", "steward", "Olu", OTHER_SITE.id);
    const now = new Date();
    const coil = await makeCleanCoil("CY-01", now, steward.id);
    const policy = await testDb.clearancePolicy.create({ data: { version: 1, rulesJson: JSON.stringify(DEFAULT_CLEARANCE_POLICY) } });
    const clearance = await testDb.clearance.create({
      data: { coilId: coil.id, policyId: policy.id, decidedById: steward.id, decidedAt: new Date(now.getTime() - DAY), validUntil: new Date(now.getTime() + 30 * DAY), verdict: "cleared", ruleResultsJson: "[]", checklistJson: "{}" },
    });
    // Lent to the other site's event: the borrowing site still sees nothing of the coil through these reads.
    await testDb.loan.create({
      data: { coilId: coil.id, clearanceId: clearance.id, borrower: "Other test site", borrowerSiteId: OTHER_SITE.id, event: "Open day", outAt: now, expectedBackAt: new Date(now.getTime() + 2 * DAY), lentById: steward.id },
    });
    return { scope, otherScope: siteScope(OTHER_SITE.id, outsider.id), coil, now };
  }

  it("another site's scope reads none of the coil's records, exactly as for a coil that does not exist", async () => {
    const { scope, otherScope, coil, now } = await coilAndAnotherSite();
    const own = (await getCoilByTag(scope, "CY-01"))!;
    expect(own.id).toBe(coil.id);
    expect(await getCoilByTag(otherScope, "CY-01")).toBeNull();

    expect(await readCoilPage(scope, "CY-01")).not.toBeNull();
    expect(await readCoilPage(otherScope, "CY-01")).toBeNull();
    expect(await getCoilHistory(scope, coil.id)).not.toBeNull();
    expect(await getCoilHistory(otherScope, coil.id)).toBeNull();
    expect(await getCoilPageHistory(scope, coil.id)).not.toBeNull();
    expect(await getCoilPageHistory(otherScope, coil.id)).toBeNull();
    // Handed the coil read by its own site, the other site's read still finds nothing.
    expect(await getCoilPageHistory(otherScope, coil.id, own)).toBeNull();

    const ownTimeline = await getCoilTimeline(scope, coil.id);
    expect(ownTimeline.events.map((e) => e.kind)).toEqual(expect.arrayContaining(["session", "sweep", "part-fitted", "clearance", "loan-out"]));
    const foreignTimeline = await getCoilTimeline(otherScope, coil.id);
    expect(foreignTimeline).toEqual({ events: [], counts: null, truncated: false });
    expect(foreignTimeline).toEqual(await getCoilTimeline(otherScope, "no-such-coil"));

    const ownStanding = await readCoilStanding(scope, coil.id, own.components, now);
    expect(ownStanding.clearance.kind).toBe("valid");
    expect(ownStanding.activeLoan?.event).toBe("Open day");
    const foreignStanding = await readCoilStanding(otherScope, coil.id, [], now);
    expect(foreignStanding).toEqual(await readCoilStanding(otherScope, "no-such-coil", [], now));
    expect(foreignStanding.activeLoan).toBeNull();

    const sweep = await testDb.sweep.findFirstOrThrow({ where: { coilId: coil.id } });
    expect(await readSweepThumbnail(scope, sweep.id)).not.toBeNull();
    expect(await readSweepThumbnail(otherScope, sweep.id)).toBeNull();
    const part = own.components[0]!;
    expect((await getComponent(scope, part.id))?.coil.tag).toBe("CY-01");
    expect(await getComponent(otherScope, part.id)).toBeNull();
    expect(await readRunningFrequencies(scope, coil.id)).toHaveLength(5);
    expect(await readRunningFrequencies(otherScope, coil.id)).toEqual([]);
  });

  it("fleet prediction reads take the site's latest sweeps and sessions, oldest first, however long the logbook", async () => {
    const { scope } = await coilAndAnotherSite();
    const whole = await readFleetPredictionInputs(scope);
    expect(whole.sessions.length).toBeGreaterThan(3);
    const windowed = await readFleetPredictionInputs(scope, 3);
    expect(windowed.sessions).toEqual(whole.sessions.slice(-3));
    expect(windowed.sweeps).toEqual(whole.sweeps.slice(-3));
  });

  it("leaves the coil out of another site's lists, search, pickers and fleet reads", async () => {
    const { scope, otherScope, coil } = await coilAndAnotherSite();
    expect((await listCoils(scope, { q: "cy-0" })).rows.map((c) => c.id)).toEqual([coil.id]);
    expect(await listCoils(otherScope, { q: "cy-0" })).toMatchObject({ rows: [], total: 0 });
    expect((await listCoils(otherScope)).total).toBe(0);
    expect((await listCoilChoices(scope)).map((c) => c.id)).toEqual([coil.id]);
    expect(await listCoilChoices(otherScope)).toEqual([]);

    expect((await getFleetHistory(scope)).map((h) => h.coil.id)).toEqual([coil.id]);
    expect(await getFleetHistory(otherScope)).toEqual([]);
    expect((await getFleetHealthHistory(scope, [coil.id])).map((h) => h.coil.id)).toEqual([coil.id]);
    expect(await getFleetHealthHistory(otherScope)).toEqual([]);
    expect(await getFleetHealthHistory(otherScope, [coil.id])).toEqual([]);

    const ownStarts = await listPlanStartingPoints(scope);
    expect(ownStarts.coils.map((c) => c.tag)).toEqual(["CY-01"]);
    expect(ownStarts.switches.length + ownStarts.heatSinks.length).toBeGreaterThan(0);
    expect(await listPlanStartingPoints(otherScope)).toEqual({ coils: [], switches: [], heatSinks: [] });

    const ownInputs = await readFleetPredictionInputs(scope);
    expect(ownInputs.coils.map((c) => c.id)).toEqual([coil.id]);
    expect(ownInputs.sessions.length).toBeGreaterThan(0);
    expect(await readFleetPredictionInputs(otherScope)).toEqual({ coils: [], topLoads: [], sweeps: [], sessions: [] });
  });

  it("refuses another site's edits, parts and top loads as for a coil that does not exist, storing nothing", async () => {
    const { scope, otherScope, coil } = await coilAndAnotherSite();
    const own = (await getCoilByTag(scope, "CY-01"))!;
    const part = own.components.find((c) => c.kind === "heat_sink")!;
    const topLoad = own.topLoads[0]!;
    const before = await countAllRows();
    const coilBefore = await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } });

    const edit = (coilId: string) =>
      coilUpdateSchema.parse({ coilId, version: coilBefore.version, name: "Taken over", builderName: "Olu", formDiameterM: "5 cm", windingLengthM: "20 cm", wireDiameterM: "0.2 mm", turns: "900 turns" });
    const fit = (coilId: string) => componentSchema.parse({ coilId, kind: "fan", partNumber: "FAN-80", installedAt: "2025-05-01" });
    const replace = (coilId: string) =>
      replaceComponentSchema.parse({ oldComponentId: part.id, removalReason: "swap", coilId, kind: "heat_sink", partNumber: "HS-9", installedAt: new Date().toISOString().slice(0, 10) });
    const load = (coilId: string) => topLoadSchema.parse({ coilId, name: "Borrowed toroid", shape: "toroid", diameterM: "15 cm", tubeDiameterM: "4 cm" });
    /** The error a write throws, to compare the refusal of another site's coil with that of a coil that does not exist. */
    const refusal = (write: Promise<unknown>) => write.then(() => null, (error: unknown) => error as Error);

    const refusedEdit = await refusal(updateCoil(otherScope, edit(coil.id)));
    expect(refusedEdit).toBeInstanceOf(CoilNotFoundError);
    await expect(setCoilStatus(otherScope, coil.id, "retired")).rejects.toBeInstanceOf(CoilNotFoundError);

    const refusedFit = await refusal(addComponent(otherScope, fit(coil.id)));
    expect(refusedFit).toBeInstanceOf(ComponentStateError);
    expect(refusedFit!.message).toBe((await refusal(addComponent(otherScope, fit("no-such-coil"))))!.message);
    const refusedReplace = await refusal(replaceComponent(otherScope, replace(coil.id)));
    expect(refusedReplace).toBeInstanceOf(ComponentStateError);
    expect(refusedReplace!.message).toBe("That part is not on this coil.");

    const refusedLoad = await refusal(addTopLoad(otherScope, load(coil.id)));
    expect(refusedLoad).toBeInstanceOf(TopLoadStateError);
    expect(refusedLoad!.message).toBe((await refusal(addTopLoad(otherScope, load("no-such-coil"))))!.message);
    const refusedRetire = await refusal(retireTopLoad(otherScope, topLoad.id));
    expect(refusedRetire).toBeInstanceOf(TopLoadStateError);
    expect(refusedRetire!.message).toBe((await refusal(retireTopLoad(otherScope, "no-such-top-load")))!.message);

    expect(await countAllRows()).toEqual(before);
    expect(await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).toEqual(coilBefore);
    expect((await testDb.topLoad.findUniqueOrThrow({ where: { id: topLoad.id } })).retiredAt).toBeNull();

    // The coil's own site may still make each of these changes.
    await updateCoil(scope, edit(coil.id));
    await addComponent(scope, fit(coil.id));
    await addTopLoad(scope, load(coil.id));
    await retireTopLoad(scope, topLoad.id);
    const events = await testDb.auditEvent.findMany({ select: { siteId: true } });
    expect(events).toHaveLength(4);
    expect(events.every((e) => e.siteId === DEFAULT_SITE_ID)).toBe(true);
  });

  it("lets two sites use the same tag, and refuses a duplicate tag only within a site", async () => {
    const { scope, otherScope } = await coilAndAnotherSite();
    const mine = await typedCoil(scope);
    const theirs = await typedCoil(otherScope);
    expect(theirs.tag).toBe(mine.tag);
    expect(theirs.id).not.toBe(mine.id);
    expect([mine.siteId, theirs.siteId]).toEqual([DEFAULT_SITE_ID, OTHER_SITE.id]);
    expect((await getCoilByTag(scope, "TY-01"))!.id).toBe(mine.id);
    expect((await getCoilByTag(otherScope, "TY-01"))!.id).toBe(theirs.id);
    const audit = await testDb.auditEvent.findFirstOrThrow({ where: { entityId: theirs.id, action: "create" } });
    expect([audit.siteId, audit.actorId]).toEqual([OTHER_SITE.id, otherScope.actorId]);

    await expect(typedCoil(otherScope)).rejects.toBeInstanceOf(DuplicateTagError);
    expect(await testDb.coil.count({ where: { tag: "TY-01" } })).toBe(2);
    // Editing one site's coil leaves the other site's coil of the same tag untouched.
    await setCoilStatus(otherScope, theirs.id, "repair");
    expect((await testDb.coil.findUniqueOrThrow({ where: { id: mine.id } })).status).toBe(mine.status);
  });
});
