/**
 * A site's own lending policy: it may only tighten the organisation's default (refused field by field otherwise),
 * the site lends by the stricter of each threshold, one version number identifies what it lends by, and a site's
 * tightening re-judges its own coils only.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { makeOrganisationAdmin, makeUser, siteScope, testDb } from "./support/db";
import { makeTwoSites, resetToDefaultSite } from "./support/lending-sites";
import { ALL_YES, makeCleanCoil } from "./fleet-fixtures";
import { getCurrentPolicy, getDefaultPolicy, listPolicyVersions, PolicyRefusedError, saveDefaultPolicyVersion, saveSitePolicyVersion } from "@/lib/db/policy";
import { ClearanceRefusedError, signClearance } from "@/lib/db/clearances";
import { getFleetOverview } from "@/lib/db/fleet";
import { DEFAULT_CLEARANCE_POLICY, type ClearancePolicyRules } from "@/lib/calc/clearance-policy";
import { clearanceDecisionSchema } from "@/lib/validation/clearance";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";

beforeEach(resetToDefaultSite);

const DAY = 86_400_000;
const base: ClearancePolicyRules = { ...DEFAULT_CLEARANCE_POLICY };
const siteItem = { id: "north-key-box", text: "The driver's key is back in North's key box after every run.", source: "common practice" };

async function refusalOf(promise: Promise<unknown>): Promise<PolicyRefusedError> {
  const error = await promise.catch((e: unknown) => e);
  expect(error).toBeInstanceOf(PolicyRefusedError);
  return error as PolicyRefusedError;
}

describe("a site's own policy only tightens the organisation's default", () => {
  it("refuses a looser save naming every looser field, and stores nothing", async () => {
    const { north } = await makeTwoSites();
    await getDefaultPolicy();
    const before = await testDb.clearancePolicy.count();
    const error = await refusalOf(
      saveSitePolicyVersion(
        north,
        { ...base, minVoltageHeadroom: base.minVoltageHeadroom - 0.1, maxSweepAgeDays: base.maxSweepAgeDays + 10, ituRegion: base.ituRegion === 1 ? 2 : 1, requiredChecklist: base.requiredChecklist.slice(1) },
        "looser",
      ),
    );
    expect(error.findings.map((f) => f.field)).toEqual(["minVoltageHeadroom", "maxSweepAgeDays", "ituRegion", "requiredChecklist"]);
    expect(error.findings[3]!.itemId).toBe(base.requiredChecklist[0]!.id);
    expect(error.message).toBe("Not saved: a site may only tighten the organisation's policy, and 4 fields are looser.");
    expect(await testDb.clearancePolicy.count()).toBe(before);
    expect(await testDb.auditEvent.count({ where: { siteId: north.siteId } })).toBe(0);
  });

  it("lends by the stricter of each threshold; the version is the newer row's; the default's region and checklist stay", async () => {
    const { north } = await makeTwoSites();
    const defaultV = await getDefaultPolicy();
    const saved = await saveSitePolicyVersion(north, { ...base, minVoltageHeadroom: 0.6, validityDays: 30, requiredChecklist: [...base.requiredChecklist, siteItem] }, "North asks more");
    expect(saved.version).toBe(defaultV.version + 1);
    const effective = await getCurrentPolicy(north);
    expect(effective.version).toBe(saved.version);
    expect(effective.id).toBe(saved.id);
    // Read raw (one statement for both rows): the same types as the query API's.
    expect(effective.createdAt).toEqual(saved.createdAt);
    expect(effective.organisationDefault).toEqual(defaultV);
    expect(effective.rules).toMatchObject({ minVoltageHeadroom: 0.6, validityDays: 30, ituRegion: base.ituRegion, minCurrentHeadroom: base.minCurrentHeadroom });
    expect(effective.rules.requiredChecklist.map((i) => i.id)).toEqual([...base.requiredChecklist.map((i) => i.id), siteItem.id]);
    // The default site is untouched by North's tightening.
    const main = await getCurrentPolicy(siteScope(DEFAULT_SITE_ID, null));
    expect(main.version).toBe(defaultV.version);
    expect(main.rules).toEqual(defaultV.rules);
    expect(main.siteOwn).toBeNull();
    // Audited at North, by who saved it.
    const audit = await testDb.auditEvent.findFirstOrThrow({ where: { entity: "ClearancePolicy", entityId: saved.id } });
    expect(audit).toMatchObject({ siteId: north.siteId, actorId: north.actorId });
  });

  it("keeps a site at least as strict as a default raised after it saved, under the default's newer version", async () => {
    const { north } = await makeTwoSites();
    const organiser = await makeOrganisationAdmin("org@district.test");
    await saveSitePolicyVersion(north, { ...base, minVoltageHeadroom: 0.5 }, "tighter");
    const raised = await saveDefaultPolicyVersion(siteScope(DEFAULT_SITE_ID, organiser.id), { ...base, minVoltageHeadroom: 0.4, minCurrentHeadroom: 0.35, acceptEstimatedMargins: false }, "raised");
    const effective = await getCurrentPolicy(north);
    expect(effective.version).toBe(raised.version);
    expect(effective.id).toBe(raised.id);
    expect(effective.rules).toMatchObject({ minVoltageHeadroom: 0.5, minCurrentHeadroom: 0.35, acceptEstimatedMargins: false });
    expect(effective.siteOwn?.rules.minCurrentHeadroom).toBe(base.minCurrentHeadroom); // as saved; the effective rules never go below the default
    // Organisation-wide: audited without a site.
    expect(await testDb.auditEvent.findFirstOrThrow({ where: { entityId: raised.id } })).toMatchObject({ siteId: null, actorId: organiser.id });
  });

  it("refuses the default's save from anyone but an organisation admin", async () => {
    const siteAdmin = await makeUser("admin@main.test", "admin");
    await expect(saveDefaultPolicyVersion(siteScope(DEFAULT_SITE_ID, siteAdmin.id), { ...base, validityDays: 10 }, "mine now")).rejects.toThrow(/organisation admin/);
    expect(await testDb.clearancePolicy.count({ where: { siteId: null, note: "mine now" } })).toBe(0);
  });

  it("lists the default's versions and the site's own, never another site's, with the site's own clearance counts", async () => {
    const { main, north, mainSteward } = await makeTwoSites();
    const now = new Date();
    const coil = await makeCleanCoil("M-1", now, mainSteward.id);
    await signClearance(main, clearanceDecisionSchema.parse({ coilId: coil.id, verdict: "refused", checklist: ALL_YES }), now);
    const northOwn = await saveSitePolicyVersion(north, { ...base, validityDays: 20 }, "north");
    const mainVersions = await listPolicyVersions(main);
    expect(mainVersions.map((v) => v.siteId)).toEqual([null]);
    expect(mainVersions[0]!._count.clearances).toBe(1);
    const northVersions = await listPolicyVersions(north);
    expect(northVersions.map((v) => v.id)).toEqual([northOwn.id, mainVersions[0]!.id]);
    // North does not learn that the default site signed a decision under the default.
    expect(northVersions[1]!._count.clearances).toBe(0);
  });
});

describe("clearances and the dashboard under a site's policy", () => {
  it("signs against the effective policy: its checklist (the site's item too), its validity and its version", async () => {
    const { north, northSteward } = await makeTwoSites();
    const now = new Date();
    const coil = await makeCleanCoil("N-1", now, northSteward.id, north.siteId);
    const own = await saveSitePolicyVersion(north, { ...base, validityDays: 21, requiredChecklist: [...base.requiredChecklist, siteItem] }, "north");
    const unticked = await signClearance(north, clearanceDecisionSchema.parse({ coilId: coil.id, verdict: "cleared", checklist: ALL_YES }), now).catch((e: unknown) => e);
    expect(unticked).toBeInstanceOf(ClearanceRefusedError);
    expect((unticked as ClearanceRefusedError).uncheckedItemIds).toEqual([siteItem.id]);
    const signed = await signClearance(north, clearanceDecisionSchema.parse({ coilId: coil.id, verdict: "cleared", checklist: { ...ALL_YES, [siteItem.id]: true } }), now);
    const row = await testDb.clearance.findUniqueOrThrow({ where: { id: signed.id }, include: { policy: true } });
    expect(row.policyId).toBe(own.id);
    expect(row.policy.version).toBe(own.version);
    expect(row.validUntil.getTime() - row.decidedAt.getTime()).toBe(21 * DAY);
  });

  it("re-judges the tightening site's coils only: their summaries carry the new effective version, the other site's stay", async () => {
    const { main, north, mainSteward, northSteward } = await makeTwoSites();
    const now = new Date();
    const mainCoil = await makeCleanCoil("M-1", now, mainSteward.id);
    const northCoil = await makeCleanCoil("N-1", now, northSteward.id, north.siteId);
    const [mainBefore] = await getFleetOverview(main, now);
    const [northBefore] = await getFleetOverview(north, now);
    expect(northBefore!.health).not.toBe("hold");
    const mainSummary = await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: mainCoil.id } });
    // More voltage headroom than the clean coil has (1 − 100 V / 400 V = 75 %, test/fleet-fixtures.ts).
    const own = await saveSitePolicyVersion(north, { ...base, minVoltageHeadroom: 0.8 }, "stricter");
    const [northAfter] = await getFleetOverview(north, now);
    expect(northAfter!.health).toBe("hold");
    expect((await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: northCoil.id } })).policyVersion).toBe(own.version);
    expect(await getFleetOverview(main, now)).toEqual([mainBefore]);
    expect(await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: mainCoil.id } })).toEqual(mainSummary);
  });
});
