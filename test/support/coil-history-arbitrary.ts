/**
 * Generated coil logbooks as the health path reads them (the dashboard's health window: coil, every part ever fitted,
 * sessions with their stored warm-up fits, sweeps, open failures), for property tests that compare two ways of judging
 * the same logbook. Mostly plausible rigs and runs whose headrooms drift, so trends, projections and level shifts are
 * reached; now and then a part or a session the margins cannot honestly compute with, so the "could not be assessed"
 * path is reached too.
 */
import fc from "fast-check";
import type { Coil, Component, Failure } from "@/lib/db/generated/client";
import type { CoilHealthHistory } from "@/lib/db/coil-history";
import type { ClearancePolicyRules } from "@/lib/calc/clearance-policy";
import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import type { DriverTopology } from "@/lib/calc/driver-topology";

const DAY = 86_400_000;
const START = Date.UTC(2025, 0, 6, 18);

/** Mostly in range; sometimes absent; rarely a value no margin can use. */
const rating = (min: number, max: number, { absent = 2, bad = 1 } = {}) =>
  fc.oneof(
    { weight: 12, arbitrary: fc.double({ min, max, noNaN: true }) },
    { weight: absent, arbitrary: fc.constant(null) },
    { weight: bad, arbitrary: fc.constantFrom(0, -3) },
  );

const kinds = ["switch", "heat_sink", "clamp", "fan"] as const;

const component = fc.record({
  kind: fc.constantFrom(...kinds),
  installedDay: fc.integer({ min: -30, max: 120 }),
  removedAfterDays: fc.option(fc.integer({ min: 1, max: 200 }), { nil: null }),
  voltageRatingV: rating(100, 1200),
  continuousCurrentA: rating(5, 80),
  peakCurrentA: rating(20, 300),
  powerRating25CW: rating(50, 400),
  maxJunctionTempC: fc.oneof({ weight: 10, arbitrary: fc.double({ min: 120, max: 200, noNaN: true }) }, { weight: 2, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: fc.constant(20) }),
  thermalResistanceJcKPerW: rating(0.1, 1.5),
  caseToSinkKPerW: rating(0.1, 1, { bad: 0 }),
  sinkThermalResistanceKPerW: rating(0.3, 3),
  clampVoltageV: rating(40, 400),
});

/** A stored warm-up fit as RunSession keeps it (session-fit.ts): none yet, too few samples, an error, or a curve. */
const storedFit = fc.oneof(
  { weight: 2, arbitrary: fc.constant({ sinkFitSampleCount: null, sinkFitJson: null }) },
  { weight: 1, arbitrary: fc.integer({ min: 0, max: 2 }).map((n) => ({ sinkFitSampleCount: n, sinkFitJson: null })) },
  { weight: 1, arbitrary: fc.constant({ sinkFitSampleCount: 12, sinkFitJson: JSON.stringify({ error: "the samples do not rise" }) }) },
  {
    weight: 6,
    arbitrary: fc
      .record({
        rise: fc.double({ min: 5, max: 90, noNaN: true }),
        steadyStateSe: fc.option(fc.double({ min: 0.1, max: 15, noNaN: true }), { nil: null }),
        timeConstant: fc.double({ min: 60, max: 2000, noNaN: true }),
        extrapolation: fc.constantFrom("reliable", "uncertain", "too-short"),
      })
      .map(({ rise, steadyStateSe, timeConstant, extrapolation }) => ({
        sinkFitSampleCount: 40,
        sinkFitJson: JSON.stringify({
          ambient: 22,
          rise,
          timeConstant,
          steadyState: 22 + rise,
          rSquared: 0.99,
          residualStd: 0.3,
          standardErrors: { ambient: 0.2, rise: steadyStateSe, timeConstant: 30, steadyState: steadyStateSe },
          duration: 900,
          extrapolation,
          explanation: "generated",
        }),
      })),
  },
);

const session = fc.record({
  gapHours: fc.oneof({ weight: 8, arbitrary: fc.double({ min: 0.5, max: 96, noNaN: true }) }, { weight: 1, arbitrary: fc.constant(0) }),
  supplyVoltageV: fc.oneof({ weight: 8, arbitrary: fc.constantFrom(24, 48, 120) }, { weight: 1, arbitrary: fc.double({ min: 10, max: 170, noNaN: true }) }),
  supplyCurrentA: fc.double({ min: 0.2, max: 6, noNaN: true }),
  durationS: fc.constantFrom(300, 600, 610, 1800),
  ambientTempC: fc.double({ min: 15, max: 30, noNaN: true }),
  heatSinkRiseK: fc.option(fc.double({ min: -2, max: 70, noNaN: true }), { nil: null }),
  runningFrequencyHz: fc.option(fc.double({ min: 280_000, max: 320_000, noNaN: true }), { nil: null }),
  peakNoise: fc.option(fc.double({ min: -20, max: 20, noNaN: true }), { nil: null }),
  dutyCycle: fc.option(fc.constantFrom(0.2, 0.35, 0.5), { nil: null }),
  topLoadId: fc.constantFrom("tl-a", "tl-b", null),
  fit: storedFit,
});

/**
 * A well-kept rig for half the logbooks: a switch and a heat sink fitted before the first session, every rating in range,
 * one supply voltage and a steady current, running frequency and heat-sink rise (a few per cent of noise). Without it nearly every
 * logbook had a part no margin can use or a level that wandered by tens of per cent, so "fine" and a falling margin's
 * projection were never reached.
 */
const wellKeptRig = fc.record({
  voltageRatingV: fc.double({ min: 150, max: 1200, noNaN: true }),
  continuousCurrentA: fc.double({ min: 20, max: 80, noNaN: true }),
  peakCurrentA: fc.double({ min: 60, max: 300, noNaN: true }),
  powerRating25CW: fc.double({ min: 100, max: 400, noNaN: true }),
  maxJunctionTempC: fc.double({ min: 150, max: 200, noNaN: true }),
  thermalResistanceJcKPerW: fc.double({ min: 0.1, max: 0.8, noNaN: true }),
  caseToSinkKPerW: fc.double({ min: 0.1, max: 0.5, noNaN: true }),
  sinkThermalResistanceKPerW: fc.double({ min: 0.2, max: 1.5, noNaN: true }),
  supplyVoltageV: fc.constantFrom(24, 48, 120),
  currentA: fc.double({ min: 0.5, max: 4, noNaN: true }),
  runningFrequencyHz: fc.double({ min: 280_000, max: 320_000, noNaN: true }),
});

export interface GeneratedJudgement {
  history: CoilHealthHistory;
  policy: ClearancePolicyRules;
  now: Date;
}

/** A coil's health window history with the policy and the clock it is judged under. */
export const coilHistoryArbitrary: fc.Arbitrary<GeneratedJudgement> = fc
  .record({
    topology: fc.constantFrom<DriverTopology>("single_switch", "push_pull", "half_bridge", "full_bridge"),
    components: fc.array(component, { maxLength: 6 }),
    sessions: fc.array(session, { maxLength: 80, size: "max" }),
    // The peak voltage creeps up by this many volts a session, so the voltage headroom drifts down.
    peakCreep: fc.double({ min: -0.5, max: 3, noNaN: true }),
    sweeps: fc.array(fc.record({ day: fc.integer({ min: 0, max: 150 }), topLoadId: fc.constantFrom("tl-a", "tl-b", null), hz: fc.option(fc.double({ min: 250_000, max: 330_000, noNaN: true }), { nil: null }) }), { maxLength: 8 }),
    // An open failure holds the coil whatever else it shows, so it comes in one logbook of five.
    openFailure: fc.oneof(
      { weight: 4, arbitrary: fc.constant(null) },
      { weight: 1, arbitrary: fc.record({ day: fc.integer({ min: 0, max: 150 }), mode: fc.constantFrom("over_voltage", "unknown", "thermal") }) },
    ),
    daysAfterLast: fc.double({ min: 0, max: 120, noNaN: true }),
    thresholds: fc.record({ v: fc.constantFrom(0.2, 0.1, 0.3), c: fc.constantFrom(0.2, 0.15), t: fc.constantFrom(0.2, 0.25) }),
    wellKept: fc.oneof(fc.constant(null), wellKeptRig),
  })
  .map((g) => {
    const coil = { id: "coil-gen", topology: g.topology, formDiameterM: 0.1, windingLengthM: 0.4, turns: 1000, wireDiameterM: 0.0003, environmentCapacitanceF: null, measuredInductanceH: null } as unknown as Coil;
    const components = g.components
      .map((c, i) => {
        const installedAt = new Date(START + c.installedDay * DAY);
        return {
          id: `part-${String(i).padStart(2, "0")}`,
          coilId: coil.id,
          kind: c.kind,
          partNumber: `P${i}`,
          installedAt,
          removedAt: c.removedAfterDays === null ? null : new Date(installedAt.getTime() + c.removedAfterDays * DAY),
          voltageRatingV: c.voltageRatingV,
          continuousCurrentA: c.continuousCurrentA,
          peakCurrentA: c.peakCurrentA,
          powerRating25CW: c.powerRating25CW,
          maxJunctionTempC: c.maxJunctionTempC,
          thermalResistanceJcKPerW: c.thermalResistanceJcKPerW,
          caseToSinkKPerW: c.caseToSinkKPerW,
          sinkThermalResistanceKPerW: c.kind === "fan" && c.sinkThermalResistanceKPerW !== null && c.sinkThermalResistanceKPerW > 1 ? null : c.sinkThermalResistanceKPerW,
          clampVoltageV: c.clampVoltageV,
        } as unknown as Component;
      })
      .sort((a, b) => a.installedAt.getTime() - b.installedAt.getTime() || (a.id < b.id ? -1 : 1));
    const rig = g.wellKept;
    if (rig) {
      const { supplyVoltageV: _v, currentA: _a, runningFrequencyHz: _f, ...ratings } = rig;
      const fitted = { coilId: coil.id, installedAt: new Date(START - 30 * DAY), removedAt: null, clampVoltageV: null };
      const none = { voltageRatingV: null, continuousCurrentA: null, peakCurrentA: null, powerRating25CW: null, maxJunctionTempC: null, thermalResistanceJcKPerW: null, caseToSinkKPerW: null, sinkThermalResistanceKPerW: null };
      components.splice(0, components.length, { ...none, ...ratings, ...fitted, id: "part-switch", kind: "switch", partNumber: "SW", sinkThermalResistanceKPerW: null } as unknown as Component, {
        ...none,
        ...fitted,
        id: "part-sink",
        kind: "heat_sink",
        partNumber: "HS",
        sinkThermalResistanceKPerW: ratings.sinkThermalResistanceKPerW,
      } as unknown as Component);
    }
    // A session's own draws, turned into a few per cent of noise around the well-kept rig's steady levels.
    const wobble = (value: number, min: number, max: number, fraction: number) => 1 + fraction * ((2 * (value - min)) / (max - min) - 1);
    let at = START;
    const sessions = g.sessions.map((s, i) => {
      at += s.gapHours * 3_600_000;
      return {
        id: `s-${String(i).padStart(3, "0")}`,
        coilId: coil.id,
        startedAt: new Date(at),
        supplyVoltageV: rig ? rig.supplyVoltageV : s.supplyVoltageV,
        supplyCurrentA: rig ? rig.currentA * wobble(s.supplyCurrentA, 0.2, 6, 0.03) : s.supplyCurrentA,
        durationS: s.durationS,
        ambientTempC: s.ambientTempC,
        heatSinkStartC: s.ambientTempC,
        heatSinkEndC: s.heatSinkRiseK === null ? null : s.ambientTempC + (rig ? 12 * wobble(s.heatSinkRiseK, -2, 70, 0.05) : s.heatSinkRiseK),
        runningFrequencyHz: rig && s.runningFrequencyHz !== null ? rig.runningFrequencyHz * wobble(s.runningFrequencyHz, 280_000, 320_000, 0.005) : s.runningFrequencyHz,
        peakSwitchVoltageV:
          s.peakNoise === null ? null : rig ? rig.supplyVoltageV * 2 + g.peakCreep * i + s.peakNoise / 10 : Math.max(1, s.supplyVoltageV * 2 + g.peakCreep * i + s.peakNoise),
        dutyCycle: s.dutyCycle,
        outcome: "normal" as const,
        topLoadId: s.topLoadId,
        ...s.fit,
      };
    });
    const sweeps = g.sweeps
      .map((w, i) => ({ id: `w-${i}`, coilId: coil.id, takenAt: new Date(START + w.day * DAY), topLoadId: w.topLoadId, firstSeriesResonanceHz: w.hz }))
      .sort((a, b) => a.takenAt.getTime() - b.takenAt.getTime() || (a.id < b.id ? -1 : 1));
    const openFailures = g.openFailure ? [{ coilId: coil.id, occurredAt: new Date(START + g.openFailure.day * DAY), mode: g.openFailure.mode as Failure["mode"] }] : [];
    const totals = { sessionCount: sessions.length, totalDurationS: sessions.reduce((sum, s) => sum + s.durationS, 0), lastSessionAt: sessions.at(-1)?.startedAt ?? null };
    const history = { coil, components, sessions, sweeps, topLoads: [], openFailures, totals } as unknown as CoilHealthHistory;
    const policy = { ...DEFAULT_CLEARANCE_POLICY, minVoltageHeadroom: g.thresholds.v, minCurrentHeadroom: g.thresholds.c, minThermalHeadroom: g.thresholds.t };
    return { history, policy, now: new Date(at + g.daysAfterLast * DAY) };
  });
