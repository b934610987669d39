/**
 * Current margin of one switching transistor for a run session, from the average supply current.
 * Amperes throughout; duty is the on-time fraction of ONE switch (0 to 1).
 *
 * Where the supply current goes (derived from energy balance, V_supply·I_avg = power delivered):
 * - single switch: the supply feeds the one switch while it is on, and its current is a RAMP, not a
 *   rectangle: the primary is an inductance charged from the supply, so the current rises from about
 *   zero to I_pk over the on-time t_on = D·T. Over one period T (exact integrals):
 *     I_avg = (1/T)∫₀^{DT} I_pk·t/(DT) dt = D·I_pk/2          →  I_pk = 2·I_avg/D
 *     I_rms² = (1/T)∫₀^{DT} (I_pk·t/(DT))² dt = D·I_pk²/3     →  I_rms = I_pk·√(D/3) = 2·I_avg/√(3D)
 *   A rectangle of the same average has I_pk = I_avg/D and I_rms = I_avg/√D, so the ramp peaks 2×
 *   and its RMS is 2/√3 ≈ 1.155× the rectangular figures.
 * - half bridge: only the high-side switch draws from the rail (or, with split capacitors, the
 *   primary sees ±V/2): I_avg = D·I_pk, rectangular pulses (the resonant tank sets the shape; a
 *   rectangle of the same average is the usual first estimate), D ≤ 0.5 per switch.
 * - push-pull and full bridge: one switch (pair) or the other is always drawing from the supply,
 *   so the supply sees I_pk for 2·D of the period: I_avg = 2·D·I_pk, D ≤ 0.5 per switch; a
 *   rectangular switch current has I_rms = I_pk·√D.
 * All of these are inferred from the average supply current, so they are estimates whether or not
 * the duty was recorded.
 */
import type { DriverTopology } from "./driver-topology";
import { CalcInputError, requireFinite, requireInRange, requireNonNegative, requirePositive } from "./errors";
import { DEFAULT_MARGIN_THRESHOLDS, assessMargin, reportUnknownMargin, requireFiniteOrAbsent, type Margin, type MarginInput } from "./margin";

/** Per-switch on-time fraction assumed when the session did not record one (common practice: a square drive, dead time ignored). */
export const DEFAULT_SWITCH_DUTY = 0.5;

/** Fraction of the period during which the supply delivers the switch pulse current (see the file comment). */
// Energy balance with rectangular pulses (derived; docs/references.md: I_peak ≈ I_avg / D).
export function supplyConductionFraction(topology: DriverTopology, dutyPerSwitch: number): number {
  const twoPhase = topology === "push_pull" || topology === "full_bridge";
  if (topology === "single_switch") {
    if (!(dutyPerSwitch > 0 && dutyPerSwitch <= 1)) throw new CalcInputError("dutyCycle", "an on-time fraction above 0 and at most 1", dutyPerSwitch);
    return dutyPerSwitch;
  }
  if (topology !== "half_bridge" && !twoPhase) {
    throw new CalcInputError("topology", "single_switch, push_pull, half_bridge or full_bridge", topology);
  }
  // Two switches on one leg or one centre tap can never conduct together, so each gets at most half.
  if (!(dutyPerSwitch > 0 && dutyPerSwitch <= 0.5)) {
    throw new CalcInputError("dutyCycle", "a per-switch on-time fraction above 0 and at most 0.5 for a two-switch topology", dutyPerSwitch);
  }
  return twoPhase ? 2 * dutyPerSwitch : dutyPerSwitch;
}

export type SwitchCurrentWaveform = "ramp" | "rectangle";

/** Peak, RMS and average current (A) in one switch from the average supply current. */
// Single switch: ramp, I_pk = 2·I_avg/D, I_rms = I_pk·√(D/3); others: rectangles, I_pk = I_avg/(conduction fraction),
// I_rms = I_pk·√D (exact integrals over one period, derived in the file comment; docs/references.md, "The switching transistor").
export function estimateSwitchCurrents(args: {
  supplyCurrentA: number;
  topology: DriverTopology;
  /** Per-switch on-time fraction; null or absent uses DEFAULT_SWITCH_DUTY. */
  dutyCycle?: number | null;
}): { peakA: number; rmsA: number; averageA: number; duty: number; dutyAssumed: boolean; waveform: SwitchCurrentWaveform } {
  const supplyCurrent = requireNonNegative("supplyCurrentA", args.supplyCurrentA);
  const recorded = requireFiniteOrAbsent("dutyCycle", args.dutyCycle);
  const duty = recorded ?? DEFAULT_SWITCH_DUTY;
  const rectangularPeak = supplyCurrent / supplyConductionFraction(args.topology, duty);
  if (args.topology === "single_switch") {
    const peakA = 2 * rectangularPeak;
    return { peakA, rmsA: peakA * Math.sqrt(duty / 3), averageA: (peakA * duty) / 2, duty, dutyAssumed: recorded === undefined, waveform: "ramp" };
  }
  return {
    peakA: rectangularPeak,
    rmsA: rectangularPeak * Math.sqrt(duty),
    averageA: rectangularPeak * duty,
    duty,
    dutyAssumed: recorded === undefined,
    waveform: "rectangle",
  };
}

/**
 * The continuous current rating at a case temperature above the one it is quoted at, derated
 * linearly to zero at T_j,max like the power rating. A MOSFET's own I_D(T_c) curve falls as the
 * square root of that power fraction (I_D = √(P/R_DS(on))), so the linear line is the more cautious
 * of the two.
 */
// I(Tc) = I25·(Tj,max − Tc)/(Tj,max − Tc,rated), linear as for power: Toshiba semiconductor FAQ on permissible
// dissipation; Fairchild/onsemi derating curves (docs/references.md, "The switching transistor").
export function deratedContinuousCurrent(args: { continuousCurrentA: number; caseTempC: number; maxJunctionTempC: number; ratedCaseTempC?: number }): number {
  const rated = requirePositive("continuousCurrentA", args.continuousCurrentA);
  const caseTemp = requireFinite("caseTempC", args.caseTempC);
  const maxJunction = requireFinite("maxJunctionTempC", args.maxJunctionTempC);
  const ratedCase = requireFinite("ratedCaseTempC", args.ratedCaseTempC ?? 25);
  if (!(maxJunction > ratedCase)) {
    throw new CalcInputError("maxJunctionTempC", `a temperature above the rated case temperature (${ratedCase} °C)`, maxJunction);
  }
  if (caseTemp <= ratedCase) return rated;
  if (caseTemp >= maxJunction) return 0;
  return (rated * (maxJunction - caseTemp)) / (maxJunction - ratedCase);
}

/**
 * Current margin: switch peak current against the peak (pulsed) rating and switch RMS current
 * against the continuous rating; the tighter of the two is the reported margin, both are inputs.
 */
// Headroom 1 − I/I_rating per rating (derived); switch currents and derating as above.
export function assessCurrentMargin(args: {
  supplyCurrentA: number;
  topology: DriverTopology;
  dutyCycle?: number | null;
  /** The switch's peak (pulsed) current rating, A. */
  peakCurrentA?: number | null;
  /** The switch's continuous current rating, A (quoted at a 25 °C case). */
  continuousCurrentA?: number | null;
  /** Case temperature the thermal chain works out for this session, °C; derates the continuous rating. */
  caseTempC?: number | null;
  /** Whether that case temperature is itself an estimate (default true: it is always inferred). */
  caseTempEstimated?: boolean;
  /** The switch's T_j,max, °C: where the derating line reaches zero. */
  maxJunctionTempC?: number | null;
  thinBelowHeadroom?: number;
}): Margin {
  const thinBelow = requireInRange("thinBelowHeadroom", args.thinBelowHeadroom ?? DEFAULT_MARGIN_THRESHOLDS.current, 0, 1);
  const peakRating = requireFiniteOrAbsent("peakCurrentA", args.peakCurrentA);
  if (peakRating !== undefined) requirePositive("peakCurrentA", peakRating);
  const continuousRating = requireFiniteOrAbsent("continuousCurrentA", args.continuousCurrentA);
  if (continuousRating !== undefined) requirePositive("continuousCurrentA", continuousRating);
  const caseTemp = requireFiniteOrAbsent("caseTempC", args.caseTempC);
  const maxJunction = requireFiniteOrAbsent("maxJunctionTempC", args.maxJunctionTempC);
  const currents = estimateSwitchCurrents(args);

  const dutySource = currents.dutyAssumed ? `assumed ${DEFAULT_SWITCH_DUTY} per switch (not recorded)` : "recorded for the session";
  const shape = currents.waveform === "ramp" ? "a ramp from zero over the on-time" : "rectangular pulses";
  const inputs: MarginInput[] = [
    { name: "I_supply", value: args.supplyCurrentA, unit: "A", estimated: false, source: "session average supply current" },
    { name: "D", value: currents.duty, unit: "", estimated: currents.dutyAssumed, source: dutySource },
    // Inferred from the average supply current through a waveform model: an estimate whatever the duty's source.
    {
      name: "I_peak",
      value: currents.peakA,
      unit: "A",
      estimated: true,
      source: `inferred: average supply current through ${shape}${currents.waveform === "ramp" ? ", 2·I_supply/D" : ""}`,
    },
    { name: "I_rms", value: currents.rmsA, unit: "A", estimated: true, source: currents.waveform === "ramp" ? "inferred: I_peak·√(D/3) (ramp)" : "inferred: I_peak·√D (rectangle)" },
  ];
  const notes = [
    currents.waveform === "ramp"
      ? "Switch currents are inferred from the average supply current: a single switch's current ramps from about zero to its peak over the on-time, so the peak is twice, and the RMS 1.15 times, what rectangular pulses of the same average would give."
      : "Switch currents are inferred from the average supply current assuming rectangular pulses; a sinusoidal pulse of the same average peaks about π/2 times higher.",
  ];
  if (currents.dutyAssumed) notes.push(`Duty not recorded: assumed ${DEFAULT_SWITCH_DUTY} per switch.`);

  const candidates: { value: number; limit: number; formula: string }[] = [];
  if (peakRating !== undefined) {
    inputs.push({ name: "I_peak,rating", value: peakRating, unit: "A", estimated: false, source: "switch datasheet pulsed/peak rating" });
    candidates.push({ value: currents.peakA, limit: peakRating, formula: "I_peak / I_peak,rating" });
  }
  if (continuousRating !== undefined) {
    inputs.push({ name: "I_continuous,rating", value: continuousRating, unit: "A", estimated: false, source: "switch datasheet continuous rating (25 °C case)" });
    if (caseTemp !== undefined && maxJunction !== undefined) {
      const derated = deratedContinuousCurrent({ continuousCurrentA: continuousRating, caseTempC: caseTemp, maxJunctionTempC: maxJunction });
      const caseEstimated = args.caseTempEstimated ?? true;
      inputs.push(
        { name: "T_case", value: caseTemp, unit: "°C", estimated: caseEstimated, source: "case temperature from the thermal chain" },
        { name: "I_continuous,derated", value: derated, unit: "A", estimated: caseEstimated, source: "continuous rating derated linearly from 25 °C case to zero at T_j,max" },
      );
      candidates.push({ value: currents.rmsA, limit: derated, formula: "I_rms / I_continuous,derated" });
      if (derated === 0) notes.push("The case reaches T_j,max: no continuous current is left.");
    } else {
      candidates.push({ value: currents.rmsA, limit: continuousRating, formula: "I_rms / I_continuous,rating" });
      notes.push(
        `The continuous rating is quoted at a 25 °C case and falls as the case warms; it is not derated here because ${
          caseTemp === undefined ? "the session's case temperature could not be worked out" : "the switch's T_j,max is not recorded"
        }.`,
      );
    }
  }
  if (candidates.length === 0) {
    return reportUnknownMargin({
      kind: "current",
      formula: "I_peak / I_peak,rating",
      inputs,
      notes: [...notes, "Neither the switch's peak nor its continuous current rating is recorded: add them to the switch component."],
    });
  }
  if (candidates.length === 1) notes.push(`Only the ${peakRating !== undefined ? "peak" : "continuous"} current rating is recorded; the margin checks that one alone.`);
  if (candidates.some((c) => c.limit === 0)) {
    // 1 − I/0 has no finite value; the case at T_j,max leaves nothing, reported as fully used (−100 %).
    notes.push("Headroom shown as −100 %: with the case at T_j,max the derated continuous rating is zero.");
    return { kind: "current", value: currents.rmsA, limit: 0, headroom: -1, status: "exceeded", formula: "I_rms / I_continuous,derated", inputs, estimated: true, notes };
  }
  const tightest = candidates.reduce((a, b) => (b.value / b.limit > a.value / a.limit ? b : a));
  return assessMargin({ kind: "current", ...tightest, inputs, notes, thinBelow });
}
