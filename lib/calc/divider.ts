/**
 * Reading a device's impedance off a resistive divider: the way a coil is swept on the bench.
 * Generator (amplitude Vin) → series resistor R → device Z → ground; the scope reads Vout across Z.
 */
import { CalcInputError, requireInRange, requireNonNegative, requirePositive } from "./errors";

/** One divider reading. Amplitudes in volts, both peak or both peak-to-peak; phase in radians. */
export interface DividerReading {
  /** R between generator and device, Ω. */
  seriesResistance: number;
  /** Vin, the generator's amplitude, V. */
  sourceAmplitude: number;
  /** Vout, the amplitude measured across the device, V. */
  measuredAmplitude: number;
  /** φ, the phase of Z itself (not of Vout), rad, from −π/2 to π/2. Omit when unknown. */
  phase?: number;
}

/**
 * |Z| in Ω from a divider reading.
 *
 * Without a phase this is |Z| = R·m/(1 − m), m = Vout/Vin, which is exact only while Z is purely
 * resistive, i.e. right at a series or parallel resonance; between resonances it overstates |Z|,
 * by up to 1/cos φ (√2 at ±45°) when |Z| ≫ R. With the phase φ of Z known the magnitude is exact.
 * Refuses m ≥ 1: a passive divider can never show more across Z than the generator gives.
 */
export function dividerImpedance(reading: DividerReading): number {
  const resistance = requirePositive("seriesResistance", reading.seriesResistance);
  const source = requirePositive("sourceAmplitude", reading.sourceAmplitude);
  const measured = requireNonNegative("measuredAmplitude", reading.measuredAmplitude);
  const phase = reading.phase === undefined ? 0 : requireInRange("phase", reading.phase, -Math.PI / 2, Math.PI / 2);
  const ratio = measured / source;
  if (ratio >= 1) {
    throw new CalcInputError(
      "measuredAmplitude",
      `less than the source amplitude ${source} V (a passive divider cannot show more across the device)`,
      measured,
    );
  }
  return impedanceFromDividerRatio(resistance, ratio, phase);
}

/**
 * The same formula on already-checked numbers, for loops over whole sweeps (no object per point).
 * Callers guarantee R > 0, 0 ≤ ratio < 1 and |phase| ≤ π/2.
 * Source: |Z/(R+Z)| = m solved for |Z| with Z = |Z|e^{jφ} (derived; docs/references.md,
 * "Sweeps through a series resistor"): |Z| = R·m·[m cos φ + √(1 − m² sin² φ)]/(1 − m²).
 */
export function impedanceFromDividerRatio(seriesResistance: number, ratio: number, phase = 0): number {
  if (phase === 0) return (seriesResistance * ratio) / (1 - ratio);
  const sin = Math.sin(phase);
  const root = Math.sqrt(1 - ratio * ratio * sin * sin);
  return (seriesResistance * ratio * (ratio * Math.cos(phase) + root)) / (1 - ratio * ratio);
}


/**
 * How many times the amplitude-only reading R·m/(1 − m) overstates the true |Z| when Z has phase φ:
 * (1 + m)/(m·cos φ + √(1 − m² sin² φ)), the ratio of the two formulas above (derived; docs/references.md,
 * "Sweeps through a series resistor"). Never below 1 (the amplitude-only reading never reads low); 1 at
 * φ = 0; close to 1 while |Z| ≪ R (m → 0); tends to 1/cos φ as |Z| ≫ R (m → 1), √2 at ±45°,
 * growing without bound as Z turns purely reactive between resonances.
 */
export function amplitudeOnlyOverstatement(ratio: number, phase: number): number {
  const m = requireInRange("ratio", ratio, 0, 1 - Number.EPSILON);
  const phi = requireInRange("phase", phase, -Math.PI / 2, Math.PI / 2);
  const sin = Math.sin(phi);
  return (1 + m) / (m * Math.cos(phi) + Math.sqrt(1 - m * m * sin * sin));
}
