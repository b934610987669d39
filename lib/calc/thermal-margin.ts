/**
 * Thermal margin of the switching transistor for one run session: its dissipation against the
 * power it may dissipate at its case temperature, and its junction temperature against T_j,max.
 * Temperatures in °C, power in W, thermal resistances in K/W.
 */
import { deratedPower, junctionTemperature, junctionToCaseFromRating } from "./derating";
import { CalcInputError, requireFinite, requireInRange, requireNonNegative, requirePositive } from "./errors";
import { DEFAULT_MARGIN_THRESHOLDS, assessMargin, reportUnknownMargin, optionalNonNegative, optionalPositive, requireFiniteOrAbsent, type Margin, type MarginInput } from "./margin";

/**
 * Case-to-sink resistance assumed when none is recorded: between a greased TO-247 (about 0.24 K/W,
 * as International Rectifier datasheets list it — from memory) and a silicone pad (about 1 K/W)
 * (common practice). Flagged as an estimate wherever it is used.
 */
export const TYPICAL_CASE_TO_SINK_K_PER_W = 0.5;

/** Names of the thermal margin's inputs, for readers such as the clearance policy's junction rule. */
export const THERMAL_INPUT_NAMES = {
  junctionTemp: "T_j",
  maxJunctionTemp: "T_j,max",
  caseTemp: "T_case",
  sinkTemp: "T_sink",
  deratedPower: "P_derated",
  /** The junction at the recorded end of a run judged by its projection (T_j is then the projected one). */
  endJunctionTemp: "T_j,end",
} as const;

/** Where a run still warming up was heading, judged instead of its last reading. */
export interface SinkProjection {
  /** fit-upper-bound: the warm-up fit's steady state at its upper confidence bound; worst-case: no usable fit. */
  basis: "fit-upper-bound" | "worst-case";
  /** The sink temperature judged, °C. */
  sinkC: number;
  /** Where the figure comes from, in plain words. */
  source: string;
}

/**
 * The worst case a run with no usable warm-up fit is judged at: every watt drawn from the supply heating the sink,
 * P ≤ V·I (energy conservation: a switch cannot dissipate more than the driver draws — derived), carried to the
 * sink's steady state T = Ta + V·I·Rθsa (thermal chain, docs/references.md). Pessimistic by construction.
 */
export function worstCaseSinkProjection(args: { ambientTempC: number; supplyVoltageV: number; supplyCurrentA: number; sinkToAmbientKPerW: number; reason: string }): SinkProjection {
  const { sinkC, boundW } = worstCaseSink(args);
  return {
    basis: "worst-case",
    sinkC,
    source: `WORST CASE (${args.reason}): all ${Number(boundW.toFixed(1))} W drawn from the supply taken as heat in the sink, T_ambient + V·I·Rθsa`,
  };
}

/**
 * The same worst case as numbers only (the sink temperature, °C, and the V·I bound, W), for the headroom-only path
 * (session-headrooms.ts), which must not build the sentence for every older session of a health window.
 */
// T = Ta + V·I·Rθsa (energy conservation and the thermal chain, docs/references.md; as worstCaseSinkProjection).
export function worstCaseSink(args: { ambientTempC: number; supplyVoltageV: number; supplyCurrentA: number; sinkToAmbientKPerW: number }): { sinkC: number; boundW: number } {
  const ambient = requireFinite("ambientTempC", args.ambientTempC);
  const boundW = requirePositive("supplyVoltageV", args.supplyVoltageV) * requireNonNegative("supplyCurrentA", args.supplyCurrentA);
  return { sinkC: ambient + boundW * requirePositive("sinkToAmbientKPerW", args.sinkToAmbientKPerW), boundW };
}

/** Heat flowing through a heat sink (W) inferred from its rise over ambient, assuming it reached steady state. */
// P = (T_sink − T_ambient)/Rθsa: the sink stage of the thermal chain Tj = Ta + P·ΣRθ (docs/references.md), rearranged.
export function inferSinkDissipation(args: { sinkTempC: number; ambientTempC: number; sinkToAmbientKPerW: number }): number {
  const rise = requireFinite("sinkTempC", args.sinkTempC) - requireFinite("ambientTempC", args.ambientTempC);
  return Math.max(0, rise) / requirePositive("sinkToAmbientKPerW", args.sinkToAmbientKPerW);
}

export interface ThermalMarginArgs {
  ambientTempC: number;
  /** Heat-sink temperature at the end of the run. */
  heatSinkEndC?: number | null;
  /** Steady-state sink temperature fitted to the warm-up samples; used instead of the end temperature when given. */
  sinkSteadyStateC?: number | null;
  /** Where the run was heading; judged instead of both when given (the junction at the recorded end is reported too). */
  sinkProjection?: SinkProjection | null;
  /** Total heat into the sink, W, when entered; otherwise inferred from the sink's rise. */
  dissipationW?: number | null;
  sinkToAmbientKPerW?: number | null;
  /** Set when Rθsa is not the sink's own rating (e.g. a fan's factor): says where it came from and marks it estimated. */
  sinkToAmbientEstimate?: string | null;
  caseToSinkKPerW?: number | null;
  junctionToCaseKPerW?: number | null;
  /** Dissipation rating at 25 °C case, W. */
  ratedPowerW?: number | null;
  maxJunctionTempC?: number | null;
  /** Switches sharing the sink, each taking an equal share of its heat (default 1). */
  switchesOnSink?: number;
  thinBelowHeadroom?: number;
}

/**
 * Thermal margin. Two criteria, the tighter reported: P / P_derated(T_case) (linear derating) and
 * (T_j − T_ambient)/(T_j,max − T_ambient), the junction's rise as a share of the rise it is allowed.
 * Both reach zero headroom together when Rθjc is the one the rating implies; a datasheet Rθjc lower
 * than that makes the derating check the stricter, and the junction check catches a higher one.
 */
// Linear derating and the thermal chain: Toshiba permissible-dissipation FAQ; onsemi/Fairchild derating curves (docs/references.md).
export function assessThermalMargin(args: ThermalMarginArgs): Margin {
  const thinBelow = requireInRange("thinBelowHeadroom", args.thinBelowHeadroom ?? DEFAULT_MARGIN_THRESHOLDS.thermal, 0, 1);
  const ambient = requireFinite("ambientTempC", args.ambientTempC);
  const endTemp = requireFiniteOrAbsent("heatSinkEndC", args.heatSinkEndC);
  const steadyTemp = requireFiniteOrAbsent("sinkSteadyStateC", args.sinkSteadyStateC);
  const entered = optionalNonNegative("dissipationW", args.dissipationW);
  const rsa = optionalPositive("sinkToAmbientKPerW", args.sinkToAmbientKPerW);
  const rcsRecorded = optionalNonNegative("caseToSinkKPerW", args.caseToSinkKPerW);
  const rjcRecorded = optionalPositive("junctionToCaseKPerW", args.junctionToCaseKPerW);
  const ratedPower = optionalPositive("ratedPowerW", args.ratedPowerW);
  const maxJunction = requireFiniteOrAbsent("maxJunctionTempC", args.maxJunctionTempC);
  const switches = args.switchesOnSink ?? 1;
  if (!Number.isInteger(switches) || switches < 1) throw new CalcInputError("switchesOnSink", "a whole number of switches, at least 1", switches);
  if (maxJunction !== undefined && maxJunction <= ambient) {
    throw new CalcInputError("maxJunctionTempC", `a temperature above the ambient (${ambient} °C)`, maxJunction);
  }

  const inputs: MarginInput[] = [{ name: "T_ambient", value: ambient, unit: "°C", estimated: false, source: "session ambient temperature" }];
  const notes: string[] = [];
  const missing: string[] = [];

  const projection = args.sinkProjection ?? undefined;
  if (projection) requireFinite("sinkProjection.sinkC", projection.sinkC);
  let sinkTemp = projection?.sinkC ?? steadyTemp ?? endTemp;
  if (projection) {
    inputs.push({ name: THERMAL_INPUT_NAMES.sinkTemp, value: projection.sinkC, unit: "°C", estimated: true, source: projection.source });
    notes.push(
      projection.basis === "worst-case"
        ? `Judged at a WORST CASE sink temperature of ${celsius(projection.sinkC)}: ${projection.source}.`
        : `Judged where the run was heading: sink ${celsius(projection.sinkC)} (${projection.source})${endTemp === undefined ? "" : `, not the recorded end temperature ${celsius(endTemp)}`}.`,
    );
  } else if (sinkTemp !== undefined) {
    const fitted = steadyTemp !== undefined;
    inputs.push({ name: THERMAL_INPUT_NAMES.sinkTemp, value: sinkTemp, unit: "°C", estimated: fitted, source: fitted ? "fitted steady-state sink temperature" : "heat-sink temperature at the end of the run" });
    if (fitted && endTemp !== undefined) notes.push(`Using the fitted steady-state sink temperature (${celsius(steadyTemp)}) instead of the end temperature (${celsius(endTemp)}).`);
  }
  if (rsa !== undefined) {
    const estimate = args.sinkToAmbientEstimate ?? null;
    inputs.push({ name: "Rθsa", value: rsa, unit: "K/W", estimated: estimate !== null, source: estimate ?? "heat-sink rating, sink to ambient" });
  }

  let power: number | undefined;
  if (entered !== undefined) {
    power = entered;
    inputs.push({ name: "P", value: power, unit: "W", estimated: false, source: "entered dissipation into the sink" });
    if (sinkTemp === undefined && rsa !== undefined) {
      sinkTemp = ambient + power * rsa;
      inputs.push({ name: THERMAL_INPUT_NAMES.sinkTemp, value: sinkTemp, unit: "°C", estimated: true, source: "estimated: T_ambient + P·Rθsa at steady state" });
      notes.push("No sink temperature recorded: the steady-state sink temperature was computed from the dissipation and the sink's rating.");
    }
  } else if (sinkTemp !== undefined && rsa !== undefined) {
    power = inferSinkDissipation({ sinkTempC: sinkTemp, ambientTempC: ambient, sinkToAmbientKPerW: rsa });
    inputs.push({ name: "P", value: power, unit: "W", estimated: true, source: "inferred: (T_sink − T_ambient)/Rθsa" });
    notes.push(
      projection !== undefined
        ? "Dissipation inferred from the projected sink rise over ambient (ΔT∞/Rθsa), which corrects a run cut short of steady state for the heat still going into the sink's mass."
        : steadyTemp !== undefined
        ? "Dissipation inferred from the fitted steady-state sink rise over ambient."
        : "Dissipation inferred from the heat-sink rise over ambient assumes the sink reached steady state; a run shorter than a few sink time constants under-reads it.",
    );
    if (sinkTemp < ambient) notes.push("The sink ended below ambient: dissipation taken as 0 W; check the temperature readings.");
  } else {
    missing.push(
      "Dissipation unknown: record the heat-sink end temperature and the sink's thermal resistance (sink to ambient), or enter the dissipation.",
    );
  }
  if (sinkTemp === undefined && power !== undefined) missing.push("Heat-sink temperature unknown: record it, or the sink's thermal resistance (sink to ambient).");

  const switchPower = power === undefined ? undefined : power / switches;
  if (switchPower !== undefined && switches > 1) {
    inputs.push({ name: "P_switch", value: switchPower, unit: "W", estimated: true, source: `P shared equally by ${switches} switches on the sink` });
    notes.push(`The sink's heat is taken as shared equally by ${switches} switches.`);
  }

  const rcs = rcsRecorded ?? TYPICAL_CASE_TO_SINK_K_PER_W;
  inputs.push({ name: "Rθcs", value: rcs, unit: "K/W", estimated: rcsRecorded === undefined, source: rcsRecorded === undefined ? "assumed typical pad/grease value (not recorded)" : "recorded case-to-sink resistance" });
  if (rcsRecorded === undefined) notes.push(`Case-to-sink resistance not recorded: assumed ${TYPICAL_CASE_TO_SINK_K_PER_W} K/W.`);

  let rjc = rjcRecorded;
  if (rjc !== undefined) {
    inputs.push({ name: "Rθjc", value: rjc, unit: "K/W", estimated: false, source: "switch datasheet junction-to-case resistance" });
  } else if (ratedPower !== undefined && maxJunction !== undefined) {
    rjc = junctionToCaseFromRating({ ratedPower, maxJunctionTemp: maxJunction });
    inputs.push({ name: "Rθjc", value: rjc, unit: "K/W", estimated: true, source: "derived from the power rating: (T_j,max − 25 °C)/P25" });
    notes.push("Junction-to-case resistance not recorded: derived from the power rating and T_j,max.");
  }
  if (ratedPower !== undefined) inputs.push({ name: "P25", value: ratedPower, unit: "W", estimated: false, source: "switch datasheet dissipation at 25 °C case" });
  if (maxJunction !== undefined) {
    inputs.push({ name: THERMAL_INPUT_NAMES.maxJunctionTemp, value: maxJunction, unit: "°C", estimated: false, source: "switch datasheet maximum junction temperature" });
  } else {
    missing.push("The switch's maximum junction temperature (T_j,max) is not recorded: add it to the switch component.");
  }
  if (rjc === undefined && maxJunction !== undefined) {
    missing.push("Junction-to-case resistance unknown and no power rating to derive it from: record Rθjc or P25 for the switch.");
  }

  const candidates: { value: number; limit: number; formula: string }[] = [];
  if (sinkTemp !== undefined && switchPower !== undefined && maxJunction !== undefined) {
    const caseTemp = sinkTemp + switchPower * rcs;
    const estimatedCase = inputs.some((i) => i.estimated && ["P", "P_switch", "Rθcs", THERMAL_INPUT_NAMES.sinkTemp].includes(i.name));
    inputs.push({ name: THERMAL_INPUT_NAMES.caseTemp, value: caseTemp, unit: "°C", estimated: estimatedCase, source: "derived: T_sink + P·Rθcs" });
    if (ratedPower !== undefined) {
      const allowed = deratedPower({ ratedPower, maxJunctionTemp: maxJunction, caseTemp });
      inputs.push({ name: THERMAL_INPUT_NAMES.deratedPower, value: allowed, unit: "W", estimated: estimatedCase, source: "derived: linear derating of P25 at T_case" });
      if (allowed > 0) candidates.push({ value: switchPower, limit: allowed, formula: "P / P_derated(T_case)" });
      else notes.push("The case is at or above T_j,max: no dissipation is permissible.");
    } else {
      notes.push("No power rating (P25) recorded: the derated-power check is skipped.");
    }
    if (rjc !== undefined) {
      const tj = junctionTemperature({ referenceTemp: sinkTemp, power: switchPower, resistances: { junctionToCase: rjc, caseToSink: rcs } });
      inputs.push({
        name: THERMAL_INPUT_NAMES.junctionTemp,
        value: tj,
        unit: "°C",
        estimated: inputs.some((i) => i.estimated),
        source: projection ? "projected: T_sink (projected) + P·(Rθjc + Rθcs)" : "derived: T_sink + P·(Rθjc + Rθcs)",
      });
      if (projection && endTemp !== undefined) {
        const tjEnd = junctionTemperature({ referenceTemp: endTemp, power: switchPower, resistances: { junctionToCase: rjc, caseToSink: rcs } });
        inputs.push({ name: THERMAL_INPUT_NAMES.endJunctionTemp, value: tjEnd, unit: "°C", estimated: true, source: "at the recorded end: T_sink,end + P·(Rθjc + Rθcs)" });
        notes.push(`Projected junction temperature ${celsius(tj)}${tj > maxJunction ? `, above T_j,max ${celsius(maxJunction)}` : ""}; at the recorded end of the run it was ${celsius(tjEnd)}.`);
      }
      candidates.push({ value: tj - ambient, limit: maxJunction - ambient, formula: "(T_j − T_ambient) / (T_j,max − T_ambient)" });
    }
  }

  if (candidates.length === 0) {
    return reportUnknownMargin({ kind: "thermal", formula: "P / P_derated(T_case)", inputs, notes: [...notes, ...missing] });
  }
  const tightest = candidates.reduce((a, b) => (b.value / b.limit > a.value / a.limit ? b : a));
  return assessMargin({ kind: "thermal", ...tightest, inputs, notes: [...notes, ...missing], thinBelow });
}

function celsius(t: number): string {
  return `${Number(t.toFixed(1))} °C`;
}
