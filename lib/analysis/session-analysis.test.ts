import { describe, expect, it } from "vitest";
import { DEFAULT_CLEARANCE_POLICY } from "../calc/clearance-policy";
import { THERMAL_INPUT_NAMES } from "../calc/thermal-margin";
import { analyzeRunSession } from "./session-analysis";
import { fitSessionSamples } from "./session-fit";
import type { CoilRecord, ComponentRecord, SessionRecord } from "./records";

const at = new Date(Date.UTC(2026, 0, 10, 12));
const coil: CoilRecord = { topology: "single_switch", formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002, environmentCapacitanceF: null, measuredInductanceH: null };
const fitted = { installedAt: new Date(Date.UTC(2026, 0, 1)), removedAt: null };
// An MJE13009-like BJT's ratings (test data, not a datasheet check) on a 1.5 K/W sink.
const sw: ComponentRecord = { id: "sw", kind: "switch", partNumber: "Q1", ...fitted, powerRating25CW: 100, maxJunctionTempC: 150, thermalResistanceJcKPerW: 1.25, caseToSinkKPerW: 0.5, voltageRatingV: 400 };
const sink: ComponentRecord = { id: "hs", kind: "heat_sink", partNumber: "HS", ...fitted, sinkThermalResistanceKPerW: 1.5 };
const session: SessionRecord = {
  id: "s1", startedAt: at, supplyVoltageV: 24, supplyCurrentA: 2, durationS: 600, ambientTempC: 22, heatSinkStartC: 22, heatSinkEndC: 35,
  runningFrequencyHz: 300_000, peakSwitchVoltageV: 100, dutyCycle: 0.5, outcome: "normal", topLoadId: null,
};
/** 22 °C + 13 K·(1 − e^(−t/120 s)), every 30 s for 10 min: an exact first-order warm-up (docs/references.md). */
const settled = Array.from({ length: 21 }, (_, i) => ({ elapsedS: 30 * i, temperatureC: 22 + 13 * (1 - Math.exp((-30 * i) / 120)) }));
const policy = DEFAULT_CLEARANCE_POLICY;
const input = (m: { inputs: { name: string; value: number; estimated: boolean; source: string }[] }, name: string) => m.inputs.find((i) => i.name === name);

describe("analyzeRunSession", () => {
  it("judges a run with too few samples at the marked worst case, never a silent ok", () => {
    const a = analyzeRunSession(coil, session, [sw, sink], [settled[0]!, settled[20]!], { policy });
    expect(a.warmUp).toBeNull();
    expect(a.warmUpNote).toMatch(/Only 2 heat-sink samples/);
    expect(a.sinkProjection?.basis).toBe("worst-case");
    // Derived bound: 24 V · 2 A = 48 W into 1.5 K/W from 22 °C: 94 °C; T_j = 94 + 48·1.75 = 178 °C > 150 °C.
    expect(input(a.margins.thermal, THERMAL_INPUT_NAMES.junctionTemp)?.value).toBeCloseTo(178, 9);
    expect(a.margins.thermal.status).toBe("exceeded");
  });

  it("uses the stored fit when the row has one, and agrees with fitting the samples", () => {
    const fromSamples = analyzeRunSession(coil, session, [sw, sink], settled, { policy });
    const fromStored = analyzeRunSession(coil, { ...session, ...fitSessionSamples(settled) }, [sw, sink], null, { policy });
    expect(fromStored.margins).toEqual(fromSamples.margins);
    expect(fromStored.sinkProjection?.basis).toBe("fit-upper-bound");
    expect(fromStored.warmUp?.longestRunLowerBoundS).not.toBeNull();
  });

  it("takes a fan's recorded with-fan Rθsa, else half the sink's rating flagged as an estimate", () => {
    const fan: ComponentRecord = { id: "fan", kind: "fan", partNumber: "F1", ...fitted, sinkThermalResistanceKPerW: 0.6 };
    const recorded = analyzeRunSession(coil, session, [sw, sink, fan], settled, { policy });
    expect(input(recorded.margins.thermal, "Rθsa")).toMatchObject({ value: 0.6, estimated: false });
    const guessed = analyzeRunSession(coil, session, [sw, sink, { ...fan, sinkThermalResistanceKPerW: null }], settled, { policy });
    // common practice factor 0.5 (lib/calc/fan-cooling.ts): 0.75 K/W, so the same rise means twice the power.
    expect(input(guessed.margins.thermal, "Rθsa")).toMatchObject({ value: 0.75, estimated: true });
    const without = analyzeRunSession(coil, session, [sw, sink], settled, { policy });
    expect(input(guessed.margins.thermal, "P")!.value).toBeCloseTo(2 * input(without.margins.thermal, "P")!.value, 9);
  });

  it("judges every status by the policy's thresholds", () => {
    const strict = analyzeRunSession(coil, session, [sw, sink], settled, { policy: { ...policy, minThermalHeadroom: 0.99 } });
    const loose = analyzeRunSession(coil, session, [sw, sink], settled, { policy });
    expect(strict.margins.thermal.headroom).toBe(loose.margins.thermal.headroom);
    expect(loose.margins.thermal.status).toBe("ok");
    expect(strict.margins.thermal.status).toBe("thin");
  });
});
