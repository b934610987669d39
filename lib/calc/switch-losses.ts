/**
 * An independent estimate of one switch's dissipation, conduction plus switching, at the running
 * frequency, to cross-check the power inferred from the heat sink's rise (thermal-margin.ts). The two
 * rest on different records (the currents and the part's type versus the sink's temperatures and
 * Rθ), so when they disagree one of those records is likely wrong.
 *
 * Watts, amperes, volts, seconds, hertz throughout.
 */
import { CalcInputError, requireNonNegative, requirePositive } from "./errors";
import { requireFiniteOrAbsent, type MarginInput } from "./margin";

export type SwitchKind = "bjt" | "mosfet" | "igbt";

/** The loss parameters of a switch; the conduction one that applies depends on its kind. */
export interface SwitchLossParameters {
  /** MOSFET on-resistance R_DS(on), Ω. */
  onResistanceOhm?: number;
  /** BJT/IGBT collector–emitter saturation voltage V_CE(sat), V. */
  saturationVoltageV?: number;
  /** Turn-on crossover time (current rise plus voltage fall), s. */
  riseTimeS: number;
  /** Turn-off crossover time (voltage rise plus current fall), s. */
  fallTimeS: number;
}

/**
 * Typical values per switch kind for parts whose record does not carry them (common practice for
 * the TO-247 parts of 200–600 V small drivers use; every use is marked an estimate):
 * - MOSFET: R_DS(on) 0.2 Ω taken hot (datasheets quote 0.04–0.3 Ω at 25 °C, rising about 1.5–2× at a
 *   100 °C junction), crossover about 50 ns each way with a stiff gate drive.
 * - BJT: V_CE(sat) 1 V, crossover about 0.5 µs on and 1 µs off (storage and current fall of a
 *   saturated power transistor).
 * - IGBT: V_CE(sat) 2 V, about 100 ns on and 300 ns off (the tail current).
 */
export const TYPICAL_SWITCH_LOSS_PARAMETERS: Readonly<Record<SwitchKind, SwitchLossParameters>> = {
  mosfet: { onResistanceOhm: 0.2, riseTimeS: 50e-9, fallTimeS: 50e-9 },
  bjt: { saturationVoltageV: 1, riseTimeS: 0.5e-6, fallTimeS: 1e-6 },
  igbt: { saturationVoltageV: 2, riseTimeS: 100e-9, fallTimeS: 300e-9 },
};

function requireSwitchKind(kind: string): SwitchKind {
  if (kind !== "bjt" && kind !== "mosfet" && kind !== "igbt") throw new CalcInputError("switchType", "bjt, mosfet or igbt", kind);
  return kind;
}

/** Conduction loss of a MOSFET, W: its RMS current through the on-resistance. */
// P = I_rms²·R_DS(on) (Mohan, Undeland & Robbins, Power Electronics: Converters, Applications and Design, ch. 2 — from memory).
export function mosfetConductionLoss(rmsCurrentA: number, onResistanceOhm: number): number {
  const rms = requireNonNegative("rmsCurrentA", rmsCurrentA);
  return rms * rms * requirePositive("onResistanceOhm", onResistanceOhm);
}

/** Conduction loss of a BJT or IGBT, W: its average current through the saturation voltage. */
// P = V_CE(sat)·I_avg (Mohan, Undeland & Robbins, Power Electronics: Converters, Applications and Design, ch. 2 — from memory).
export function saturatedConductionLoss(averageCurrentA: number, saturationVoltageV: number): number {
  return requireNonNegative("averageCurrentA", averageCurrentA) * requirePositive("saturationVoltageV", saturationVoltageV);
}

/**
 * Switching loss, W, with linearised crossovers: during each crossover the current and the voltage
 * each swing linearly while the other sits at its full value (an inductive, clamped load), so each
 * edge dissipates ½·V·I·t_c. With the turn-on current I_on and the turn-off current I_off:
 *   P = ½·V·f·(I_on·t_r + I_off·t_f),
 * which is the textbook ½·V·I·(t_r + t_f)·f when I_on = I_off = I. A single switch's ramp starts near
 * zero current, so its turn-on edge costs little and the turn-off at I_pk dominates.
 */
// P_sw = ½·V·I·(t_c(on) + t_c(off))·f, the generic switch with linearised crossovers (Mohan, Undeland & Robbins, Power Electronics, ch. 2 — from memory).
export function switchingLoss(args: { switchingVoltageV: number; turnOnCurrentA: number; turnOffCurrentA: number; riseTimeS: number; fallTimeS: number; frequencyHz: number }): number {
  const voltage = requireNonNegative("switchingVoltageV", args.switchingVoltageV);
  const on = requireNonNegative("turnOnCurrentA", args.turnOnCurrentA);
  const off = requireNonNegative("turnOffCurrentA", args.turnOffCurrentA);
  const rise = requireNonNegative("riseTimeS", args.riseTimeS);
  const fall = requireNonNegative("fallTimeS", args.fallTimeS);
  const frequency = requirePositive("frequencyHz", args.frequencyHz);
  if ((rise + fall) * frequency >= 1) {
    throw new CalcInputError("frequencyHz", `a period longer than the switching times (${(rise + fall) * 1e9} ns)`, frequency);
  }
  return 0.5 * voltage * frequency * (on * rise + off * fall);
}

export interface SwitchLossEstimate {
  conductionW: number;
  switchingW: number;
  totalW: number;
  /** Every quantity used, marked estimated where it is a typical value or inferred. */
  inputs: MarginInput[];
  notes: string[];
}

/**
 * One switch's conduction + switching loss at the running frequency. Parameters not given (null or
 * absent) take TYPICAL_SWITCH_LOSS_PARAMETERS for the kind and are marked estimates; so are the
 * currents, which the caller infers from the average supply current.
 */
// Conduction and switching formulas above (Mohan, Undeland & Robbins, Power Electronics, from memory).
export function estimateSwitchLosses(args: {
  switchType: string;
  frequencyHz: number;
  /** Voltage across the switch while it turns on and off, V (the supply for a single switch or a bridge leg). */
  switchingVoltageV: number;
  rmsCurrentA: number;
  averageCurrentA: number;
  turnOnCurrentA: number;
  turnOffCurrentA: number;
  onResistanceOhm?: number | null;
  saturationVoltageV?: number | null;
  riseTimeS?: number | null;
  fallTimeS?: number | null;
}): SwitchLossEstimate {
  const kind = requireSwitchKind(args.switchType);
  const typical = TYPICAL_SWITCH_LOSS_PARAMETERS[kind];
  const inputs: MarginInput[] = [];
  const notes: string[] = [];
  const pick = (name: string, unit: string, field: "onResistanceOhm" | "saturationVoltageV" | "riseTimeS" | "fallTimeS", label: string): number => {
    const recorded = requireFiniteOrAbsent(field, args[field]);
    const value = recorded ?? typical[field];
    if (value === undefined) throw new CalcInputError(field, `a value for a ${kind}`, "none");
    inputs.push({ name, value, unit, estimated: recorded === undefined, source: recorded === undefined ? `typical ${kind} ${label} (not recorded)` : `recorded ${label}` });
    if (recorded === undefined) notes.push(`${label[0]!.toUpperCase()}${label.slice(1)} not recorded: a typical ${kind} value is used.`);
    return value;
  };

  inputs.push(
    { name: "f", value: requirePositive("frequencyHz", args.frequencyHz), unit: "Hz", estimated: false, source: "running frequency" },
    { name: "I_rms", value: requireNonNegative("rmsCurrentA", args.rmsCurrentA), unit: "A", estimated: true, source: "inferred from the average supply current" },
  );
  let conductionW: number;
  if (kind === "mosfet") {
    conductionW = mosfetConductionLoss(args.rmsCurrentA, pick("R_DS(on)", "Ω", "onResistanceOhm", "on-resistance"));
  } else {
    inputs.push({ name: "I_avg", value: requireNonNegative("averageCurrentA", args.averageCurrentA), unit: "A", estimated: true, source: "inferred from the average supply current" });
    conductionW = saturatedConductionLoss(args.averageCurrentA, pick("V_CE(sat)", "V", "saturationVoltageV", "saturation voltage"));
  }
  const riseTimeS = pick("t_r", "s", "riseTimeS", "turn-on time");
  const fallTimeS = pick("t_f", "s", "fallTimeS", "turn-off time");
  inputs.push(
    { name: "V_sw", value: requireNonNegative("switchingVoltageV", args.switchingVoltageV), unit: "V", estimated: false, source: "voltage across the switch while it switches" },
    { name: "I_off", value: requireNonNegative("turnOffCurrentA", args.turnOffCurrentA), unit: "A", estimated: true, source: "current at turn-off, inferred" },
  );
  const switchingW = switchingLoss({ ...args, riseTimeS, fallTimeS });
  return { conductionW, switchingW, totalW: conductionW + switchingW, inputs, notes };
}

/** Ratio beyond which the two power figures are said to disagree: typical parameters are good to about ±50 % (common practice). */
export const POWER_AGREEMENT_FACTOR = 2;

export interface PowerCrossCheck {
  /** Larger over smaller of the two figures; null when one of them is zero. */
  ratio: number | null;
  agrees: boolean;
  factor: number;
  /** "agrees within ×2", or "disagrees: …" with what to check. */
  verdict: string;
}

/** Compares the loss estimate with the power inferred from the sink: agreement within a factor either way. */
// Ratio test max/min ≤ factor (derived); the factor is common practice for typical-value loss estimates.
export function crossCheckSinkPower(args: { estimatedW: number; sinkInferredW: number; factor?: number }): PowerCrossCheck {
  const estimated = requireNonNegative("estimatedW", args.estimatedW);
  const sink = requireNonNegative("sinkInferredW", args.sinkInferredW);
  const factor = args.factor ?? POWER_AGREEMENT_FACTOR;
  if (!(factor >= 1 && Number.isFinite(factor))) throw new CalcInputError("factor", "a finite factor of at least 1", factor);
  const low = Math.min(estimated, sink);
  const ratio = low > 0 ? Math.max(estimated, sink) / low : estimated === sink ? 1 : null;
  const agrees = ratio !== null && ratio <= factor;
  const direction = sink > estimated ? "the sink reads more heat than the estimate" : "the sink reads less heat than the estimate";
  return {
    ratio,
    agrees,
    factor,
    verdict: agrees
      ? `agrees within ×${factor}`
      : `disagrees${ratio === null ? "" : ` (×${Number(ratio.toPrecision(2))})`}: ${direction}; check the sink's Rθ or the recorded current`,
  };
}
