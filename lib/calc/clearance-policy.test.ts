import { describe, expect, it } from "vitest";
import { computeClearanceExpiry, DEFAULT_CLEARANCE_POLICY, evaluateClearance, validateClearancePolicy, type ClearanceFacts } from "./clearance-policy";
import { CalcInputError } from "./errors";
import { DEFAULT_LENDING_CHECKLIST } from "./lending-checklist";
import { assessMargin } from "./margin";
import { sessionMargins } from "./session-margins";

const DAY = 86_400_000;
const now = new Date(Date.UTC(2025, 4, 30, 12, 0)); // 30 May 2025, 12:00 UTC

// A healthy clamped single-switch coil: 30 V, 2 A, sink 45 °C at 22 °C ambient on a 2 K/W sink.
const healthy = sessionMargins(
  { topology: "single_switch", voltageClamp: true, supplyVoltageV: 30, supplyCurrentA: 2, ambientTempC: 22, heatSinkEndC: 45, peakSwitchVoltageV: 80, dutyCycle: 0.5 },
  { voltageRatingV: 140, peakCurrentA: 20, continuousCurrentA: 12, powerRating25CW: 100, maxJunctionTempC: 150, thermalResistanceJcKPerW: 1.25, caseToSinkKPerW: 0.5 },
  { sinkThermalResistanceKPerW: 2 },
);
const allYes = Object.fromEntries(DEFAULT_LENDING_CHECKLIST.map((i) => [i.id, true]));
const goodFacts: ClearanceFacts = {
  margins: healthy,
  firstSeriesResonanceHz: 305e3,
  runningFrequencyHz: 310e3,
  openFailures: 0,
  lastSweepAt: new Date(now.getTime() - 10 * DAY),
  failureFreeSessions: 5,
  checklist: allYes,
};
const evaluate = (facts: Partial<ClearanceFacts>, policy = DEFAULT_CLEARANCE_POLICY) => evaluateClearance({ policy, facts: { ...goodFacts, ...facts }, now });
const rule = (r: ReturnType<typeof evaluateClearance>, id: string) => r.rules.find((x) => x.id === id)!;
const voltageMargin = (peak: number, rating: number, estimated = false) =>
  assessMargin({ kind: "voltage", value: peak, limit: rating, formula: "V_peak / V_rating", inputs: [{ name: "V_peak", value: peak, unit: "V", estimated, source: "test" }], thinBelow: 0.2 });

describe("DEFAULT_CLEARANCE_POLICY", () => {
  it("follows the sources it cites", () => {
    // Renesas knowledge base: within 80 % of the rated drain–source voltage, i.e. 20 % headroom.
    expect(DEFAULT_CLEARANCE_POLICY.minVoltageHeadroom).toBe(0.2);
    // ITU RR Article 5: Region 2's band 525–1705 kHz contains Regions 1 and 3's 526.5–1606.5 kHz, so it is the strictest.
    expect(DEFAULT_CLEARANCE_POLICY.ituRegion).toBe(2);
    expect(validateClearancePolicy(DEFAULT_CLEARANCE_POLICY)).toBe(DEFAULT_CLEARANCE_POLICY);
  });
});

describe("evaluateClearance", () => {
  it("passes a healthy coil with every check answered, without calling it safe", () => {
    const r = evaluate({});
    expect(r.failedRuleIds).toEqual([]);
    expect(r.verdict).toBe("pass");
    expect(r.summary).toMatch(/Passed the team's recorded checks/);
    expect(r.summary).not.toMatch(/\bis safe\b|\bsafe to\b/i);
    expect(r.rules.filter((x) => x.id.startsWith("checklist:"))).toHaveLength(DEFAULT_LENDING_CHECKLIST.length);
  });

  it("fails voltage headroom under Renesas' 80 % guidance and passes exactly 80 %", () => {
    // Renesas: stay within 80 % of the rating. 85 V on 100 V is 85 % (15 % headroom): fail. 80 V on 100 V: pass.
    const over = evaluate({ margins: { ...healthy, voltage: voltageMargin(85, 100) } });
    expect(over.failedRuleIds).toEqual(["voltage-headroom"]);
    expect(rule(over, "voltage-headroom")).toMatchObject({ measured: 15, threshold: 20, unit: "%", pass: false });
    expect(rule(over, "voltage-headroom").detail).toMatch(/85 % of the limit, 15 % headroom/);
    expect(evaluate({ margins: { ...healthy, voltage: voltageMargin(80, 100) } }).verdict).toBe("pass");
  });

  it("fails an unknown margin with what is missing, and a missing session", () => {
    const unknown = sessionMargins({ topology: "single_switch", supplyVoltageV: 24, supplyCurrentA: 2, ambientTempC: 20 }, {}, {});
    const r = evaluate({ margins: unknown });
    for (const id of ["voltage-headroom", "current-headroom", "thermal-headroom", "junction-margin"]) expect(r.failedRuleIds).toContain(id);
    expect(rule(r, "voltage-headroom").detail).toMatch(/Could not be worked out: .*voltage rating/);
    expect(rule(r, "voltage-headroom").measured).toBeNull();
    const none = evaluate({ margins: {} });
    expect(rule(none, "current-headroom").detail).toMatch(/No run session/);
    expect(none.verdict).toBe("fail");
  });

  it("lets a policy refuse margins that rest on estimates", () => {
    const margins = { ...healthy, voltage: voltageMargin(60, 140, true) };
    expect(evaluate({ margins }).verdict).toBe("pass");
    const strict = evaluate({ margins }, { ...DEFAULT_CLEARANCE_POLICY, acceptEstimatedMargins: false });
    expect(strict.failedRuleIds).toContain("voltage-headroom");
    expect(rule(strict, "voltage-headroom").detail).toMatch(/Rests on estimates \(V_peak\), which this policy does not accept/);
  });

  it("checks the junction margin in kelvin from the thermal margin's T_j", () => {
    const r = evaluate({});
    // By hand (thermal chain, docs/references.md): P = (45 − 22)/2 = 11.5 W; T_j = 45 + 11.5·(1.25 + 0.5) = 65.125 °C;
    // 150 − 65.125 = 84.875 K, shown rounded down to 84.8 K.
    expect(rule(r, "junction-margin").measured).toBe(84.8);
    expect(rule(r, "junction-margin").pass).toBe(true);
    expect(evaluate({}, { ...DEFAULT_CLEARANCE_POLICY, minJunctionMarginK: 90 }).failedRuleIds).toEqual(["junction-margin"]);
  });

  it("checks the medium-wave band edges per ITU region", () => {
    // ITU RR Article 5: 1650 kHz is inside Region 2 (525–1705 kHz) but above Regions 1/3 (526.5–1606.5 kHz).
    const high = { runningFrequencyHz: 1650e3, firstSeriesResonanceHz: 1640e3 };
    expect(evaluate(high).failedRuleIds).toEqual(["broadcast-band"]);
    expect(evaluate(high, { ...DEFAULT_CLEARANCE_POLICY, ituRegion: 1 }).verdict).toBe("pass");
    // 526 kHz: inside Region 2's band, just below Region 3's 526.5 kHz edge.
    const low = { runningFrequencyHz: null, firstSeriesResonanceHz: 526e3 };
    expect(rule(evaluate(low), "broadcast-band")).toMatchObject({ pass: false, measured: 526e3 });
    expect(evaluate(low, { ...DEFAULT_CLEARANCE_POLICY, ituRegion: 3 }).verdict).toBe("pass");
  });

  it("shows harmonics in the band, even ones too, without failing on them", () => {
    // Fourier series: a single switch's drive lacks half-wave symmetry, so even harmonics appear too.
    // 200 kHz → 600 … 1600 kHz (n = 3 … 8) in Region 2's 525–1705 kHz (ITU RR Article 5); n = 9 is 1800 kHz, out.
    const r = rule(evaluate({ runningFrequencyHz: 200e3, firstSeriesResonanceHz: 198e3 }), "broadcast-band");
    expect(r.pass).toBe(true);
    expect(r.detail).toMatch(/harmonics 3, 4, 5, 6, 7, 8 of the drive/);
  });

  it("fails a Region 1 fundamental in the long-wave band", () => {
    // ITU RR Article 5, Region 1 LF broadcasting 148.5–283.5 kHz (edges from memory): 200 kHz is inside, 300 kHz is not.
    const region1 = { ...DEFAULT_CLEARANCE_POLICY, ituRegion: 1 as const };
    const r = rule(evaluate({ runningFrequencyHz: 200e3, firstSeriesResonanceHz: 198e3 }, region1), "broadcast-band");
    expect(r.pass).toBe(false);
    expect(r.detail).toMatch(/INSIDE the long-wave band/);
    expect(rule(evaluate({ runningFrequencyHz: 300e3, firstSeriesResonanceHz: 298e3 }, region1), "broadcast-band").pass).toBe(true);
  });

  it("fails the band rule when no frequency is known", () => {
    const r = rule(evaluate({ runningFrequencyHz: null, firstSeriesResonanceHz: null }), "broadcast-band");
    expect(r).toMatchObject({ pass: false, measured: null });
  });

  it("counts sweep age in whole 24-hour days, unaffected by daylight-saving changes", () => {
    // 90 days back from 30 May crosses the 9 March 2025 DST change in St John's; UTC instants do not care.
    expect(rule(evaluate({ lastSweepAt: new Date(now.getTime() - 90 * DAY) }), "sweep-age")).toMatchObject({ pass: true, measured: 90 });
    expect(rule(evaluate({ lastSweepAt: new Date(now.getTime() - 90 * DAY - 3_600_000) }), "sweep-age").pass).toBe(false);
    expect(rule(evaluate({ lastSweepAt: null }), "sweep-age").detail).toMatch(/No sweep recorded/);
    expect(rule(evaluate({ lastSweepAt: new Date(now.getTime() + 12 * 3_600_000) }), "sweep-age").pass).toBe(true);
    expect(rule(evaluate({ lastSweepAt: new Date(now.getTime() + 3 * DAY) }), "sweep-age").detail).toMatch(/after now/);
  });

  it("fails open failures, too few clean sessions and unanswered or refused checklist items", () => {
    const r = evaluate({ openFailures: 1, failureFreeSessions: 2, checklist: { ...allYes, "no-vacuum-glassware": false, "discharge-wand": undefined as unknown as boolean } });
    expect(r.failedRuleIds).toEqual(["open-failures", "failure-free-sessions", "checklist:discharge-wand", "checklist:no-vacuum-glassware"]);
    expect(rule(r, "checklist:discharge-wand").measured).toBe("not answered");
    expect(rule(r, "checklist:no-vacuum-glassware").measured).toBe("no");
    expect(r.summary).toMatch(/Did not pass 4 of/);
  });

  it("refuses a malformed policy or facts, naming the field", () => {
    expect(() => evaluate({}, { ...DEFAULT_CLEARANCE_POLICY, minVoltageHeadroom: 1.5 })).toThrow(/^policy\.minVoltageHeadroom/);
    expect(() => evaluate({}, { ...DEFAULT_CLEARANCE_POLICY, ituRegion: 4 as 1 })).toThrow(CalcInputError);
    expect(() => evaluate({ openFailures: -1 })).toThrow(/^facts\.openFailures/);
    expect(() => evaluate({ runningFrequencyHz: -5 })).toThrow(/^facts\.runningFrequencyHz/);
    const dup = [...DEFAULT_LENDING_CHECKLIST, DEFAULT_LENDING_CHECKLIST[0]!];
    expect(() => evaluate({}, { ...DEFAULT_CLEARANCE_POLICY, requiredChecklist: dup })).toThrow(/requiredChecklist\[9\]\.id/);
  });
});

describe("computeClearanceExpiry", () => {
  it("adds whole 24-hour days to the UTC instant", () => {
    const decided = new Date(Date.UTC(2025, 2, 1, 12, 0)); // before the 9 March DST change in St John's
    expect(computeClearanceExpiry(decided, DEFAULT_CLEARANCE_POLICY).toISOString()).toBe("2025-04-30T12:00:00.000Z"); // 60 days
    expect(() => computeClearanceExpiry(new Date(Number.NaN), DEFAULT_CLEARANCE_POLICY)).toThrow(/^decidedAt/);
  });
});
