/**
 * Current margin of one switching transistor for a run session, from the average supply current.
 * Amperes throughout; duty is the on-time fraction of ONE switch (0 to 1).
 *
 * Where the supply current goes, with rectangular current pulses of height I_pk (derived from
 * energy balance, V_supply·I_avg = power delivered to the primary):
 * - single switch: the supply feeds the one switch while it is on: I_avg = D·I_pk.
 * - half bridge: only the high-side switch draws from the rail (or, with split capacitors, the
 *   primary sees ±V/2): I_avg = D·I_pk as well, with D ≤ 0.5 per switch.
 * - push-pull and full bridge: one switch (pair) or the other is always drawing from the supply,
 *   so the supply sees I_pk for 2·D of the period: I_avg = 2·D·I_pk, D ≤ 0.5 per switch.
 * Each switch carries I_pk for its own D, so its RMS current is I_pk·√D in every case.
 */
import type { DriverTopology } from "./driver-topology";
import { CalcInputError, requireInRange, requireNonNegative, requirePositive } from "./errors";
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

/** Peak and RMS current (A) in one switch from the average supply current. */
// I_pk = I_avg / (supply conduction fraction), I_rms = I_pk·√D for rectangular pulses (derived; docs/references.md).
export function estimateSwitchCurrents(args: {
  supplyCurrentA: number;
  topology: DriverTopology;
  /** Per-switch on-time fraction; null or absent uses DEFAULT_SWITCH_DUTY. */
  dutyCycle?: number | null;
}): { peakA: number; rmsA: number; duty: number; dutyAssumed: boolean } {
  const supplyCurrent = requireNonNegative("supplyCurrentA", args.supplyCurrentA);
  const recorded = requireFiniteOrAbsent("dutyCycle", args.dutyCycle);
  const duty = recorded ?? DEFAULT_SWITCH_DUTY;
  const peakA = supplyCurrent / supplyConductionFraction(args.topology, duty);
  return { peakA, rmsA: peakA * Math.sqrt(duty), duty, dutyAssumed: recorded === undefined };
}

/**
 * Current margin: switch peak current against the peak (pulsed) rating and switch RMS current
 * against the continuous rating; the tighter of the two is the reported margin, both are inputs.
 */
// Headroom 1 − I/I_rating per rating (derived); rectangular-pulse currents as above.
export function assessCurrentMargin(args: {
  supplyCurrentA: number;
  topology: DriverTopology;
  dutyCycle?: number | null;
  /** The switch's peak (pulsed) current rating, A. */
  peakCurrentA?: number | null;
  /** The switch's continuous current rating, A (usually quoted at 25 °C case). */
  continuousCurrentA?: number | null;
  thinBelowHeadroom?: number;
}): Margin {
  const thinBelow = requireInRange("thinBelowHeadroom", args.thinBelowHeadroom ?? DEFAULT_MARGIN_THRESHOLDS.current, 0, 1);
  const peakRating = requireFiniteOrAbsent("peakCurrentA", args.peakCurrentA);
  if (peakRating !== undefined) requirePositive("peakCurrentA", peakRating);
  const continuousRating = requireFiniteOrAbsent("continuousCurrentA", args.continuousCurrentA);
  if (continuousRating !== undefined) requirePositive("continuousCurrentA", continuousRating);
  const currents = estimateSwitchCurrents(args);

  const dutySource = currents.dutyAssumed ? `assumed ${DEFAULT_SWITCH_DUTY} per switch (not recorded)` : "recorded for the session";
  const inputs: MarginInput[] = [
    { name: "I_supply", value: args.supplyCurrentA, unit: "A", estimated: false, source: "session average supply current" },
    { name: "D", value: currents.duty, unit: "", estimated: currents.dutyAssumed, source: dutySource },
    // Derived under the rectangular-pulse model; flagged as estimates only when the duty itself was assumed.
    { name: "I_peak", value: currents.peakA, unit: "A", estimated: currents.dutyAssumed, source: "derived: average supply current over the supply conduction fraction, rectangular pulses" },
    { name: "I_rms", value: currents.rmsA, unit: "A", estimated: currents.dutyAssumed, source: "derived: I_peak·√D" },
  ];
  const notes = [
    "Switch currents are inferred from the average supply current assuming rectangular pulses; a sinusoidal pulse of the same average peaks about π/2 times higher.",
  ];
  if (currents.dutyAssumed) notes.push(`Duty not recorded: assumed ${DEFAULT_SWITCH_DUTY} per switch.`);

  const candidates: { value: number; limit: number; formula: string }[] = [];
  if (peakRating !== undefined) {
    inputs.push({ name: "I_peak,rating", value: peakRating, unit: "A", estimated: false, source: "switch datasheet pulsed/peak rating" });
    candidates.push({ value: currents.peakA, limit: peakRating, formula: "I_peak / I_peak,rating" });
  }
  if (continuousRating !== undefined) {
    inputs.push({ name: "I_continuous,rating", value: continuousRating, unit: "A", estimated: false, source: "switch datasheet continuous rating" });
    candidates.push({ value: currents.rmsA, limit: continuousRating, formula: "I_rms / I_continuous,rating" });
    notes.push("The continuous rating is usually quoted at a 25 °C case and falls as the case warms.");
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
  const tightest = candidates.reduce((a, b) => (b.value / b.limit > a.value / a.limit ? b : a));
  return assessMargin({ kind: "current", ...tightest, inputs, notes, thinBelow });
}
