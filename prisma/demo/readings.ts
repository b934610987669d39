/**
 * Synthetic bench readings for the demo club, made from lib/calc's own models plus seeded noise:
 * sweeps from the lossy-line model through the series-resistor divider, heat-sink warm-ups from the
 * first-order lumped model, supply current from a load line. Invented numbers, for the demo only.
 */
import { createLineModel, simulateSweep } from "../../lib/calc/line-model";
import type { SeededRandom } from "../../lib/calc/seeded-random";
import type { SweepPoint } from "../../lib/calc/sweep";
import { ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K } from "../../lib/calc/heating";


export interface SweepSettings {
  firstSeriesResonanceHz: number;
  inductanceH: number;
  selfCapacitanceF: number;
  topCapacitanceF: number;
  seriesResistanceOhm: number;
  sourceAmplitudeV: number;
}

/**
 * 400 readings with uneven steps, as a hand sweep is: 340 log-spaced from half to four times the
 * first resonance, and 60 fine steps across ±3 % of it, where anyone sweeping by hand slows down
 * (fine enough to bracket the half-power points, so the analysis can read a Q).
 */
export function synthesizeSweep(settings: SweepSettings, rng: SeededRandom): SweepPoint[] {
  const coarse = 340;
  const fine = 60;
  const f1 = settings.firstSeriesResonanceHz;
  const low = Math.log(f1 * 0.5);
  const high = Math.log(f1 * 4);
  const frequencies: number[] = [];
  for (let i = 0; i < coarse; i++) {
    const jitter = i === 0 || i === coarse - 1 ? 0 : (rng.uniform() - 0.5) * 0.6;
    const f = Math.exp(low + ((i + jitter) / (coarse - 1)) * (high - low));
    frequencies.push(Math.round(f / 10) * 10);
  }
  for (let i = 0; i < fine; i++) frequencies.push(Math.round((f1 * (0.97 + (0.06 * (i + rng.uniform() * 0.5)) / fine)) / 10) * 10);
  const unique = [...new Set(frequencies)].sort((a, b) => a - b);
  const model = createLineModel({
    firstSeriesResonance: settings.firstSeriesResonanceHz,
    // The winding as a line: Z0 ≈ √(L/C) with its distributed capacitance.
    characteristicImpedance: Math.sqrt(settings.inductanceH / settings.selfCapacitanceF),
    topCapacitance: settings.topCapacitanceF,
    dispersionExponent: 0.12,
    q: 70 + rng.uniform() * 50,
  });
  const points = simulateSweep({
    model,
    seriesResistance: settings.seriesResistanceOhm,
    sourceAmplitude: settings.sourceAmplitudeV,
    frequencies: unique,
    noise: { relative: 0.008, absolute: 0.002 },
    rng,
  });
  // Near a tall parallel resonance the divider reads almost the whole source amplitude, and reading
  // noise can carry a value past it; a logged sweep would not show more than the generator puts out.
  const ceiling = settings.sourceAmplitudeV * 0.995;
  return points.map((p) => (p.amplitude > ceiling ? { ...p, amplitude: ceiling } : p));
}

export interface WarmUpSettings {
  ambientC: number;
  /** Heat into the sink, W. */
  dissipationW: number;
  /** Effective sink-to-air resistance on the day, K/W. */
  sinkResistanceKPerW: number;
  sinkMassKg: number;
  durationS: number;
}

/** Heat-sink samples every 30 s of T(t) = Ta + P·Rθ·(1 − e^(−t/τ)), τ = Rθ·m·c, with 0.15 K reading noise. */
export function synthesizeWarmUp(settings: WarmUpSettings, rng: SeededRandom): { elapsedS: number; temperatureC: number }[] {
  const tau = settings.sinkResistanceKPerW * settings.sinkMassKg * ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K;
  const rise = settings.dissipationW * settings.sinkResistanceKPerW;
  const samples: { elapsedS: number; temperatureC: number }[] = [];
  for (let t = 0; t <= settings.durationS + 1e-9; t += 30) {
    const temperature = settings.ambientC + rise * (1 - Math.exp(-t / tau)) + rng.normal() * 0.15;
    samples.push({ elapsedS: t, temperatureC: Math.round(temperature * 10) / 10 });
  }
  return samples;
}

export function pick<T>(values: readonly T[], rng: SeededRandom): T {
  return values[Math.min(values.length - 1, Math.floor(rng.uniform() * values.length))]!;
}

export function round(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}
