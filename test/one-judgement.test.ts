/**
 * One session, one set of margins: the dashboard's stored summary, the coil page, the session page and the clearance
 * check read the same session through the same lib/db and lib/analysis functions each page uses, under a non-default
 * lending policy set through the policy write path, and must agree. The session is a short run whose heat-sink
 * samples are still rising, so the thermal margin is judged where it was heading.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { mainScope, makeOrganisationAdmin, makeUser, resetDatabase, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { getFleetOverview } from "@/lib/db/fleet";
import { getCurrentPolicy, saveDefaultPolicyVersion } from "@/lib/db/policy";
import { createSession, getSessionDetail } from "@/lib/db/sessions";
import { readCoilPage } from "@/lib/db/coil-page";
import { evaluateCoilForClearance } from "@/lib/db/clearances";
import { backfillSessionFits } from "@/lib/db/session-fits";
import { judgeCoil } from "@/lib/analysis/coil-health-input";
import { analyzeRunSession } from "@/lib/analysis/session-analysis";
import { classifyHeadroom } from "@/lib/calc/margin";
import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import { THERMAL_INPUT_NAMES } from "@/lib/calc/thermal-margin";
import { sessionSchema, toLocalDateTimeValue } from "@/lib/validation/session";

beforeEach(resetDatabase);

/** Reads at the default site, as a single-club install makes them. */
const MAIN = mainScope(null);

const DAY = 86_400_000;
/** 22 °C + 68 K·(1 − e^(−t/240 s)) every 15 s for 4¼ min, read to 0.1 K: about one time constant, still rising. */
const RISING = [22, 26.1, 30, 33.6, 37, 40.3, 43.3, 46.1, 48.8, 51.3, 53.6, 55.8, 57.9, 59.8, 61.7, 63.4, 65, 66.5];
const samplesText = ["time,temp", ...RISING.map((t, i) => `${Math.floor((15 * i) / 60)}:${String((15 * i) % 60).padStart(2, "0")},${t}`)].join("\n");

const pick = (m: { headroom: number | null; status: string }) => ({ headroom: m.headroom, status: m.status });

async function logRisingRun(actorId: string, coilId: string, topLoadId: string, now: Date) {
  return createSession(
    mainScope(actorId),
    sessionSchema.parse({
      coilId,
      topLoadId,
      startedAt: toLocalDateTimeValue(new Date(now.getTime() - DAY / 2)),
      supplyVoltageV: "24 V",
      supplyCurrentA: "2 A",
      durationS: "255 s",
      ambientTempC: "22",
      heatSinkStartC: "22",
      heatSinkEndC: "66.5",
      runningFrequencyHz: "300k",
      peakSwitchVoltageV: "100 V",
      dutyCycle: "0.5",
      samples: samplesText,
    }),
  );
}

describe("one session shows one set of margins everywhere", () => {
  it("agrees on the dashboard, the coil page, the session page and the clearance check under a stricter policy", async () => {
    const admin = await makeOrganisationAdmin("admin@club.test");
    const member = await makeUser("member@club.test", "member");
    const now = new Date();
    const coil = await makeCleanCoil("OJ-1", now);
    const topLoad = await testDb.topLoad.findFirstOrThrow({ where: { coilId: coil.id } });
    // A non-default policy through its write path: stricter margins and a larger junction margin.
    await saveDefaultPolicyVersion(mainScope(admin.id), { ...DEFAULT_CLEARANCE_POLICY, minVoltageHeadroom: 0.7, minCurrentHeadroom: 0.3, minThermalHeadroom: 0.35, minJunctionMarginK: 30 }, "stricter");
    const policy = await getCurrentPolicy(MAIN);
    expect(policy.rules.minThermalHeadroom).toBe(0.35);
    const session = await logRisingRun(member.id, coil.id, topLoad.id, now);

    // Dashboard: the stored summary (computed on the first read, then read back as stored).
    await getFleetOverview(MAIN, now);
    const dashboard = (await getFleetOverview(MAIN, now)).find((row) => row.tag === "OJ-1")!;
    const stored = await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: coil.id } });
    expect(stored.computedRevision).toBe(stored.revision);
    // Coil page: its records and the one coil judgement.
    const page = (await readCoilPage(MAIN, "OJ-1"))!;
    const coilPage = judgeCoil(page.history, page.policy.rules, now).latest!;
    expect(coilPage.session.id).toBe(session.id);
    // Session page: the detail with its samples, judged by the current policy.
    const detail = (await getSessionDetail(MAIN, session.id))!;
    const sessionPage = analyzeRunSession(detail.coil, detail, detail.coil.components, detail.samples, { policy: policy.rules });
    // Clearance: the hardest recent session at the current setup; the rising run is the hardest thermally.
    const clearance = (await evaluateCoilForClearance(MAIN, coil.id, {}, now))!;
    expect(clearance.hardestSessionIds.thermal).toBe(session.id);

    for (const kind of ["voltage", "current", "thermal"] as const) {
      const expected = pick(sessionPage.margins[kind]);
      expect(pick(dashboard.latestMargins![kind])).toEqual(expected);
      expect(pick(coilPage.analysis.margins[kind])).toEqual(expected);
      expect(pick(clearance.facts.margins[kind]!)).toEqual(expected);
      // Judged by the policy's threshold, not a table of its own.
      const threshold = { voltage: 0.7, current: 0.3, thermal: 0.35 }[kind];
      if (expected.headroom !== null) expect(expected.status).toBe(classifyHeadroom(expected.headroom, threshold));
    }

    // The rising run is judged where it was heading: T_j projected past T_j,max though the recorded end was under it.
    const thermal = sessionPage.margins.thermal;
    const tj = thermal.inputs.find((i) => i.name === THERMAL_INPUT_NAMES.junctionTemp)!.value;
    const tjEnd = thermal.inputs.find((i) => i.name === THERMAL_INPUT_NAMES.endJunctionTemp)!.value;
    expect(tj).toBeGreaterThan(150);
    expect(tjEnd).toBeLessThan(tj);
    expect(thermal.status).toBe("exceeded");
    expect(thermal.notes.join(" ")).toMatch(/Projected junction temperature/);
    expect(clearance.evaluation.failedRuleIds).toContain("thermal-headroom");
    // The max-run prefill comes only from a usable fit's lower bound: the clean runs have one, at most their bound.
    expect(clearance.maxRun.seconds).not.toBeNull();
  });

  it("fits sessions logged before fits were stored, once, and the health path then uses the fit", async () => {
    const now = new Date();
    const coil = await makeCleanCoil("OJ-2", now);
    // As an existing database has them after the migration: samples, but no stored fit.
    await testDb.runSession.updateMany({ where: { coilId: coil.id }, data: { sinkFitSampleCount: null, sinkFitJson: null, sinkSteadyStateC: null } });
    const before = judgeCoil((await readCoilPage(MAIN, "OJ-2"))!.history, (await getCurrentPolicy(MAIN)).rules, now).latest!;
    expect(before.analysis.sinkProjection?.basis).toBe("worst-case");

    expect(await backfillSessionFits(MAIN, 2)).toBe(5);
    expect(await backfillSessionFits(MAIN)).toBe(0);
    const rows = await testDb.runSession.findMany({ where: { coilId: coil.id } });
    expect(rows.every((r) => r.sinkFitSampleCount === 21 && r.sinkSteadyStateC !== null)).toBe(true);
    const after = judgeCoil((await readCoilPage(MAIN, "OJ-2"))!.history, (await getCurrentPolicy(MAIN)).rules, now).latest!;
    expect(after.analysis.sinkProjection?.basis).toBe("fit-upper-bound");
    expect(after.analysis.margins.thermal.status).toBe("ok");
    const audit = await testDb.auditEvent.findMany({ where: { entity: "RunSession", summary: { contains: "warm-up fit" } } });
    expect(audit).toHaveLength(3);
  });
});
