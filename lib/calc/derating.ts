/**
 * Power derating and the steady-state thermal chain of a switching transistor.
 *
 * Units: power in W, temperatures in °C, thermal resistances in K/W.
 */
import { CalcInputError, requireFinite, requireNonNegative, requirePositive } from "./errors";

/** A transistor's dissipation rating as printed in its datasheet. */
export interface DissipationRating {
  /** Total permissible dissipation at the rated case temperature, W (the datasheet's P_D or P_tot). */
  ratedPower: number;
  /** Maximum junction temperature T_j,max, °C. */
  maxJunctionTemp: number;
  /** Case temperature the power rating is quoted at, °C (almost always 25 °C). */
  ratedCaseTemp?: number;
}

function checkRating(rating: DissipationRating): { ratedPower: number; maxJunctionTemp: number; ratedCaseTemp: number } {
  const ratedPower = requirePositive("ratedPower", rating.ratedPower);
  const maxJunctionTemp = requireFinite("maxJunctionTemp", rating.maxJunctionTemp);
  const ratedCaseTemp = requireFinite("ratedCaseTemp", rating.ratedCaseTemp ?? 25);
  if (!(maxJunctionTemp > ratedCaseTemp)) {
    throw new CalcInputError("maxJunctionTemp", `a temperature above the rated case temperature (${ratedCaseTemp} °C)`, maxJunctionTemp);
  }
  return { ratedPower, maxJunctionTemp, ratedCaseTemp };
}

/**
 * Permissible dissipation (W) at a given case temperature: the full rating up to the rated case
 * temperature, falling linearly to zero at T_j,max.
 */
// Linear derating P(Tc) = P25·(Tj,max − Tc)/(Tj,max − Tc,rated): Toshiba semiconductor FAQ on permissible
// dissipation; "normalized power dissipation vs case temperature" curves in Fairchild/onsemi MOSFET datasheets.
export function deratedPower(input: DissipationRating & { /** Case temperature, °C. */ caseTemp: number }): number {
  const { ratedPower, maxJunctionTemp, ratedCaseTemp } = checkRating(input);
  const caseTemp = requireFinite("caseTemp", input.caseTemp);
  if (caseTemp <= ratedCaseTemp) return ratedPower;
  if (caseTemp >= maxJunctionTemp) return 0;
  return (ratedPower * (maxJunctionTemp - caseTemp)) / (maxJunctionTemp - ratedCaseTemp);
}

/**
 * Junction-to-case thermal resistance (K/W) implied by a dissipation rating, for when the datasheet
 * value was not recorded. The rating is the power that lifts the junction from the rated case
 * temperature to T_j,max, so this is the resistance the derating line assumes.
 */
// Rθjc = (Tj,max − Tc,rated)/P25 (derived from the linear derating above; docs/references.md, "The switching transistor").
export function junctionToCaseFromRating(rating: DissipationRating): number {
  const { ratedPower, maxJunctionTemp, ratedCaseTemp } = checkRating(rating);
  return (maxJunctionTemp - ratedCaseTemp) / ratedPower;
}

/** The series thermal resistances (K/W) between the junction and the reference temperature. */
export interface ThermalResistances {
  /** Junction to case, Rθjc. */
  junctionToCase: number;
  /** Case to heat sink through the pad or grease, Rθcs. Omit (or 0) for a bare case. */
  caseToSink?: number;
  /** Heat sink to ambient air, Rθsa. Give it only when the reference temperature is the ambient. */
  sinkToAmbient?: number;
}

/**
 * Steady-state junction temperature (°C) from a reference temperature and the dissipation.
 * The reference is the ambient air when `sinkToAmbient` is given, otherwise the heat-sink
 * temperature (a measured sink already includes its own rise).
 */
// Thermal chain Tj = Ta + P·(Rθjc + Rθcs + Rθsa): docs/references.md, "The switching transistor" (Toshiba FAQ; IR datasheets).
export function junctionTemperature(input: {
  /** Ambient air temperature (with `sinkToAmbient`) or heat-sink temperature (without), °C. */
  referenceTemp: number;
  /** Dissipation in the one transistor, W. */
  power: number;
  resistances: ThermalResistances;
}): number {
  const referenceTemp = requireFinite("referenceTemp", input.referenceTemp);
  const power = requireNonNegative("power", input.power);
  const r = input.resistances;
  const total =
    requireNonNegative("resistances.junctionToCase", r.junctionToCase) +
    requireNonNegative("resistances.caseToSink", r.caseToSink ?? 0) +
    requireNonNegative("resistances.sinkToAmbient", r.sinkToAmbient ?? 0);
  return referenceTemp + power * total;
}
