/**
 * The three headrooms of one run session as numbers only: what sessionMargins (session-margins.ts) would report as
 * each margin's `headroom`, without the inputs, notes, formulas and formatted figures that explain it.
 *
 * Why a second path: a coil's health reads ~63 sessions (lib/analysis/health-window.ts), but only the latest one's
 * margins are shown in full; the older ones feed the trends with their headrooms alone. Building every sentence for
 * all of them was about half of the cold dashboard's judgement beyond its floor. The arithmetic here is the same
 * calls and the same operations in the same order as the three assess…Margin functions (so every double is the
 * same), and it validates every input those functions validate, so it throws a CalcInputError wherever
 * sessionMargins would (not necessarily naming the same field first: a caller that needs the message falls back to
 * the full path). session-headrooms.test.ts checks both against each other on generated sessions.
 */
import { deratedContinuousCurrent, estimateSwitchCurrents } from "./current-margin";
import { deratedPower, junctionTemperature, junctionToCaseFromRating } from "./derating";
import { CalcInputError, requireFinite, requireInRange, requirePositive } from "./errors";
import { DEFAULT_MARGIN_THRESHOLDS, classifyHeadroom, optionalNonNegative, optionalPositive, requireFiniteOrAbsent, type MarginThresholds } from "./margin";
import type { SessionForMargins, SessionMarginOptions, SwitchRatings, ThermalPath } from "./session-margins";
import { TYPICAL_CASE_TO_SINK_K_PER_W, inferSinkDissipation, type SinkProjection } from "./thermal-margin";
import { estimatePeakSwitchVoltage } from "./voltage-margin";

/** Each margin's headroom (1 − value/limit, a fraction); null where that margin is unknown. */
export interface SessionHeadrooms {
  voltage: number | null;
  current: number | null;
  thermal: number | null;
}

/** A session as sessionHeadrooms reads it: only the projected sink temperature matters, not where it came from. */
export type SessionForHeadrooms = Omit<SessionForMargins, "sinkProjection"> & { sinkProjection?: Pick<SinkProjection, "sinkC"> | null };

/** sessionMargins(…)'s three headrooms, numbers only (methods and sources: the three assess…Margin functions). */
// Voltage: 1 − V_peak/V_rating (voltage-margin.ts); current: tighter of I_peak and derated I_rms (current-margin.ts);
// thermal: tighter of P/P_derated(T_case) and the junction rise (thermal-margin.ts); docs/references.md for each.
export function sessionHeadrooms(
  session: SessionForHeadrooms,
  switchRatings: SwitchRatings,
  thermalPath: ThermalPath,
  options: SessionMarginOptions = {},
): SessionHeadrooms {
  const thresholds: MarginThresholds = { ...DEFAULT_MARGIN_THRESHOLDS, ...options.thresholds };
  // As each assess…Margin function reads its threshold (a threshold given as undefined falls back to the default).
  const thermal = thermalHeadroom(session, switchRatings, thermalPath, thresholds.thermal ?? DEFAULT_MARGIN_THRESHOLDS.thermal);
  return {
    voltage: voltageHeadroom(session, switchRatings, options, thresholds.voltage ?? DEFAULT_MARGIN_THRESHOLDS.voltage),
    current: currentHeadroom(session, switchRatings, thermal.caseTempC, thresholds.current ?? DEFAULT_MARGIN_THRESHOLDS.current),
    thermal: thermal.headroom,
  };
}

/** assessMargin's checks and arithmetic (margin.ts): the headroom of a computed margin. */
function computedHeadroom(field: string, value: number, limit: number, thinBelow: number): number {
  if (!Number.isFinite(value)) requireFinite(`${field}.value`, value); // the name only for a value that fails
  if (!Number.isFinite(limit) || limit <= 0) throw new CalcInputError(`${field}.limit`, "a finite limit greater than 0", limit);
  const headroom = 1 - value / limit;
  classifyHeadroom(headroom, thinBelow); // throws where the full margin's status would
  return headroom;
}

/** The candidate with the highest value/limit, the first on a tie (the assess…Margin functions' reduce). */
function tightestHeadroom(field: string, values: readonly number[], limits: readonly number[], thinBelow: number): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) if (values[i]! / limits[i]! > values[best]! / limits[best]!) best = i;
  return computedHeadroom(field, values[best]!, limits[best]!, thinBelow);
}

/** assessThermalMargin's numbers (thermal-margin.ts), and the case temperature the current margin derates by. */
function thermalHeadroom(
  session: SessionForHeadrooms,
  ratings: SwitchRatings,
  path: ThermalPath,
  thinBelowHeadroom: number,
): { headroom: number | null; caseTempC: number | null } {
  const thinBelow = requireInRange("thinBelowHeadroom", thinBelowHeadroom, 0, 1);
  const ambient = requireFinite("ambientTempC", session.ambientTempC);
  const endTemp = requireFiniteOrAbsent("heatSinkEndC", session.heatSinkEndC);
  const steadyTemp = requireFiniteOrAbsent("sinkSteadyStateC", session.sinkSteadyStateC);
  const entered = optionalNonNegative("dissipationW", session.dissipationW);
  const rsa = optionalPositive("sinkToAmbientKPerW", path.sinkThermalResistanceKPerW);
  const rcsRecorded = optionalNonNegative("caseToSinkKPerW", path.caseToSinkKPerW ?? ratings.caseToSinkKPerW);
  const rjcRecorded = optionalPositive("junctionToCaseKPerW", ratings.thermalResistanceJcKPerW);
  const ratedPower = optionalPositive("ratedPowerW", ratings.powerRating25CW);
  const maxJunction = requireFiniteOrAbsent("maxJunctionTempC", ratings.maxJunctionTempC);
  const switches = path.switchesOnSink ?? 1;
  if (!Number.isInteger(switches) || switches < 1) throw new CalcInputError("switchesOnSink", "a whole number of switches, at least 1", switches);
  if (maxJunction !== undefined && maxJunction <= ambient) {
    throw new CalcInputError("maxJunctionTempC", `a temperature above the ambient (${ambient} °C)`, maxJunction);
  }
  const projection = session.sinkProjection ?? undefined;
  if (projection) requireFinite("sinkProjection.sinkC", projection.sinkC);
  let sinkTemp = projection?.sinkC ?? steadyTemp ?? endTemp;
  let power: number | undefined;
  if (entered !== undefined) {
    power = entered;
    if (sinkTemp === undefined && rsa !== undefined) sinkTemp = ambient + power * rsa;
  } else if (sinkTemp !== undefined && rsa !== undefined) {
    power = inferSinkDissipation({ sinkTempC: sinkTemp, ambientTempC: ambient, sinkToAmbientKPerW: rsa });
  }
  const switchPower = power === undefined ? undefined : power / switches;
  const rcs = rcsRecorded ?? TYPICAL_CASE_TO_SINK_K_PER_W;
  let rjc = rjcRecorded;
  if (rjc === undefined && ratedPower !== undefined && maxJunction !== undefined) rjc = junctionToCaseFromRating({ ratedPower, maxJunctionTemp: maxJunction });

  if (sinkTemp === undefined || switchPower === undefined || maxJunction === undefined) return { headroom: null, caseTempC: null };
  const caseTemp = sinkTemp + switchPower * rcs;
  const values: number[] = [];
  const limits: number[] = [];
  if (ratedPower !== undefined) {
    const allowed = deratedPower({ ratedPower, maxJunctionTemp: maxJunction, caseTemp });
    if (allowed > 0) {
      values.push(switchPower);
      limits.push(allowed);
    }
  }
  if (rjc !== undefined) {
    const tj = junctionTemperature({ referenceTemp: sinkTemp, power: switchPower, resistances: { junctionToCase: rjc, caseToSink: rcs } });
    values.push(tj - ambient);
    limits.push(maxJunction - ambient);
  }
  return { headroom: values.length === 0 ? null : tightestHeadroom("thermal", values, limits, thinBelow), caseTempC: caseTemp };
}

/** assessVoltageMargin's numbers (voltage-margin.ts). */
function voltageHeadroom(session: SessionForHeadrooms, ratings: SwitchRatings, options: SessionMarginOptions, thinBelowHeadroom: number): number | null {
  const thinBelow = requireInRange("thinBelowHeadroom", thinBelowHeadroom, 0, 1);
  const supply = requirePositive("supplyVoltageV", session.supplyVoltageV);
  const rating = requireFiniteOrAbsent("voltageRatingV", ratings.voltageRatingV);
  if (rating !== undefined) requirePositive("voltageRatingV", rating);
  const measured = requireFiniteOrAbsent("peakSwitchVoltageV", session.peakSwitchVoltageV);
  if (measured !== undefined) requirePositive("peakSwitchVoltageV", measured);
  const clampVoltage = session.voltageClamp ? requireFiniteOrAbsent("clampVoltageV", session.voltageClampV) : undefined;
  if (clampVoltage !== undefined) requirePositive("clampVoltageV", clampVoltage);
  const creditedClampV = session.topology === "single_switch" ? clampVoltage : undefined;
  const peak =
    measured ??
    creditedClampV ??
    estimatePeakSwitchVoltage({ supplyVoltageV: supply, topology: session.topology, clamped: session.voltageClamp, factors: options.peakVoltageFactors }).peakVoltageV;
  return rating === undefined ? null : computedHeadroom("voltage", peak, rating, thinBelow);
}

/** assessCurrentMargin's numbers (current-margin.ts), derating by the thermal chain's case temperature. */
function currentHeadroom(session: SessionForHeadrooms, ratings: SwitchRatings, caseTempC: number | null, thinBelowHeadroom: number): number | null {
  const thinBelow = requireInRange("thinBelowHeadroom", thinBelowHeadroom, 0, 1);
  const peakRating = requireFiniteOrAbsent("peakCurrentA", ratings.peakCurrentA);
  if (peakRating !== undefined) requirePositive("peakCurrentA", peakRating);
  const continuousRating = requireFiniteOrAbsent("continuousCurrentA", ratings.continuousCurrentA);
  if (continuousRating !== undefined) requirePositive("continuousCurrentA", continuousRating);
  const caseTemp = requireFiniteOrAbsent("caseTempC", caseTempC);
  const maxJunction = requireFiniteOrAbsent("maxJunctionTempC", ratings.maxJunctionTempC);
  const currents = estimateSwitchCurrents({ supplyCurrentA: session.supplyCurrentA, topology: session.topology, dutyCycle: session.dutyCycle });
  const values: number[] = [];
  const limits: number[] = [];
  if (peakRating !== undefined) {
    values.push(currents.peakA);
    limits.push(peakRating);
  }
  if (continuousRating !== undefined) {
    values.push(currents.rmsA);
    limits.push(
      caseTemp !== undefined && maxJunction !== undefined
        ? deratedContinuousCurrent({ continuousCurrentA: continuousRating, caseTempC: caseTemp, maxJunctionTempC: maxJunction })
        : continuousRating,
    );
  }
  if (values.length === 0) return null;
  // 1 − I/0 has no finite value: the case at T_j,max leaves nothing, reported as −100 % (as assessCurrentMargin does).
  if (limits.includes(0)) return -1;
  return tightestHeadroom("current", values, limits, thinBelow);
}
