/** Physical constants in SI units. Sources beside each value. */

/** Vacuum permeability, H/m: 4π×10⁻⁷ (the 2019 SI value differs by < 1e-9 relative; CODATA 2018). */
export const VACUUM_PERMEABILITY_H_PER_M = 4e-7 * Math.PI;

/** Vacuum permittivity, F/m (CODATA 2018). */
export const VACUUM_PERMITTIVITY_F_PER_M = 8.8541878128e-12;

/** Speed of light in vacuum, m/s (exact by definition of the metre). */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;

/** Annealed copper resistivity at 20 °C, Ω·m: 1/58 Ω·mm²/m (IEC 60028). */
export const COPPER_RESISTIVITY_20C_OHM_M = 1 / 58e6;

/** Hard-drawn aluminium resistivity at 20 °C, Ω·m: 0.028264 Ω·mm²/m (IEC 60889; from memory). */
export const ALUMINIUM_RESISTIVITY_20C_OHM_M = 0.028264e-6;

/** Wire materials a secondary may be wound with. */
export type WireMaterial = "copper" | "aluminium";

/** Resistivity at 20 °C of each wire material, Ω·m (sources at the constants above). */
export const WIRE_RESISTIVITY_20C_OHM_M: Readonly<Record<WireMaterial, number>> = {
  copper: COPPER_RESISTIVITY_20C_OHM_M,
  aluminium: ALUMINIUM_RESISTIVITY_20C_OHM_M,
};

/** Temperature coefficient of annealed copper resistance near 20 °C, 1/K (from memory; "about 0.4 %/K" is widely published). */
export const COPPER_TEMPERATURE_COEFFICIENT_PER_K = 0.00393;
