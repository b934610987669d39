import { describe, expect, it } from "vitest";
import { buildClearanceFacts, findLatestSweepForCurrentTopLoad, findPartReplacements, type ClearanceHistory } from "./clearance-facts";
import { DEFAULT_CLEARANCE_POLICY } from "../calc/clearance-policy";
import { describeClearanceState, describeLendingBlock } from "./clearance-state";
import { fitSessionSamples, type StoredSinkFit } from "./session-fit";
import type { ComponentRecord, SessionRecord } from "./records";

const day = (n: number) => new Date(Date.UTC(2026, 0, 1 + n, 12));

const sw: ComponentRecord = {
  id: "sw1",
  kind: "switch",
  partNumber: "MJE13009",
  installedAt: day(0),
  removedAt: null,
  switchType: "bjt",
  voltageRatingV: 400,
  continuousCurrentA: 12,
  peakCurrentA: 24,
  powerRating25CW: 100,
  maxJunctionTempC: 150,
  thermalResistanceJcKPerW: 1.25,
  caseToSinkKPerW: 0.5,
};
const sink: ComponentRecord = { id: "hs1", kind: "heat_sink", partNumber: "HS-1", installedAt: day(0), removedAt: null, sinkThermalResistanceKPerW: 1.5 };

function session(n: number, extra: Partial<SessionRecord & StoredSinkFit> = {}): SessionRecord & Partial<StoredSinkFit> {
  return {
    id: `s${n}`,
    startedAt: day(n),
    supplyVoltageV: 24,
    supplyCurrentA: 2,
    durationS: 600,
    ambientTempC: 22,
    heatSinkStartC: 22,
    heatSinkEndC: 40,
    runningFrequencyHz: 300_000,
    peakSwitchVoltageV: 100,
    dutyCycle: 0.5,
    outcome: "normal",
    topLoadId: "tl1",
    ...extra,
  };
}

function history(over: Partial<ClearanceHistory> = {}): ClearanceHistory {
  return {
    coil: { topology: "single_switch", formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002, environmentCapacitanceF: null, measuredInductanceH: null },
    components: [sw, sink],
    sessions: [1, 2, 3, 4, 5].map((n) => session(n)),
    sweeps: [{ id: "w1", takenAt: day(4), topLoadId: "tl1", firstSeriesResonanceHz: 310_000 }],
    failures: [],
    latestSessionSamples: [],
    ...over,
  };
}

describe("buildClearanceFacts", () => {
  it("takes the latest session's margins and frequency, the latest sweep and counts clean sessions", () => {
    const { facts, latestSession } = buildClearanceFacts(history(), { a: true }, DEFAULT_CLEARANCE_POLICY);
    expect(latestSession?.id).toBe("s5");
    expect(facts.margins.voltage?.headroom).toBeCloseTo(1 - 100 / 400, 6);
    expect(facts.runningFrequencyHz).toBe(300_000);
    expect(facts.firstSeriesResonanceHz).toBe(310_000);
    expect(facts.lastSweepAt).toEqual(day(4));
    expect(facts.failureFreeSessions).toBe(5);
    expect(facts.openFailures).toBe(0);
    expect(facts.checklist).toEqual({ a: true });
  });

  it("counts clean sessions only after the later of the last failure and the last repair", () => {
    const replacement: ComponentRecord = { ...sw, id: "sw2", installedAt: new Date(day(3).getTime() + 3600_000) };
    const h = history({
      components: [{ ...sw, removedAt: replacement.installedAt }, replacement, sink],
      failures: [{ occurredAt: day(2), status: "closed", mode: "over_voltage" }],
    });
    // Sessions on days 4 and 5 follow the repair on day 3 (13:00).
    expect(buildClearanceFacts(h, {}, DEFAULT_CLEARANCE_POLICY).facts.failureFreeSessions).toBe(2);
  });

  it("counts open failures and has no margins without sessions", () => {
    const { facts } = buildClearanceFacts(history({ sessions: [], failures: [{ occurredAt: day(1), status: "open", mode: "unknown" }] }), {}, DEFAULT_CLEARANCE_POLICY);
    expect(facts.margins).toEqual({});
    expect(facts.openFailures).toBe(1);
    expect(facts.runningFrequencyHz).toBeNull();
  });

  it("uses only sweeps with the top load of the latest session", () => {
    const sweeps = [
      { id: "a", takenAt: day(1), topLoadId: "tl1", firstSeriesResonanceHz: 300_000 },
      { id: "b", takenAt: day(2), topLoadId: "tl2", firstSeriesResonanceHz: 250_000 },
    ];
    expect(findLatestSweepForCurrentTopLoad(sweeps, session(3, { topLoadId: "tl1" }))?.id).toBe("a");
    expect(findLatestSweepForCurrentTopLoad(sweeps, session(3, { topLoadId: "tl3" }))).toBeNull();
    expect(findLatestSweepForCurrentTopLoad(sweeps, session(3, { topLoadId: null }))?.id).toBe("b");
  });

  it("treats parts fitted after the build's first day as replacements", () => {
    expect(findPartReplacements([sw, sink])).toEqual([]);
    const later = { ...sink, id: "hs2", partNumber: "HS-2", installedAt: day(9) };
    expect(findPartReplacements([sw, sink, later])).toEqual([{ at: day(9), partDescription: "heat sink HS-2" }]);
  });
});

describe("describeClearanceState", () => {
  const cleared = { id: "c1", decidedAt: day(10), validUntil: day(70), verdict: "cleared" as const };

  it("says none, valid, expired, lapsed after a failure or a part, and refused, with a lending block for each but valid", () => {
    expect(describeClearanceState(null, [], [], day(11)).kind).toBe("none");
    const valid = describeClearanceState(cleared, [], [], day(11));
    expect(valid.kind).toBe("valid");
    expect(describeLendingBlock(valid)).toBeNull();
    expect(describeClearanceState(cleared, [], [], day(71)).kind).toBe("expired");
    const failed = describeClearanceState(cleared, [{ occurredAt: day(12), mode: "over_current" }], [], day(13));
    expect(failed.kind).toBe("lapsed-failure");
    expect(describeLendingBlock(failed)).toMatch(/lapsed after a failure/);
    expect(describeClearanceState(cleared, [], [{ at: day(12), partDescription: "switch X" }], day(13)).kind).toBe("lapsed-part");
    // A failure known before signing does not lapse it.
    expect(describeClearanceState(cleared, [{ occurredAt: day(5), mode: "unknown" }], [], day(13)).kind).toBe("valid");
    const refused = describeClearanceState({ ...cleared, verdict: "refused" }, [], [], day(11));
    expect(refused.kind).toBe("refused");
    expect(describeLendingBlock(refused)).toMatch(/refusal/);
  });
});

describe("lending judged on the hardest recent session", () => {
  /** An exact first-order warm-up (docs/references.md, "Heat sink warm-up"), 22 °C + rise·(1 − e^(−t/120 s)), 10 min. */
  const warm = (rise: number) => fitSessionSamples(Array.from({ length: 21 }, (_, i) => ({ elapsedS: 30 * i, temperatureC: 22 + rise * (1 - Math.exp((-30 * i) / 120)) })));

  it("takes each margin from the recent session with the least headroom, not the latest", () => {
    const sessions = [session(1, warm(13)), session(2, { ...warm(30), id: "hot" }), session(3, warm(13)), session(4, warm(13)), session(5, warm(13))];
    const built = buildClearanceFacts(history({ sessions }), {}, DEFAULT_CLEARANCE_POLICY);
    expect(built.hardestSessionIds.thermal).toBe("hot");
    const latestThermal = built.recent.at(-1)!.analysis.margins.thermal.headroom!;
    expect(built.facts.margins.thermal!.headroom!).toBeLessThan(latestThermal);
  });

  it("ignores sessions run on other parts or another top load", () => {
    const sessions = [session(1, { ...warm(30), id: "old-top", topLoadId: "tl0" }), session(2, warm(13)), session(3, warm(13))];
    const built = buildClearanceFacts(history({ sessions }), {}, DEFAULT_CLEARANCE_POLICY);
    expect(built.recent.map((r) => r.session.id)).toEqual(["s2", "s3"]);
  });

  it("pre-fills a maximum run only from a usable fit's lower bound, and says why when there is none", () => {
    const withFits = buildClearanceFacts(history({ sessions: [1, 2, 3].map((n) => session(n, warm(13))) }), {}, DEFAULT_CLEARANCE_POLICY);
    expect(withFits.maxRun.seconds).not.toBeNull();
    expect(withFits.maxRun.reason).toMatch(/Lower 95 % bound of the warm-up fit/);
    const withoutSamples = buildClearanceFacts(history(), {}, DEFAULT_CLEARANCE_POLICY);
    expect(withoutSamples.maxRun.seconds).toBeNull();
    expect(withoutSamples.maxRun.reason).toMatch(/No recent session at the coil's current setup has a usable warm-up fit/);
  });
});
