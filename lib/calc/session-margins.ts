/**
 * All three margins of one run session. Field names follow the stored rows (RunSession,
 * the switch Component, the heat-sink Component), so rows can be passed in as they are read;
 * null means "not recorded". Units are in the names (V, A, °C as C, W, K/W).
 */
import { assessCurrentMargin } from "./current-margin";
import type { DriverTopology } from "./driver-topology";
import { DEFAULT_MARGIN_THRESHOLDS, type Margin, type MarginThresholds } from "./margin";
import { THERMAL_INPUT_NAMES, assessThermalMargin, type SinkProjection } from "./thermal-margin";
import { assessVoltageMargin, type PeakVoltageFactors } from "./voltage-margin";

/** What was recorded about one run session, plus the driver it ran on. */
export interface SessionForMargins {
  topology: DriverTopology;
  /** A single-switch driver with a diode clamp into a capacitor bled to the supply. */
  voltageClamp?: boolean;
  /** The fitted clamp's recorded voltage (clamp component's clampVoltageV), V; null when not recorded. */
  voltageClampV?: number | null;
  supplyVoltageV: number;
  /** Average supply current. */
  supplyCurrentA: number;
  ambientTempC: number;
  heatSinkEndC?: number | null;
  /** Steady-state sink temperature fitted to the session's warm-up samples, when a fit exists. */
  sinkSteadyStateC?: number | null;
  /** Where a run still warming up was heading (judged instead of the end or steady temperature). */
  sinkProjection?: SinkProjection | null;
  peakSwitchVoltageV?: number | null;
  /** On-time fraction of one switch. */
  dutyCycle?: number | null;
  /** Total heat into the sink, when entered rather than inferred. */
  dissipationW?: number | null;
}

/** The switch's datasheet ratings as stored on its component. */
export interface SwitchRatings {
  voltageRatingV?: number | null;
  continuousCurrentA?: number | null;
  peakCurrentA?: number | null;
  powerRating25CW?: number | null;
  maxJunctionTempC?: number | null;
  thermalResistanceJcKPerW?: number | null;
  /** Used when the thermal path does not give a case-to-sink resistance. */
  caseToSinkKPerW?: number | null;
}

/** The path from the switch case to the air. */
export interface ThermalPath {
  /** Sink to ambient. */
  sinkThermalResistanceKPerW?: number | null;
  /** Set when that Rθsa is an estimate (e.g. a fan's factor), saying where it came from. */
  sinkThermalResistanceEstimate?: string | null;
  /** Pad or grease between case and sink; falls back to the switch component's value. */
  caseToSinkKPerW?: number | null;
  /** Switches sharing the sink (default 1). */
  switchesOnSink?: number;
}

export interface SessionMarginOptions {
  thresholds?: Partial<MarginThresholds>;
  peakVoltageFactors?: Partial<PeakVoltageFactors>;
}

export interface SessionMargins {
  voltage: Margin;
  current: Margin;
  thermal: Margin;
}

/** Voltage, current and thermal margins of one session (see the three assess…Margin functions for the methods). */
// Methods and sources: voltage-margin.ts (clamp voltage or supply multiple; Renesas 80 % guidance), current-margin.ts
// (ramp or rectangle from I_avg, continuous rating derated by T_case), thermal-margin.ts (linear derating).
export function sessionMargins(
  session: SessionForMargins,
  switchRatings: SwitchRatings,
  thermalPath: ThermalPath,
  options: SessionMarginOptions = {},
): SessionMargins {
  const thresholds: MarginThresholds = { ...DEFAULT_MARGIN_THRESHOLDS, ...options.thresholds };
  const thermal = assessThermalMargin({
    ambientTempC: session.ambientTempC,
    heatSinkEndC: session.heatSinkEndC,
    sinkSteadyStateC: session.sinkSteadyStateC,
    sinkProjection: session.sinkProjection,
    dissipationW: session.dissipationW,
    sinkToAmbientKPerW: thermalPath.sinkThermalResistanceKPerW,
    sinkToAmbientEstimate: thermalPath.sinkThermalResistanceEstimate,
    caseToSinkKPerW: thermalPath.caseToSinkKPerW ?? switchRatings.caseToSinkKPerW,
    junctionToCaseKPerW: switchRatings.thermalResistanceJcKPerW,
    ratedPowerW: switchRatings.powerRating25CW,
    maxJunctionTempC: switchRatings.maxJunctionTempC,
    switchesOnSink: thermalPath.switchesOnSink,
    thinBelowHeadroom: thresholds.thermal,
  });
  // The case temperature the thermal chain worked out (read by its input name only), to derate the continuous current rating.
  const caseTemp = thermal.inputs.find((input) => input.name === THERMAL_INPUT_NAMES.caseTemp);
  return {
    voltage: assessVoltageMargin({
      voltageRatingV: switchRatings.voltageRatingV,
      peakSwitchVoltageV: session.peakSwitchVoltageV,
      supplyVoltageV: session.supplyVoltageV,
      topology: session.topology,
      clamped: session.voltageClamp,
      clampVoltageV: session.voltageClampV,
      factors: options.peakVoltageFactors,
      thinBelowHeadroom: thresholds.voltage,
    }),
    current: assessCurrentMargin({
      supplyCurrentA: session.supplyCurrentA,
      topology: session.topology,
      dutyCycle: session.dutyCycle,
      peakCurrentA: switchRatings.peakCurrentA,
      continuousCurrentA: switchRatings.continuousCurrentA,
      caseTempC: caseTemp?.value ?? null,
      caseTempEstimated: caseTemp?.estimated ?? true,
      maxJunctionTempC: switchRatings.maxJunctionTempC,
      thinBelowHeadroom: thresholds.current,
    }),
    thermal,
  };
}
