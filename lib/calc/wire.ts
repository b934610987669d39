/**
 * Round copper wire: American Wire Gauge sizes, resistivity, skin depth and resistance.
 */
import { COPPER_RESISTIVITY_20C_OHM_M, COPPER_TEMPERATURE_COEFFICIENT_PER_K, VACUUM_PERMEABILITY_H_PER_M } from "./constants";
import { CalcInputError, requireFinite, requireInRange, requireNonNegative, requirePositive } from "./errors";

/**
 * Gauge names with more than one zero, mapped to the integers this module uses:
 * "0000" (4/0) = −3, "000" (3/0) = −2, "00" (2/0) = −1, "0" (1/0) = 0. This keeps ASTM B258's formula
 * d = 0.127 mm × 92^((36 − n)/39) valid for them, since 0000 is 39 steps above 36.
 */
const NAMED_GAUGES: Readonly<Record<string, number>> = {
  "0000": -3,
  "4/0": -3,
  "000": -2,
  "3/0": -2,
  "00": -1,
  "2/0": -1,
  "0": 0,
  "1/0": 0,
};

/**
 * Bare diameter of an AWG size, m: d = 0.127 mm × 92^((36 − n)/39) (ASTM B258).
 * @param gauge an integer from −3 (0000) to 56, or one of "0000", "000", "00", "0", "4/0", "3/0", "2/0", "1/0"
 * or a whole number as text. The standard's rounded table differs from this formula by up to 0.3 %.
 */
export function awgDiameter(gauge: number | string): number {
  const n = typeof gauge === "string" ? parseGauge(gauge) : gauge;
  if (!Number.isInteger(n) || n < -3 || n > 56) {
    throw new CalcInputError("gauge", "an AWG size from 0000 (−3) to 56, a whole number", gauge);
  }
  return 0.127e-3 * 92 ** ((36 - n) / 39);
}

function parseGauge(text: string): number {
  const trimmed = text.trim();
  const named = NAMED_GAUGES[trimmed];
  if (named !== undefined) return named;
  // Extra leading zeros are refused: "00000" is not a size, and "05" is ambiguous.
  return /^[1-9]\d*$/.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/**
 * Resistivity of annealed copper at `temperatureC` (°C), Ω·m: ρ = ρ20 (1 + α (T − 20)),
 * ρ20 = 1/58 Ω·mm²/m (IEC 60028), α = 0.00393 /K (linear near room temperature; from memory, ≈ 0.4 %/K confirmed).
 * Accepted from −100 °C to 250 °C, where the linear law stays within a few percent.
 */
export function copperResistivity(temperatureC: number): number {
  requireInRange("temperatureC", temperatureC, -100, 250);
  return COPPER_RESISTIVITY_20C_OHM_M * (1 + COPPER_TEMPERATURE_COEFFICIENT_PER_K * (temperatureC - 20));
}

/**
 * Skin depth, m: δ = √(ρ/(π f μ0 μr)) (textbook electromagnetism; from memory).
 * @param frequency Hz
 * @param resistivity Ω·m, default annealed copper at 20 °C
 * @param relativePermeability μr, default 1 (copper)
 */
export function skinDepth(frequency: number, resistivity: number = COPPER_RESISTIVITY_20C_OHM_M, relativePermeability = 1): number {
  requirePositive("frequency", frequency);
  requirePositive("resistivity", resistivity);
  requirePositive("relativePermeability", relativePermeability);
  return Math.sqrt(resistivity / (Math.PI * frequency * VACUUM_PERMEABILITY_H_PER_M * relativePermeability));
}

/** DC resistance of a round wire, Ω: R = ρ ℓ/(π d²/4) (definition of resistivity). Lengths in m, ρ in Ω·m (default copper at 20 °C). */
export function wireDcResistance({
  length,
  diameter,
  resistivity = COPPER_RESISTIVITY_20C_OHM_M,
}: {
  length: number;
  diameter: number;
  resistivity?: number;
}): number {
  requireNonNegative("length", length);
  requirePositive("diameter", diameter);
  requirePositive("resistivity", resistivity);
  return (resistivity * length) / ((Math.PI * diameter * diameter) / 4);
}

/**
 * AC resistance of an isolated straight round wire, Ω, with the current confined to one skin depth:
 * R = ρ ℓ/(π δ (d − δ)) when δ < d/2, else the DC value (the two agree at δ = d/2)
 * (docs/references.md, "AC resistance of round wire"; textbook annulus approximation).
 * Proximity effect is neglected: in a close-wound coil it multiplies the loss by Medhurst's factor, about 1.2–5,
 * so this is a lower bound on a coil's resistance.
 */
export function wireAcResistance({
  length,
  diameter,
  frequency,
  resistivity = COPPER_RESISTIVITY_20C_OHM_M,
}: {
  length: number;
  diameter: number;
  frequency: number;
  resistivity?: number;
}): number {
  requireFinite("frequency", frequency);
  const dc = wireDcResistance({ length, diameter, resistivity });
  if (frequency === 0) return dc;
  const delta = skinDepth(frequency, resistivity);
  if (delta >= diameter / 2) return dc;
  return (resistivity * length) / (Math.PI * delta * (diameter - delta));
}
