/**
 * Voltage margin of the switching transistor for one run session: the collector/drain peak
 * against the switch's voltage rating (V_CEO / V_DSS / V_CES). Volts throughout.
 */
import { DRIVER_TOPOLOGY_LABELS, type DriverTopology } from "./driver-topology";
import { CalcInputError, isInRange, requireInRange, requirePositive } from "./errors";
import { DEFAULT_MARGIN_THRESHOLDS, assessMargin, reportUnknownMargin, requireFiniteOrAbsent, type Margin, type MarginInput } from "./margin";

/**
 * Peak switch voltage as a multiple of the supply, used only when the peak was not measured.
 * All are rules of thumb; the real figure depends on layout, leakage inductance and snubbing.
 */
export const PEAK_VOLTAGE_FACTORS = {
  /** Inductive turn-off spike rings an unclamped single switch to about five times its supply (common practice). */
  singleSwitchUnclamped: 5,
  /** A diode clamp into a capacitor bled by a resistor to the supply holds it under three times the supply (common practice). */
  singleSwitchClamped: 2.7,
  /** Each half of a centre-tapped primary swings the off switch to twice the supply, plus leakage ringing (common practice). */
  pushPull: 2.5,
  /** A bridge leg blocks the supply rail plus a small turn-off overshoot (common practice). */
  bridge: 1.2,
} as const;

export type PeakVoltageFactors = { [K in keyof typeof PEAK_VOLTAGE_FACTORS]: number };

/** Estimated collector/drain peak (V) from the supply and the topology, with the factor used and why. */
// Rules of thumb per topology (docs/references.md, "The switching transistor": several times the supply unclamped; common practice).
export function estimatePeakSwitchVoltage(args: {
  supplyVoltageV: number;
  topology: DriverTopology;
  /** A single-switch driver with a diode clamp into a capacitor bled to the supply. Ignored for other topologies. */
  clamped?: boolean;
  factors?: Partial<PeakVoltageFactors>;
}): { peakVoltageV: number; factor: number; basis: string } {
  const supply = requirePositive("supplyVoltageV", args.supplyVoltageV);
  // Called for every session a dashboard judges: no copy of the table without overrides, and a factor's name is
  // spelled out only when it fails its range.
  const factors: PeakVoltageFactors = args.factors === undefined ? PEAK_VOLTAGE_FACTORS : { ...PEAK_VOLTAGE_FACTORS, ...args.factors };
  switch (args.topology) {
    case "single_switch":
      return args.clamped
        ? peakOf(supply, factors, "singleSwitchClamped", "single switch with a diode clamp into a capacitor bled to the supply")
        : peakOf(supply, factors, "singleSwitchUnclamped", "unclamped single switch: the turn-off spike rings to several times the supply");
    case "push_pull":
      return peakOf(supply, factors, "pushPull", "push-pull on a centre-tapped primary: twice the supply plus leakage ringing");
    case "half_bridge":
    case "full_bridge":
      return peakOf(supply, factors, "bridge", "bridge leg: the supply rail plus a small turn-off overshoot");
    default:
      throw new CalcInputError("topology", "single_switch, push_pull, half_bridge or full_bridge", args.topology);
  }
}

function peakOf(supply: number, factors: PeakVoltageFactors, key: keyof PeakVoltageFactors, basis: string) {
  const value = factors[key];
  const factor = isInRange(value, 1, 20) ? value : requireInRange(`factors.${key}`, value, 1, 20);
  return { peakVoltageV: supply * factor, factor, basis };
}

/**
 * Voltage margin: measured peak (or an estimate, flagged as such) against the switch's rating.
 * "Thin" below `thinBelowHeadroom` (default 0.2: Renesas advises staying within 80 % of the rated V_DSS).
 *
 * Unmeasured peak of a clamped single switch: the clamp's recorded voltage (the level it holds the
 * collector/drain to), not a multiple of the supply. Nothing is added for the clamp's own overshoot
 * (its turn-on time and lead inductance): that is layout-specific and only a measured peak shows it,
 * so the notes ask for one. Without a recorded clamp voltage the supply multiple stays, marked an
 * estimate. Worked example (issue 15, a project requirement): 24 V supply, 150 V clamp, 200 V part →
 * headroom 1 − 150/200 = 25 % (the 2.7 × supply rule gave 1 − 64.8/200 ≈ 68 %).
 */
// Headroom 1 − V_peak/V_rating; 80 % guidance from the Renesas knowledge base (docs/references.md; vendor guidance, not a standard).
export function assessVoltageMargin(args: {
  /** The switch's voltage rating (V_CEO, V_DSS or V_CES), V; null when not recorded. */
  voltageRatingV?: number | null;
  /** Measured collector/drain peak, V; null when not measured. */
  peakSwitchVoltageV?: number | null;
  supplyVoltageV: number;
  topology: DriverTopology;
  clamped?: boolean;
  /**
   * The fitted clamp's recorded voltage (Component kind "clamp", clampVoltageV): the collector/drain
   * level it holds the switch to, V. Null or absent when not recorded; ignored unless `clamped`.
   */
  clampVoltageV?: number | null;
  factors?: Partial<PeakVoltageFactors>;
  thinBelowHeadroom?: number;
}): Margin {
  const formula = "V_peak / V_rating";
  const thinBelow = requireInRange("thinBelowHeadroom", args.thinBelowHeadroom ?? DEFAULT_MARGIN_THRESHOLDS.voltage, 0, 1);
  const supply = requirePositive("supplyVoltageV", args.supplyVoltageV);
  const rating = requireFiniteOrAbsent("voltageRatingV", args.voltageRatingV);
  if (rating !== undefined) requirePositive("voltageRatingV", rating);
  const measured = requireFiniteOrAbsent("peakSwitchVoltageV", args.peakSwitchVoltageV);
  if (measured !== undefined) requirePositive("peakSwitchVoltageV", measured);
  const clampVoltage = args.clamped ? requireFiniteOrAbsent("clampVoltageV", args.clampVoltageV) : undefined;
  if (clampVoltage !== undefined) requirePositive("clampVoltageV", clampVoltage);
  // Only a single switch's clamp is modelled (the topologies' rules of thumb above say why the others differ).
  const creditedClampV = args.topology === "single_switch" ? clampVoltage : undefined;

  const inputs: MarginInput[] = [];
  const notes: string[] = [];
  if (clampVoltage !== undefined && clampVoltage <= supply) {
    notes.push(
      `The recorded clamp voltage (${formatVolts(clampVoltage)}) is not above the supply (${formatVolts(supply)}): the clamp would conduct all the time, so check the clamp's record.`,
    );
  }
  if (measured !== undefined) {
    inputs.push({ name: "V_peak", value: measured, unit: "V", estimated: false, source: "measured collector/drain peak" });
    if (measured < supply) {
      notes.push(
        `The measured peak (${formatVolts(measured)}) is below the supply (${formatVolts(supply)}); the switch must block at least the supply, so check the probe attenuation setting.`,
      );
    }
    if (creditedClampV !== undefined && measured > creditedClampV) {
      notes.push(`The measured peak overshoots the clamp's recorded ${formatVolts(creditedClampV)} (its turn-on time and lead inductance); the measurement is used.`);
    }
  } else if (creditedClampV !== undefined) {
    inputs.push(
      { name: "V_peak", value: creditedClampV, unit: "V", estimated: false, source: "recorded clamp voltage: the clamp holds the collector/drain there" },
      { name: "V_supply", value: supply, unit: "V", estimated: false, source: "session supply voltage" },
    );
    notes.push(
      `Peak not measured: taken as the clamp's recorded ${formatVolts(creditedClampV)}, with nothing added for the clamp's own overshoot (its turn-on time and lead inductance); measure the collector/drain peak to include it.`,
    );
  } else {
    const estimate = estimatePeakSwitchVoltage({ supplyVoltageV: supply, topology: args.topology, clamped: args.clamped, factors: args.factors });
    inputs.push(
      { name: "V_peak", value: estimate.peakVoltageV, unit: "V", estimated: true, source: `estimated: ${estimate.factor} × supply (${estimate.basis})` },
      { name: "V_supply", value: supply, unit: "V", estimated: false, source: "session supply voltage" },
    );
    notes.push(
      `Peak not measured: estimated as ${estimate.factor} × the ${formatVolts(supply)} supply for a ${DRIVER_TOPOLOGY_LABELS[args.topology]}${
        args.topology === "single_switch" ? (args.clamped ? " with a clamp" : " without a clamp") : ""
      }. Measure the collector/drain peak to replace this estimate.`,
    );
    if (args.clamped && args.topology === "single_switch") {
      notes.push("A clamp is fitted but its voltage is not recorded: the peak is a rule-of-thumb multiple of the supply. Record the clamp voltage on the clamp component.");
    }
    if (args.clamped && args.topology !== "single_switch") {
      notes.push("The clamp is not credited for this topology: the estimate keeps the unclamped factor.");
    }
  }

  if (rating === undefined) {
    return reportUnknownMargin({
      kind: "voltage",
      formula,
      inputs,
      notes: [...notes, "The switch's voltage rating (V_CEO / V_DSS) is not recorded: add it to the switch component."],
    });
  }
  inputs.push({ name: "V_rating", value: rating, unit: "V", estimated: false, source: "switch datasheet rating" });
  const peak = inputs[0]!.value;
  return assessMargin({ kind: "voltage", value: peak, limit: rating, formula, inputs, notes, thinBelow });
}

function formatVolts(v: number): string {
  return `${Number(v.toPrecision(3))} V`;
}
