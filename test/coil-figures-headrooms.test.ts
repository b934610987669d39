/**
 * The cold dashboard judges each coil with judgeCoilFigures, which analyses a health window's older sessions for their
 * headrooms only (lib/analysis/session-analysis.ts analyzeRunSessionHeadrooms) and assesses their health as a verdict
 * (lib/calc/coil-health.ts assessCoilVerdict: trends fitted only where they can raise a finding). These properties hold it to the full
 * judgement (judgeCoil, every session analysed in full, as the coil page does) on generated logbooks: the same health,
 * reasons and latest margins, the same headrooms double for double, and so the same figures and the same stored
 * summary columns as computeCoilFigures made from judgeCoil before this path existed.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { headroomsOf, judgeCoil, judgeCoilFigures } from "@/lib/analysis/coil-health-input";
import { collectHeadroomTrend } from "@/lib/analysis/headroom-trend";
import { briefSessionMargins } from "@/lib/analysis/margin-brief";
import { computeHealthValidUntil } from "@/lib/analysis/health-validity";
import { toCoilVerdict } from "@/lib/calc/coil-health";
import { HEALTH_WINDOW } from "@/lib/analysis/health-window";
import { computeCoilFigures, type CoilFigures } from "@/lib/db/coil-summary";
import type { PolicyVersion } from "@/lib/db/policy";
import { coilHistoryArbitrary, type GeneratedJudgement } from "./support/coil-history-arbitrary";

/** computeCoilFigures as it was written on judgeCoil (every session of the window analysed in full). */
function figuresFromFullJudgement({ history, policy, now }: GeneratedJudgement): CoilFigures {
  const judged = judgeCoil(history, policy, now);
  return {
    health: judged.health?.status ?? "not enough data",
    reasons: judged.reasons,
    latestMargins: judged.latest ? briefSessionMargins(judged.latest.analysis.margins) : null,
    headroomTrend: collectHeadroomTrend(judged.analyzed, policy),
    sessionCount: history.totals.sessionCount,
    totalRunS: history.totals.totalDurationS,
    lastSessionAt: history.totals.lastSessionAt,
    lastSweepAt: history.sweeps.at(-1)?.takenAt ?? null,
    validUntil: judged.health ? computeHealthValidUntil(judged.health, now) : null,
  };
}

/** What storeCoilFigures writes to the CoilSummary row (lib/db/coil-summary.ts), as text and instants. */
function storedColumns(figures: CoilFigures) {
  return {
    validUntil: figures.validUntil?.getTime() ?? null,
    health: figures.health,
    reasonsJson: JSON.stringify(figures.reasons),
    latestMarginsJson: JSON.stringify(figures.latestMargins),
    headroomTrendJson: JSON.stringify(figures.headroomTrend),
    sessionCount: figures.sessionCount,
    totalRunS: figures.totalRunS,
    lastSessionAt: figures.lastSessionAt?.getTime() ?? null,
    lastSweepAt: figures.lastSweepAt?.getTime() ?? null,
  };
}

const policyVersion = (g: GeneratedJudgement): PolicyVersion => ({ id: "policy-gen", siteId: null, version: 3, rules: g.policy, note: "generated", createdAt: new Date(0) });

describe("judgeCoilFigures (headrooms only for a window's older sessions)", () => {
  it("judges every generated logbook as judgeCoil does: health, reasons, latest margins and each headroom (property)", () => {
    const seen = { unassessable: 0, windowCut: 0, statuses: new Set<string>(), projections: 0 };
    fc.assert(
      fc.property(coilHistoryArbitrary, (g) => {
        const full = judgeCoil(g.history, g.policy, g.now);
        const fast = judgeCoilFigures(g.history, g.policy, g.now);
        expect(fast.health).toStrictEqual(full.health && toCoilVerdict(full.health));
        expect(fast.reasons).toStrictEqual(full.reasons);
        expect(fast.latest).toStrictEqual(full.latest);
        const fullHeadrooms = full.analyzed.map((a) => headroomsOf(a.analysis.margins));
        expect(fast.headrooms).toHaveLength(fullHeadrooms.length);
        fast.headrooms.forEach((h, i) => {
          for (const kind of ["voltage", "current", "thermal"] as const) {
            expect(Object.is(h[kind], fullHeadrooms[i]![kind]), `session ${i} ${kind}: ${h[kind]} against ${fullHeadrooms[i]![kind]}`).toBe(true);
          }
        });
        if (full.health === null) seen.unassessable++;
        else seen.statuses.add(full.health.status);
        if (g.history.sessions.length > HEALTH_WINDOW.baselineSessions + HEALTH_WINDOW.recentSessions) seen.windowCut++;
        if (full.health && Object.values(full.health.margins).some((m) => m.crossing !== null)) seen.projections++;
      }),
      { numRuns: 400 },
    );
    // The generated logbooks reached each kind of answer, so the property was not met on one kind alone.
    expect(seen.unassessable).toBeGreaterThan(5);
    expect(seen.windowCut).toBeGreaterThan(5);
    expect(seen.projections).toBeGreaterThan(5);
    expect([...seen.statuses].sort()).toEqual(["fine", "hold", "not enough data", "watch"]);
  });

  it("gives the same coil figures and the same stored summary columns as the full judgement (property)", () => {
    let timeBound = 0;
    fc.assert(
      fc.property(coilHistoryArbitrary, (g) => {
        const expected = figuresFromFullJudgement(g);
        const figures = computeCoilFigures(g.history, policyVersion(g), g.now);
        expect(figures).toStrictEqual(expected);
        expect(storedColumns(figures)).toStrictEqual(storedColumns(expected));
        if (expected.validUntil !== null) timeBound++;
      }),
      { numRuns: 400 },
    );
    // Some verdicts hold only until a projection moves them, so the stored validUntil was compared set, not only null.
    expect(timeBound).toBeGreaterThan(5);
  });
});
