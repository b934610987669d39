/**
 * Coilyard's engineering library: its public surface. Pure TypeScript, SI units inside (m, H, F,
 * Hz, Ω, V, A, W, s, K/W), temperatures in °C; out-of-range input throws CalcInputError naming the
 * field. Modules not listed here (numerical building blocks such as the toroidal Legendre
 * functions, pairwise slopes, noise estimation, scalar minimisation) are implementation details.
 */

// Errors and constants
export * from "./errors";
export * from "./constants";

// The secondary: geometry, inductance, self-capacitance, wire
export * from "./elliptic";
export * from "./inductance";
export * from "./self-capacitance";
export * from "./secondary-geometry";
export * from "./wire";
export * from "./helix-modes";

// Top loads, resonance, prediction and comparison with measurement
export * from "./top-load";
export * from "./resonance";
export * from "./build-prediction";
export * from "./uncertainty-propagation";
export * from "./prediction-band";
export * from "./running-frequency";
export * from "./deviation-summary";
export * from "./comparison";
export * from "./broadcast-band";

// Sweeps through a series resistor
export * from "./divider";
export * from "./line-model";
export * from "./sweep";
export * from "./seeded-random";

// The switch: derating and the margins of a run session
export * from "./driver-topology";
export * from "./derating";
export * from "./margin";
export * from "./voltage-margin";
export * from "./current-margin";
export * from "./thermal-margin";
export * from "./session-margins";
export * from "./switch-losses";

// Heat-sink warm-up
export * from "./heating";
export * from "./warm-up";
export * from "./fan-cooling";

// Trends, drift and health of a coil
export * from "./robust-trend";
export * from "./coil-logbook";
export * from "./health-thresholds";
export * from "./coil-health";

// Failures, clearance, reliability
export * from "./failure-analysis";
export * from "./clearance-policy";
export * from "./lending-checklist";
export * from "./policy-tightening";
export * from "./clearance-lapse";
export * from "./reliability";
