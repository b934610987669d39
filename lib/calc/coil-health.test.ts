import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { assessCoilHealth, assessCoilVerdict, toCoilVerdict, type CoilHealthInput } from "./coil-health";
import type { CoilSession, CoilSweep } from "./coil-logbook";
import { addDays } from "./drift-series";
import { CalcInputError } from "./errors";
import { createSeededRandom } from "./seeded-random";

const START = new Date("2026-01-05T23:30:00Z"); // evening sessions: 20:00 in St John's, the next day in UTC

interface CoilScenario {
  seed: number;
  sessions?: number;
  /** Voltage headroom at day 0 and its change per day (the drift under test). */
  voltageHeadroom?: [number, number];
  /** Relative supply-current drift per day at constant voltage. */
  currentDriftPerDay?: number;
  /** Supply voltage of session i. */
  supplyVoltageV?: (i: number, random: () => number) => number;
  /** Exponent of I ∝ V^k: 1 is a linear load, above 1 a load that stiffens with voltage (arcs). */
  currentExponent?: number;
  /** Session index whose voltage headroom reads far too high (a mis-keyed entry). */
  outlierAt?: number;
  runningFrequencyHz?: (day: number) => number;
  resonanceHz?: (day: number) => number;
  heatPerWattKPerW?: (day: number) => number;
}

/**
 * A synthetic coil: one session about every 7 days (±2), noise of a size seen in hand-logged data (common
 * practice): ±1.5 points of headroom, ±3 % supply current, ±0.3 % running frequency, ±0.2 % sweep resonance.
 */
function simulateCoil(o: CoilScenario): { sessions: CoilSession[]; sweeps: CoilSweep[]; lastDay: number } {
  const rng = createSeededRandom(o.seed);
  const n = o.sessions ?? 30;
  const [v0, vSlope] = o.voltageHeadroom ?? [0.45, 0];
  const sessions: CoilSession[] = [];
  let day = 0;
  for (let i = 0; i < n; i++) {
    const supplyVoltageV = o.supplyVoltageV?.(i, rng.uniform) ?? 170;
    const currentA = 2.4 * (supplyVoltageV / 170) ** (o.currentExponent ?? 1) * (1 + (o.currentDriftPerDay ?? 0) * day);
    const supplyCurrentA = currentA * (1 + 0.03 * rng.normal());
    const heatPerW = o.heatPerWattKPerW?.(day) ?? 0.05;
    sessions.push({
      startedAt: addDays(START, day),
      supplyVoltageV,
      supplyCurrentA,
      durationS: 300 * (1 + 0.05 * rng.normal()),
      voltageHeadroom: (i === o.outlierAt ? 0.35 : 0) + v0 + vSlope * day + 0.015 * rng.normal(),
      currentHeadroom: 0.5 + 0.015 * rng.normal(),
      thermalHeadroom: 0.35 + 0.015 * rng.normal(),
      runningFrequencyHz: (o.runningFrequencyHz?.(day) ?? 250e3) * (1 + 0.003 * rng.normal()),
      heatSinkRiseK: heatPerW * supplyVoltageV * supplyCurrentA * (1 + 0.05 * rng.normal()),
    });
    day += 5 + 4 * rng.uniform();
  }
  const lastDay = day - 0; // day of the next (unlogged) session, used as "now"
  const sweeps: CoilSweep[] = [0, 60, 120, 180]
    .filter((d) => d <= lastDay)
    .map((d) => ({ takenAt: addDays(START, d), firstSeriesResonanceHz: (o.resonanceHz?.(d) ?? 248e3) * (1 + 0.002 * rng.normal()) }));
  return { sessions, sweeps, lastDay };
}

describe("assessCoilHealth: a coil drifting toward its voltage limit", () => {
  // Voltage headroom 0.40 at day 0, falling 0.0008 a day (2.4 points a month): it meets 0.20 on day 250.
  const truth = addDays(START, 250);

  /** The drifting coil as logged up to `now`. */
  const observeUntil = (now: Date, outlierAt?: number) => {
    const coil = simulateCoil({ seed: 7, sessions: 40, voltageHeadroom: [0.4, -0.0008], outlierAt });
    return { sessions: coil.sessions.filter((s) => s.startedAt <= now), sweeps: coil.sweeps, now };
  };

  it("is put on watch with a projected crossing near the true one, an outlier notwithstanding", () => {
    const now = addDays(truth, -60);
    const health = assessCoilHealth(observeUntil(now, 12));
    const v = health.margins.voltage;
    expect(health.status).toBe("watch");
    expect(v.falling).toBe(true);
    // Crossing error (derived from the least-squares band): σ/|b|·√(1/n + (x* − x̄)²/Σ(x − x̄)²) with σ = 0.015,
    // b = 0.0008/day, n ≈ 27 sessions over 190 days, x* = 250 → about 11 days; 35 days is about 3 sd.
    const offByDays = Math.abs(v.crossing!.at.getTime() - truth.getTime()) / 86_400_000;
    expect(offByDays).toBeLessThan(35);
    expect(v.trend!.perMonthLow).toBeLessThan(-0.024 + 0.006);
    expect(v.trend!.perMonthHigh).toBeGreaterThan(-0.024 - 0.006);
    const reason = health.reasons.find((r) => r.startsWith("Voltage headroom is falling"));
    expect(reason).toMatch(/^Voltage headroom is falling about 2\.\d points a month \(95 % range [\d.]+ to [\d.]+; p < 0\.001\)\./);
    expect(reason).toContain(`reaches the 20 % limit around ${v.crossing!.at.toISOString().slice(0, 10)} (in about `);
    expect(v.crossing!.sessionsAway).toBeGreaterThan(0);
  });

  it("gives a crossing range that holds the true date in most simulated logbooks", () => {
    // The range comes from Sen's slope interval with the bound lines pivoting at the data's median time; it
    // leaves out the level's own uncertainty (the 1/n term of the least-squares band, derived), which is small
    // 60 days beyond the data, so coverage should sit a little under 95 %. Over 200 seeds: at least 88 %
    // (95 % less 4.5 binomial sd) and not all 200 (that would mean the range is far too wide).
    let covered = 0;
    for (let seed = 1; seed <= 200; seed++) {
      const coil = simulateCoil({ seed, sessions: 40, voltageHeadroom: [0.4, -0.0008] });
      const now = addDays(truth, -60);
      const c = assessCoilHealth({ sessions: coil.sessions.filter((x) => x.startedAt <= now), sweeps: [], now }).margins
        .voltage.crossing;
      if (c && c.earliest <= truth && (c.latest === null || truth <= c.latest)) covered++;
    }
    expect(covered).toBeGreaterThanOrEqual(176);
    expect(covered).toBeLessThan(200);
  });

  it("barely notices the outlier: the projection with and without it differs by days, not weeks", () => {
    const now = addDays(truth, -60);
    const a = assessCoilHealth(observeUntil(now)).margins.voltage.crossing!.at.getTime();
    const b = assessCoilHealth(observeUntil(now, 12)).margins.voltage.crossing!.at.getTime();
    expect(Math.abs(a - b) / 86_400_000).toBeLessThan(5);
  });

  it("is held once the projected crossing is within 30 days", () => {
    // 12 days before the true crossing; the projection's sd there is about 7 days (same formula as above)
    const health = assessCoilHealth(observeUntil(addDays(truth, -12)));
    expect(health.status).toBe("hold");
    expect(health.margins.voltage.crossing!.daysAway).toBeLessThanOrEqual(30);
    expect(health.findings.filter((f) => f.severity === "hold").map((f) => f.text)).toContainEqual(
      expect.stringMatching(/^Voltage headroom is falling/),
    );
  });
});

describe("assessCoilHealth: a healthy coil", () => {
  it("is fine across 50 seeded noisy logbooks, some sessions on a turned-down variac", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), (seed) => {
        const coil = simulateCoil({
          seed,
          currentExponent: 1.3,
          supplyVoltageV: (_, u) => (u() < 0.2 ? 120 : 170),
        });
        const health = assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay) });
        expect(health.status).toBe("fine");
        expect(health.findings.filter((f) => f.severity !== "info")).toEqual([]);
        expect(health.reasons[0]).toMatch(/^Every margin with a trend is above its limit/);
      }),
      { numRuns: 50, seed: 20260105 },
    );
  });

  it("says 'not enough data' with only four sessions rather than calling it fine", () => {
    const coil = simulateCoil({ seed: 3, sessions: 4 });
    const health = assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay) });
    expect(health.status).toBe("not enough data");
    expect(health.reasons).toContain("Not enough data for a voltage headroom trend: 4 recorded, at least 6 needed.");
  });
});

describe("assessCoilHealth: supply current at comparable supply voltage", () => {
  it("flags current rising at constant voltage", () => {
    // 0.07 % a day at 170 V is about +14 % over the 200-day log
    const coil = simulateCoil({ seed: 11, currentDriftPerDay: 0.0007 });
    const health = assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay) });
    expect(health.supplyCurrent.flagged).toBe(true);
    expect(health.status).toBe("watch");
    expect(health.supplyCurrent.trend!.perMonth).toBeGreaterThan(0.01);
    expect(health.reasons.join("\n")).toMatch(
      /Supply current at comparable supply voltage \(170 V ± 10 %\) is up 1\d(\.\d)? % since the baseline \(the median of the last 3 sessions against the first 3: [\d.]+ A against [\d.]+ A\), changing about \+[\d.]+ % a month/,
    );
  });

  it("does not flag a change of supply voltage alone, though the raw current rose by more than the tolerance", () => {
    // first ten sessions at 150 V, the rest at 170 V, with a load stiffening as I ∝ V^1.4
    const coil = simulateCoil({ seed: 12, currentExponent: 1.4, supplyVoltageV: (i) => (i < 10 ? 150 : 170) });
    const raw = coil.sessions.map((s) => s.supplyCurrentA);
    const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
    expect(mean(raw.slice(-5)) / mean(raw.slice(0, 5)) - 1).toBeGreaterThan(0.15); // a naive comparison would flag it
    const health = assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay) });
    expect(health.supplyCurrent.referenceVoltageV).toBe(170);
    expect(health.supplyCurrent.observations).toBe(20);
    expect(health.supplyCurrent.flagged).toBe(false);
    expect(health.status).toBe("fine");
  });

  it("uses an explicit commissioning baseline, scaled to the reference voltage", () => {
    const coil = simulateCoil({ seed: 13 });
    // derived: 2.0 A at 160 V scales to 2.125 A at 170 V; the coil draws about 2.4 A there, +13 %
    const health = assessCoilHealth({
      ...coil,
      now: addDays(START, coil.lastDay),
      baseline: { supplyCurrent: { supplyVoltageV: 160, supplyCurrentA: 2.0 } },
    });
    expect(health.supplyCurrent.shift!.baseline).toBeCloseTo(2.125, 12);
    expect(health.supplyCurrent.shift!.shiftFraction).toBeGreaterThan(0.05);
    expect(health.supplyCurrent.flagged).toBe(true);
  });
});

describe("assessCoilHealth: frequencies and the heat sink", () => {
  it("flags a running frequency and a measured resonance that moved from their baselines", () => {
    const coil = simulateCoil({
      seed: 21,
      runningFrequencyHz: (d) => (d < 100 ? 250e3 : 237e3),
      resonanceHz: (d) => (d < 100 ? 248e3 : 236e3),
    });
    const health = assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay) });
    expect(health.status).toBe("watch");
    expect(health.runningFrequency.shift!.shiftFraction).toBeCloseTo(237 / 250 - 1, 2);
    expect(health.firstSeriesResonance.shift!.shiftFraction).toBeCloseTo(236 / 248 - 1, 2);
    expect(health.reasons.join("\n")).toMatch(/Running frequency is down 5\.\d % since the baseline/);
    expect(health.reasons.join("\n")).toMatch(/Measured first series resonance is down [45]\.\d % since the baseline \(the latest sweep against the first: 23\d\.\d kHz against 24\d\.\d kHz\)/);
  });

  it("flags a heat sink that warms more per watt, not one that runs cooler", () => {
    const warmer = simulateCoil({ seed: 31, heatPerWattKPerW: (d) => 0.05 * (1 + 0.002 * d) });
    const cooler = simulateCoil({ seed: 31, heatPerWattKPerW: (d) => 0.05 * (1 - 0.002 * d) });
    const w = assessCoilHealth({ ...warmer, now: addDays(START, warmer.lastDay) });
    const c = assessCoilHealth({ ...cooler, now: addDays(START, cooler.lastDay) });
    expect(w.heatSinkRisePerWatt.flagged).toBe(true);
    expect(w.status).toBe("watch");
    expect(c.heatSinkRisePerWatt.shift!.shiftFraction).toBeLessThan(-0.25);
    expect(c.heatSinkRisePerWatt.flagged).toBe(false);
    expect(c.status).toBe("fine");
  });
});

describe("assessCoilHealth: latest readings and input checks", () => {
  it("holds a coil whose latest thermal headroom is under its limit", () => {
    const coil = simulateCoil({ seed: 41 });
    const last = coil.sessions[coil.sessions.length - 1]!;
    last.thermalHeadroom = 0.06;
    const health = assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay) });
    expect(health.status).toBe("hold");
    // The default threshold is the one table the default lending policy starts from (margin.ts): 20 %.
    expect(health.reasons[0]).toBe(
      `Latest thermal headroom is 6 %, below the 20 % limit (session of ${last.startedAt.toISOString().slice(0, 10)}).`,
    );
  });

  it("names the offending row and field", () => {
    const coil = simulateCoil({ seed: 1, sessions: 5 });
    const now = addDays(START, coil.lastDay);
    const bad = coil.sessions.map((s, i) => (i === 2 ? { ...s, supplyVoltageV: -5 } : s));
    expect(() => assessCoilHealth({ ...coil, sessions: bad, now })).toThrow(/sessions\[2\]\.supplyVoltageV/);
    const badDate = coil.sessions.map((s, i) => (i === 1 ? { ...s, startedAt: new Date("nonsense") } : s));
    expect(() => assessCoilHealth({ ...coil, sessions: badDate, now })).toThrowError(CalcInputError);
    expect(() => assessCoilHealth({ ...coil, now, thresholds: { thermalHeadroom: 1.5 } })).toThrow(/thresholds\.thermalHeadroom/);
    expect(() => assessCoilHealth({ ...coil, now, baseline: { sessionCount: 0 } })).toThrow(/baseline\.sessionCount/);
    const headroomOver1 = coil.sessions.map((s, i) => (i === 0 ? { ...s, voltageHeadroom: 1.2 } : s));
    expect(() => assessCoilHealth({ ...coil, sessions: headroomOver1, now })).toThrow(/sessions\[0\]\.voltageHeadroom/);
  });

  it("names each session field whose value fails, with what was expected, and accepts the edge of each range", () => {
    const coil = simulateCoil({ seed: 1, sessions: 5 });
    const now = addDays(START, coil.lastDay);
    const withSession3 = (change: Partial<CoilSession>) => ({ ...coil, now, sessions: coil.sessions.map((s, i) => (i === 3 ? { ...s, ...change } : s)) });
    const refusals: [Partial<CoilSession>, string][] = [
      [{ startedAt: new Date(Number.NaN) }, "sessions[3].startedAt: expected a valid date"],
      [{ supplyVoltageV: 0 }, "sessions[3].supplyVoltageV: expected a finite number greater than 0, got 0"],
      [{ supplyCurrentA: -0.1 }, "sessions[3].supplyCurrentA: expected a finite number ≥ 0, got -0.1"],
      [{ durationS: Number.POSITIVE_INFINITY }, "sessions[3].durationS: expected a finite number ≥ 0, got Infinity"],
      [{ runningFrequencyHz: Number.NaN }, "sessions[3].runningFrequencyHz: expected a finite number greater than 0, got NaN"],
      [{ currentHeadroom: Number.NEGATIVE_INFINITY }, "sessions[3].currentHeadroom: expected a finite number, got -Infinity"],
      [{ thermalHeadroom: 1.0000001 }, "sessions[3].thermalHeadroom: expected a headroom fraction ≤ 1 (1 − stressed/limit), got 1.0000001"],
      [{ heatSinkRiseK: Number.NaN }, "sessions[3].heatSinkRiseK: expected a finite number, got NaN"],
    ];
    for (const [change, message] of refusals) expect(() => assessCoilHealth(withSession3(change)), message).toThrow(message);
    // the edges each check lets through: no current, a zero-length run, a headroom of exactly 1, a negative rise, absent readings
    const edges = withSession3({ supplyCurrentA: 0, durationS: 0, voltageHeadroom: 1, heatSinkRiseK: -2, runningFrequencyHz: null, thermalHeadroom: undefined });
    expect(assessCoilHealth(edges).sessionCount).toBe(5);
  });

  it("accepts sessions in any order and missing readings", () => {
    const coil = simulateCoil({ seed: 51 });
    const shuffled = [...coil.sessions].reverse().map((s, i) => (i % 4 === 0 ? { ...s, thermalHeadroom: null } : s));
    const a = assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay) });
    const b = assessCoilHealth({ ...coil, sessions: shuffled, now: addDays(START, coil.lastDay) });
    expect(b.margins.voltage.trend!.fit.slope).toBe(a.margins.voltage.trend!.fit.slope);
    expect(b.margins.thermal.observations).toBeLessThan(a.margins.thermal.observations);
  });
});

describe("assessCoilHealth: open failures", () => {
  it("holds an otherwise fine coil while a failure is open, naming the failure first", () => {
    const coil = simulateCoil({ seed: 11 });
    const now = addDays(START, coil.lastDay);
    expect(assessCoilHealth({ ...coil, now }).status).toBe("fine");
    const held = assessCoilHealth({ ...coil, now, openFailures: [{ occurredAt: addDays(START, coil.lastDay - 2), mode: "over_voltage" }] });
    expect(held.status).toBe("hold");
    expect(held.reasons[0]).toMatch(/^A failure \(over voltage\) recorded on \d{4}-\d{2}-\d{2} is still open: the coil is on hold until its post-mortem is complete\.$/);
  });

  it("holds a coil with too few sessions to judge, rather than saying 'not enough data'", () => {
    const coil = simulateCoil({ seed: 3, sessions: 4 });
    const health = assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay), openFailures: [{ occurredAt: START, mode: "unknown" }] });
    expect(health.status).toBe("hold");
    expect(health.reasons[0]).toContain("(mode not yet known)");
  });

  it("names the failure whose date cannot be read", () => {
    const coil = simulateCoil({ seed: 3 });
    expect(() => assessCoilHealth({ ...coil, now: addDays(START, coil.lastDay), openFailures: [{ occurredAt: new Date(Number.NaN), mode: "over_current" }] })).toThrow(
      /openFailures\[0\]\.occurredAt/,
    );
  });
});

describe("assessCoilHealth: the order of reasons", () => {
  it("puts the projection that reaches its limit soonest first among findings of one severity", () => {
    // Voltage headroom falling slowly, thermal quickly: both on watch; thermal reaches its limit first.
    const coil = simulateCoil({ seed: 21, voltageHeadroom: [0.6, -0.0012] });
    const now = addDays(START, coil.lastDay);
    const sessions = coil.sessions.map((s, i) => ({ ...s, thermalHeadroom: 0.7 - i * 0.012 }));
    const health = assessCoilHealth({ ...coil, sessions, now });
    const projections = health.findings.filter((f) => f.daysAway !== undefined);
    expect(projections.map((f) => f.subject)).toEqual(["thermal headroom", "voltage headroom"]);
    expect(projections[0]!.daysAway!).toBeLessThan(projections[1]!.daysAway!);
    expect(health.reasons[0]).toMatch(/^Thermal headroom is falling/);
  });
});

/** What a call returned or threw (the error's message), so two assessments can be compared whole. */
function outcome<T>(call: () => T): { value: T } | { error: string } {
  try {
    return { value: call() };
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    return { error: error.message };
  }
}

type Quirk = "none" | "sessions at one instant" | "no heat-sink rise at first" | "no heat-sink rise at all" | "far-off frequency baseline" | "open failure" | "tiny time steps" | "minute steady fall";

/**
 * Generated logbooks for the verdict: drifts of every kind and size (steady, slow, fast, rising and falling), a variac
 * now and then, and the quirks that make a trend's input checks refuse the logbook (sessions at one instant, a
 * heat-sink rise of zero as the baseline) or that flag a level (an explicit baseline far from what was logged).
 */
const verdictInputArbitrary = fc
  .record({
    seed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
    sessions: fc.integer({ min: 0, max: 70 }),
    voltageStart: fc.double({ min: 0.15, max: 0.7, noNaN: true }),
    voltagePerDay: fc.oneof(fc.constant(0), fc.double({ min: -0.004, max: 0.001, noNaN: true })),
    currentDriftPerDay: fc.oneof(fc.constant(0), fc.double({ min: -0.001, max: 0.003, noNaN: true })),
    heatDriftPerDay: fc.oneof(fc.constant(0), fc.double({ min: -0.001, max: 0.01, noNaN: true })),
    frequencyDriftPerDay: fc.oneof(fc.constant(0), fc.double({ min: -3e-4, max: 3e-4, noNaN: true })),
    variac: fc.boolean(),
    nowAfterLast: fc.integer({ min: 0, max: 400 }),
    quirk: fc.constantFrom<Quirk>("none", "none", "none", "sessions at one instant", "no heat-sink rise at first", "no heat-sink rise at all", "far-off frequency baseline", "open failure", "tiny time steps", "minute steady fall"),
  })
  .map((o): CoilHealthInput => {
    const coil = simulateCoil({
      seed: o.seed,
      sessions: o.sessions,
      voltageHeadroom: [o.voltageStart, o.voltagePerDay],
      currentDriftPerDay: o.currentDriftPerDay,
      supplyVoltageV: o.variac ? (_, u) => (u() < 0.3 ? 120 : 170) : undefined,
      heatPerWattKPerW: (day) => 0.05 * (1 + o.heatDriftPerDay * day),
      runningFrequencyHz: (day) => 250e3 * (1 + o.frequencyDriftPerDay * day),
      resonanceHz: (day) => 248e3 * (1 + o.frequencyDriftPerDay * day),
    });
    let sessions = coil.sessions;
    if (o.quirk === "sessions at one instant") sessions = sessions.map((s) => ({ ...s, startedAt: START }));
    if (o.quirk === "tiny time steps") sessions = sessions.map((s, i) => ({ ...s, startedAt: new Date(START.getTime() + i) }));
    if (o.quirk === "no heat-sink rise at first") sessions = sessions.map((s, i) => (i < 3 ? { ...s, heatSinkRiseK: 0 } : s));
    if (o.quirk === "no heat-sink rise at all") sessions = sessions.map((s) => ({ ...s, heatSinkRiseK: 0 }));
    // significant, and meeting its limit far past the projection horizon (margin-drift.ts)
    if (o.quirk === "minute steady fall") sessions = sessions.map((s, i) => ({ ...s, voltageHeadroom: 0.5 - 1e-9 * i }));
    return {
      sessions,
      sweeps: coil.sweeps,
      now: addDays(START, coil.lastDay + o.nowAfterLast),
      baseline: o.quirk === "far-off frequency baseline" ? { runningFrequencyHz: 240e3 } : undefined,
      openFailures: o.quirk === "open failure" ? [{ occurredAt: START, mode: "over_voltage" }] : [],
    };
  });

describe("assessCoilVerdict (trends fitted only where they can raise a finding)", () => {
  it("gives the full assessment's verdict, or refuses the same logbooks with the same words (property)", () => {
    const seen = { refused: 0, falling: 0, notFalling: 0, flagged: 0, statuses: new Set<string>() };
    fc.assert(
      fc.property(verdictInputArbitrary, (input) => {
        const full = outcome(() => assessCoilHealth(input));
        const verdict = outcome(() => assessCoilVerdict(input));
        if ("error" in full) {
          seen.refused++;
          expect(verdict).toEqual(full);
          return;
        }
        expect(verdict).toStrictEqual({ value: toCoilVerdict(full.value) });
        seen.statuses.add(full.value.status);
        const margins = Object.values(full.value.margins);
        if (margins.some((m) => m.falling)) seen.falling++;
        if (margins.some((m) => m.trend !== null && !m.trend.significant)) seen.notFalling++;
        const levels = [full.value.supplyCurrent, full.value.runningFrequency, full.value.firstSeriesResonance, full.value.heatSinkRisePerWatt];
        if (levels.some((l) => l.flagged)) seen.flagged++;
      }),
      { numRuns: 400, seed: 20261204 },
    );
    // Every kind of answer was reached, so the property did not hold on one kind alone.
    expect([...seen.statuses].sort()).toEqual(["fine", "hold", "not enough data", "watch"]);
    expect(seen.refused).toBeGreaterThan(10);
    expect(seen.falling).toBeGreaterThan(10);
    expect(seen.notFalling).toBeGreaterThan(10);
    expect(seen.flagged).toBeGreaterThan(10);
  });
});
