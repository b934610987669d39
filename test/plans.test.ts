import { beforeEach, describe, expect, it } from "vitest";
import { countAllRows, mainScope, makeUser, resetDatabase, testDb } from "./support/db";
import { ALL_YES, makeCleanCoil } from "./fleet-fixtures";
import { ClearanceRefusedError, signClearance } from "@/lib/db/clearances";
import { clearanceDecisionSchema } from "@/lib/validation/clearance";
import { buildStoredPlan, workOutVariants } from "@/app/(app)/coils/plan/compare-variants";
import { planBuild, type PlanPolicy } from "@/lib/analysis/build-plan";
import { setCoilStatus, DuplicateTagError } from "@/lib/db/coils";
import { exportCoil } from "@/lib/db/export";
import { createLoan, LoanRefusedError } from "@/lib/db/loans";
import { PLANNED_PART_DESCRIPTION, savePlannedCoil } from "@/lib/db/plans";
import { planSaveSchema, readStoredPlan, type PlanVariant } from "@/lib/validation/plan";
import { PLAN_VARIANT } from "./support/plan-fixtures";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";

beforeEach(resetDatabase);

const policy: PlanPolicy & { version: number } = { version: 1, ituRegion: 2, minVoltageHeadroom: 0.2, minThermalHeadroom: 0.2, minJunctionMarginK: 25 };


function workedPlan(variants: Record<string, string>[]) {
  const worked = workOutVariants(variants, policy);
  if (!worked.ok) throw new Error(`plan refused: ${JSON.stringify(worked.fieldErrors)}`);
  return worked;
}

describe("saving a plan", () => {
  it("creates a planned coil with its planned top load, parts and stored plan, audited once", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const worked = workedPlan([PLAN_VARIANT, { ...PLAN_VARIANT, label: "Tall", windingLengthM: "350 mm" }]);
    const plan = buildStoredPlan(worked.variants, worked.results, 1, policy, new Date());
    const save = planSaveSchema.parse({ tag: "pl-01", name: "Planned tall", builderName: "Ada", chosenVariant: "1" });
    const coil = await savePlannedCoil(mainScope(steward.id), save, worked.variants[1]!, plan);

    const stored = await testDb.coil.findUniqueOrThrow({ where: { id: coil.id }, include: { components: true, topLoads: true } });
    expect(stored.status).toBe("planned");
    expect(stored.tag).toBe("PL-01");
    expect(stored.siteId).toBe(DEFAULT_SITE_ID);
    // 350 mm / (AWG 30 = 0.2546 mm × 1.08) = 1272.9 → 1272 turns (ASTM B258 diameter; close winding).
    expect(stored.turns).toBe(1272);
    expect(stored.wireGaugeAwg).toBe(30);
    expect(stored.components.map((c) => c.kind).sort()).toEqual(["clamp", "heat_sink", "switch"]);
    expect(stored.components.every((c) => c.description === PLANNED_PART_DESCRIPTION)).toBe(true);
    expect(stored.components.find((c) => c.kind === "switch")?.partNumber).toBe("PLAN-FET-1");
    expect(stored.components.find((c) => c.kind === "clamp")?.clampVoltageV).toBe(150);
    expect(stored.topLoads).toHaveLength(1);
    expect(stored.topLoads[0]!.shape).toBe("toroid");

    const readBack = readStoredPlan(stored.planJson);
    expect(readBack?.variants).toHaveLength(2);
    expect(readBack?.chosenVariant).toBe(1);
    // The stored prediction is the one the planner showed for that variant, not recomputed later.
    const again = planBuild(worked.variants[1]!.input, policy);
    expect(readBack?.variants[1]!.predicted.firstResonanceHz).toBeCloseTo(again.resonance.firstResonanceHz, 6);
    expect(readBack?.variants[1]!.predicted.peakClampedV).toBe(150);
    const audit = await testDb.auditEvent.findMany({ where: { entityId: coil.id, action: "create" } });
    expect(audit.map((e) => [e.siteId, e.actorId])).toEqual([[DEFAULT_SITE_ID, steward.id]]);
  });

  it("stores nothing when a write inside the transaction fails part-way", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const worked = workedPlan([PLAN_VARIANT]);
    const plan = buildStoredPlan(worked.variants, worked.results, 0, policy, new Date());
    const save = planSaveSchema.parse({ tag: "PL-02", name: "Broken", builderName: "Ada", chosenVariant: "0" });
    // A switch type the database refuses: the coil row is written first, so only a rollback leaves nothing behind.
    const broken = { ...worked.variants[0]!, parts: { ...worked.variants[0]!.parts, switchType: "valve" } } as unknown as PlanVariant;
    const before = await countAllRows();
    await expect(savePlannedCoil(mainScope(steward.id), save, broken, plan)).rejects.toThrow();
    expect(await countAllRows()).toEqual(before);
  });

  it("refuses a stored plan that does not match its schema, storing nothing", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const worked = workedPlan([PLAN_VARIANT]);
    const plan = buildStoredPlan(worked.variants, worked.results, 0, policy, new Date());
    plan.variants[0]!.predicted.firstResonanceHz = Number.NaN;
    const before = await countAllRows();
    await expect(savePlannedCoil(mainScope(steward.id), planSaveSchema.parse({ tag: "PL-03", name: "NaN", builderName: "Ada", chosenVariant: "0" }), worked.variants[0]!, plan)).rejects.toThrow();
    expect(await countAllRows()).toEqual(before);
  });

  it("refuses a tag already in use", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const worked = workedPlan([PLAN_VARIANT]);
    const plan = buildStoredPlan(worked.variants, worked.results, 0, policy, new Date());
    const save = planSaveSchema.parse({ tag: "PL-04", name: "First", builderName: "Ada", chosenVariant: "0" });
    await savePlannedCoil(mainScope(steward.id), save, worked.variants[0]!, plan);
    const before = await countAllRows();
    await expect(savePlannedCoil(mainScope(steward.id), save, worked.variants[0]!, plan)).rejects.toBeInstanceOf(DuplicateTagError);
    expect(await countAllRows()).toEqual(before);
  });
});

describe("a bad plan is refused with specific field errors", () => {
  it("names the variant and the field for absurd turns and a missing top-load size", () => {
    const worked = workOutVariants([PLAN_VARIANT, { ...PLAN_VARIANT, turns: "90000", windingLengthM: "" }, { ...PLAN_VARIANT, topLoadTubeDiameterM: "" }], policy);
    expect(worked.ok).toBe(false);
    if (worked.ok) return;
    expect(worked.fieldErrors["v1.turns"]?.join(" ")).toMatch(/Turns must be between 10 and 20 ?000/);
    expect(worked.fieldErrors["v2.topLoadTubeDiameterM"]?.join(" ")).toMatch(/Tube diameter/);
    expect(Object.keys(worked.fieldErrors).some((key) => key.startsWith("v0."))).toBe(false);
  });

  it("refuses more turns than fit on the winding", () => {
    const worked = workOutVariants([{ ...PLAN_VARIANT, turns: "2000", windingLengthM: "100 mm" }], policy);
    expect(worked.ok).toBe(false);
    if (!worked.ok) expect(worked.fieldErrors["v0.turns"]?.join(" ")).toMatch(/need at least/);
  });
});

describe("a planned coil is not in service", () => {
  it("is not lent, and goes active through the status change", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const worked = workedPlan([PLAN_VARIANT]);
    const plan = buildStoredPlan(worked.variants, worked.results, 0, policy, new Date());
    const coil = await savePlannedCoil(mainScope(steward.id), planSaveSchema.parse({ tag: "PL-05", name: "Lend me", builderName: "Ada", chosenVariant: "0" }), worked.variants[0]!, plan);
    const expectedBackAt = new Date(Date.now() + 7 * 86_400_000);
    const refusal = await createLoan(mainScope(steward.id), { coilId: coil.id, borrower: "Fair", borrowerContact: "", event: "Open day", expectedBackAt }).catch((error: unknown) => error);
    expect(refusal).toBeInstanceOf(LoanRefusedError);
    expect((refusal as LoanRefusedError).reason).toBe("planned");
    expect(await testDb.loan.count()).toBe(0);

    const active = await setCoilStatus(mainScope(steward.id), coil.id, "active");
    expect(active.status).toBe("active");
    // The plan stays with the coil once it is in service, so measurements keep being compared with it.
    expect(readStoredPlan(active.planJson)).not.toBeNull();
  });

  it("is not cleared for lending, though its records pass every rule, until it is set to active", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("PL-07", now);
    await setCoilStatus(mainScope(steward.id), coil.id, "planned");
    const decision = clearanceDecisionSchema.parse({ coilId: coil.id, verdict: "cleared", checklist: ALL_YES, maxSupplyVoltageV: "24 V", maxRunS: "12", conditions: "" });
    await expect(signClearance(mainScope(steward.id), decision, now)).rejects.toBeInstanceOf(ClearanceRefusedError);
    expect(await testDb.clearance.count()).toBe(0);
    await setCoilStatus(mainScope(steward.id), coil.id, "active");
    expect((await signClearance(mainScope(steward.id), decision, now)).verdict).toBe("cleared");
  });

  it("keeps its plan through a JSON logbook export", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const worked = workedPlan([PLAN_VARIANT]);
    const plan = buildStoredPlan(worked.variants, worked.results, 0, policy, new Date());
    const coil = await savePlannedCoil(mainScope(steward.id), planSaveSchema.parse({ tag: "PL-06", name: "Export", builderName: "Ada", chosenVariant: "0" }), worked.variants[0]!, plan);
    const document = await exportCoil(mainScope(steward.id), coil.tag);
    expect(document?.coils[0]?.status).toBe("planned");
    expect(readStoredPlan(document?.coils[0]?.planJson)).toEqual(readStoredPlan(coil.planJson));
  });
});
