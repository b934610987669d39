import { describe, expect, it } from "vitest";
import {
  TYPICAL_SWITCH_LOSS_PARAMETERS,
  crossCheckSinkPower,
  estimateSwitchLosses,
  mosfetConductionLoss,
  saturatedConductionLoss,
  switchingLoss,
} from "./switch-losses";

/** ∫ v·i dt over [0, t_end] by the midpoint rule on a fine grid. */
function energy(power: (t: number) => number, tEnd: number, steps = 100_000): number {
  let sum = 0;
  for (let k = 0; k < steps; k++) sum += power(((k + 0.5) / steps) * tEnd);
  return (sum * tEnd) / steps;
}

describe("switchingLoss", () => {
  it("matches the exact crossover integrals of an inductive, clamped switching edge", () => {
    // exact integral of the linearised crossovers (Mohan, Undeland & Robbins, Power Electronics, ch. 2 — from memory):
    // turn-on: i rises 0 → I at v = V, then v falls V → 0 at i = I; turn-off the reverse. Each part gives V·I·t/2.
    const [v, i, tr, tf, f] = [48, 6, 80e-9, 120e-9, 250e3];
    const [tri, tfv] = [0.3 * tr, 0.7 * tr]; // any split of the crossover time gives the same energy
    const onEnergy = energy((t) => (t < tri ? v * ((i * t) / tri) : i * v * (1 - (t - tri) / tfv)), tr);
    const [trv, tfi] = [0.6 * tf, 0.4 * tf];
    const offEnergy = energy((t) => (t < trv ? i * ((v * t) / trv) : v * i * (1 - (t - trv) / tfi)), tf);
    const p = switchingLoss({ switchingVoltageV: v, turnOnCurrentA: i, turnOffCurrentA: i, riseTimeS: tr, fallTimeS: tf, frequencyHz: f });
    expect(p).toBeCloseTo((onEnergy + offEnergy) * f, 6);
    expect(p).toBeCloseTo(0.5 * v * i * (tr + tf) * f, 12);
  });

  it("charges a single switch's ramp only at turn-off when it turns on at zero current", () => {
    const p = switchingLoss({ switchingVoltageV: 24, turnOnCurrentA: 0, turnOffCurrentA: 10, riseTimeS: 50e-9, fallTimeS: 50e-9, frequencyHz: 300e3 });
    expect(p).toBeCloseTo(0.5 * 24 * 10 * 50e-9 * 300e3, 12); // derived: ½·V·I_off·t_f·f = 1.8 W
    expect(() => switchingLoss({ switchingVoltageV: 24, turnOnCurrentA: 0, turnOffCurrentA: 1, riseTimeS: 3e-6, fallTimeS: 3e-6, frequencyHz: 200e3 })).toThrow(/^frequencyHz/);
  });
});

describe("conduction losses", () => {
  it("matches the exact integrals of i²R and V·i over a ramp", () => {
    // exact integrals over one period of a 0 → 10 A ramp at D = 0.5: ∫i²R = R·I²·D/3, ∫V·i = V·I·D/2
    const duty = 0.5;
    const peak = 10;
    const ramp = (t: number) => (t < duty ? (peak * t) / duty : 0);
    const rms = Math.sqrt(energy((t) => ramp(t) ** 2, 1));
    const average = energy(ramp, 1);
    expect(mosfetConductionLoss(rms, 0.1)).toBeCloseTo(energy((t) => ramp(t) ** 2 * 0.1, 1), 6);
    expect(saturatedConductionLoss(average, 1.2)).toBeCloseTo(energy((t) => ramp(t) * 1.2, 1), 6);
    expect(() => mosfetConductionLoss(1, 0)).toThrow(/^onResistanceOhm/);
  });
});

describe("estimateSwitchLosses", () => {
  const base = { frequencyHz: 300e3, switchingVoltageV: 24, rmsCurrentA: 4.08, averageCurrentA: 2.5, turnOnCurrentA: 0, turnOffCurrentA: 10 };

  it("uses recorded parameters as they are, not as estimates", () => {
    const e = estimateSwitchLosses({ ...base, switchType: "mosfet", onResistanceOhm: 0.1, riseTimeS: 40e-9, fallTimeS: 60e-9 });
    expect(e.conductionW).toBeCloseTo(4.08 ** 2 * 0.1, 12);
    expect(e.switchingW).toBeCloseTo(0.5 * 24 * 10 * 60e-9 * 300e3, 12);
    expect(e.totalW).toBeCloseTo(e.conductionW + e.switchingW, 12);
    expect(e.inputs.find((i) => i.name === "R_DS(on)")?.estimated).toBe(false);
    expect(e.notes).toEqual([]);
  });

  it("falls back to typical values per switch kind, marked as estimates", () => {
    // common practice values (switch-losses.ts); V_CE(sat)·I_avg for a BJT
    const e = estimateSwitchLosses({ ...base, switchType: "bjt" });
    const typical = TYPICAL_SWITCH_LOSS_PARAMETERS.bjt;
    expect(e.conductionW).toBeCloseTo(2.5 * (typical.saturationVoltageV ?? 0), 12);
    expect(e.inputs.find((i) => i.name === "V_CE(sat)")).toMatchObject({ estimated: true });
    expect(e.inputs.find((i) => i.name === "t_f")).toMatchObject({ value: typical.fallTimeS, estimated: true });
    expect(e.notes.join(" ")).toMatch(/Saturation voltage not recorded/);
    expect(() => estimateSwitchLosses({ ...base, switchType: "triode" })).toThrow(/^switchType/);
  });
});

describe("crossCheckSinkPower", () => {
  it("agrees within ×2 either way and says what to check otherwise", () => {
    // the ×2 band is common practice for typical-value estimates
    expect(crossCheckSinkPower({ estimatedW: 6, sinkInferredW: 10 })).toMatchObject({ agrees: true, verdict: "agrees within ×2" });
    expect(crossCheckSinkPower({ estimatedW: 10, sinkInferredW: 5 }).agrees).toBe(true);
    const high = crossCheckSinkPower({ estimatedW: 3, sinkInferredW: 12 });
    expect(high.agrees).toBe(false);
    expect(high.ratio).toBeCloseTo(4, 12);
    expect(high.verdict).toMatch(/disagrees \(×4\): the sink reads more heat.*check the sink's Rθ or the recorded current/);
    const cold = crossCheckSinkPower({ estimatedW: 3, sinkInferredW: 0 });
    expect(cold).toMatchObject({ agrees: false, ratio: null });
    expect(() => crossCheckSinkPower({ estimatedW: 1, sinkInferredW: 1, factor: 0.5 })).toThrow(/^factor/);
  });
});
