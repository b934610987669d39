/**
 * Lumped LC resonance: the first series resonance of a secondary modelled as its inductance in series
 * with the sum of its capacitances to ground.
 */
import { requirePositive } from "./errors";

/** Resonant frequency of an ideal LC circuit, Hz: f = 1/(2π√(LC)) (Thomson's formula, any circuit-theory text). */
export function resonantFrequency(inductance: number, capacitance: number): number {
  requirePositive("inductance", inductance);
  requirePositive("capacitance", capacitance);
  return 1 / (2 * Math.PI * Math.sqrt(inductance * capacitance));
}

/** Capacitance, F, that resonates with `inductance` (H) at `frequency` (Hz): C = 1/((2πf)² L) (Thomson's formula). */
export function capacitanceForResonance(inductance: number, frequency: number): number {
  requirePositive("inductance", inductance);
  requirePositive("frequency", frequency);
  const omega = 2 * Math.PI * frequency;
  return 1 / (omega * omega * inductance);
}

/** Inductance, H, that resonates with `capacitance` (F) at `frequency` (Hz): L = 1/((2πf)² C) (Thomson's formula). */
export function inductanceForResonance(capacitance: number, frequency: number): number {
  requirePositive("capacitance", capacitance);
  requirePositive("frequency", frequency);
  const omega = 2 * Math.PI * frequency;
  return 1 / (omega * omega * capacitance);
}
