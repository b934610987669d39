import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { sessionHeadrooms, type SessionHeadrooms } from "./session-headrooms";
import { sessionMargins, type SessionForMargins, type SessionMarginOptions, type SwitchRatings, type ThermalPath } from "./session-margins";
import type { SinkProjection } from "./thermal-margin";
import type { DriverTopology } from "./driver-topology";

/** A recorded number: mostly plausible, sometimes absent, now and then out of range (to reach every check). */
const recorded = (min: number, max: number) =>
  fc.oneof(
    { weight: 6, arbitrary: fc.double({ min, max, noNaN: true }) },
    { weight: 2, arbitrary: fc.constantFrom(null, undefined) },
    { weight: 1, arbitrary: fc.constantFrom(0, -1, Number.NaN, Number.POSITIVE_INFINITY, min, max) },
  );
const always = (min: number, max: number) =>
  fc.oneof({ weight: 12, arbitrary: fc.double({ min, max, noNaN: true }) }, { weight: 1, arbitrary: fc.constantFrom(0, -5, Number.NaN, Number.POSITIVE_INFINITY) });

const topology = fc.oneof(
  { weight: 20, arbitrary: fc.constantFrom<DriverTopology>("single_switch", "push_pull", "half_bridge", "full_bridge") },
  { weight: 1, arbitrary: fc.constant("flyback" as DriverTopology) },
);

const projection: fc.Arbitrary<SinkProjection | null | undefined> = fc.oneof(
  { weight: 2, arbitrary: fc.constantFrom(null, undefined) },
  { weight: 4, arbitrary: fc.record({ basis: fc.constantFrom("fit-upper-bound" as const, "worst-case" as const), sinkC: always(-20, 250), source: fc.constant("generated") }) },
);

const session: fc.Arbitrary<SessionForMargins> = fc.record({
  topology,
  voltageClamp: fc.boolean(),
  voltageClampV: recorded(10, 600),
  supplyVoltageV: always(5, 400),
  supplyCurrentA: always(0, 30),
  ambientTempC: always(-10, 45),
  heatSinkEndC: recorded(-10, 160),
  sinkSteadyStateC: recorded(-10, 160),
  sinkProjection: projection,
  peakSwitchVoltageV: recorded(5, 1500),
  dutyCycle: recorded(0.01, 1),
  dissipationW: recorded(0, 400),
});

const ratings: fc.Arbitrary<SwitchRatings> = fc.record(
  {
    voltageRatingV: recorded(50, 1700),
    continuousCurrentA: recorded(1, 120),
    peakCurrentA: recorded(5, 500),
    powerRating25CW: recorded(10, 600),
    maxJunctionTempC: recorded(20, 200),
    thermalResistanceJcKPerW: recorded(0.05, 3),
    caseToSinkKPerW: recorded(0, 2),
  },
  { requiredKeys: [] },
);

const path: fc.Arbitrary<ThermalPath> = fc.record(
  {
    sinkThermalResistanceKPerW: recorded(0.05, 5),
    sinkThermalResistanceEstimate: fc.constantFrom(null, "a fan's factor"),
    caseToSinkKPerW: recorded(0, 2),
    switchesOnSink: fc.oneof({ weight: 10, arbitrary: fc.integer({ min: 1, max: 4 }) }, { weight: 1, arbitrary: fc.constantFrom(0, 1.5) }),
  },
  { requiredKeys: [] },
);

const options: fc.Arbitrary<SessionMarginOptions> = fc.record(
  {
    thresholds: fc.record({ voltage: always(0, 0.9), current: always(0, 0.9), thermal: always(0, 0.9) }, { requiredKeys: [] }),
  },
  { requiredKeys: [] },
);

type Outcome = { threw: true } | { threw: false; headrooms: SessionHeadrooms };

function outcomeOf(run: () => SessionHeadrooms): Outcome {
  try {
    return { threw: false, headrooms: run() };
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    return { threw: true };
  }
}

describe("sessionHeadrooms", () => {
  it("gives sessionMargins' three headrooms double for double, and throws a CalcInputError exactly where it does (property)", () => {
    // What the generated cases reached, so the property cannot pass on one kind of case alone.
    const seen = { threw: 0, unknown: 0, fullyUsed: 0, computed: 0 };
    fc.assert(
      fc.property(session, ratings, path, options, (s, r, p, o) => {
        const full = outcomeOf(() => {
          const m = sessionMargins(s, r, p, o);
          return { voltage: m.voltage.headroom, current: m.current.headroom, thermal: m.thermal.headroom };
        });
        const fast = outcomeOf(() => sessionHeadrooms(s, r, p, o));
        expect(fast.threw).toBe(full.threw);
        if (full.threw || fast.threw) {
          seen.threw++;
          return;
        }
        for (const kind of ["voltage", "current", "thermal"] as const) {
          // Object.is: the same double, sign of zero included.
          expect(Object.is(fast.headrooms[kind], full.headrooms[kind]), `${kind}: ${fast.headrooms[kind]} against ${full.headrooms[kind]}`).toBe(true);
          const h = full.headrooms[kind];
          if (h === null) seen.unknown++;
          else if (h === -1) seen.fullyUsed++;
          else seen.computed++;
        }
      }),
      { numRuns: 3000 },
    );
    expect(seen.threw).toBeGreaterThan(100);
    expect(seen.unknown).toBeGreaterThan(100);
    expect(seen.fullyUsed).toBeGreaterThan(0);
    expect(seen.computed).toBeGreaterThan(1000);
  });

  it("reads only the projected temperature of a projection, not its basis or words", () => {
    // Thermal chain (docs/references.md): P = (85 − 25)/1.5 = 40 W; T_j = 85 + 40·(0.45 + 0.5) = 123 °C;
    // junction rise 98 K of the 125 K allowed: headroom 1 − 98/125 = 0.216; derated power 280·(150 − 105)/125 = 100.8 W
    // at T_case = 85 + 40·0.5 = 105 °C, so P/P_derated = 0.397 is the looser of the two.
    const base = { topology: "half_bridge" as const, supplyVoltageV: 48, supplyCurrentA: 2, ambientTempC: 25, heatSinkEndC: 60 };
    const device = { powerRating25CW: 280, maxJunctionTempC: 150, thermalResistanceJcKPerW: 0.45, caseToSinkKPerW: 0.5 };
    const thermal = (sinkProjection: SinkProjection) => sessionHeadrooms({ ...base, sinkProjection }, device, { sinkThermalResistanceKPerW: 1.5 }).thermal;
    expect(thermal({ basis: "worst-case", sinkC: 85, source: "one" })).toBeCloseTo(1 - 98 / 125, 12);
    expect(thermal({ basis: "fit-upper-bound", sinkC: 85, source: "another" })).toBe(thermal({ basis: "worst-case", sinkC: 85, source: "one" }));
  });
});
