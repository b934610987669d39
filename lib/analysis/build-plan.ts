/**
 * The planner's engineering: what a build not yet wound is expected to do, composed from lib/calc.
 *
 * Each figure is worked out by one small function (planWinding, planFirstResonance, planBroadcastNote,
 * planVoltagePeak, planThermal) so a better model can replace one of them without touching the others.
 * Inputs are SI (m, V, A, W, K/W, kg), temperatures in °C. Pure TypeScript: no framework or database.
 */
import { broadcastBand, harmonicsInBroadcastBand, type BroadcastBand, type BroadcastHarmonic, type ItuRegion } from "../calc/broadcast-band";
import { predictBuild } from "../calc/build-prediction";
import { COPPER_RESISTIVITY_20C_OHM_M } from "../calc/constants";
import { junctionTemperature, junctionToCaseFromRating } from "../calc/derating";
import type { DriverTopology } from "../calc/driver-topology";
import { CalcInputError } from "../calc/errors";
import { ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K, thermalTimeConstant, timeToReachTemperature, type HeatingCurve } from "../calc/heating";
import { classifyHeadroom, type Margin, type MarginStatus } from "../calc/margin";
import { closeWoundLength, closeWoundTurns, DEFAULT_INSULATION_BUILD_FACTOR } from "../calc/secondary-geometry";
import { assessThermalMargin, TYPICAL_CASE_TO_SINK_K_PER_W } from "../calc/thermal-margin";
import type { TopLoadShape } from "../calc/top-load";
import { estimatePeakSwitchVoltage } from "../calc/voltage-margin";

/**
 * Resistivity of aluminium conductor wire at 20 °C, Ω·m: 0.028264 Ω·mm²/m (IEC 60889 hard-drawn aluminium,
 * from memory). Used only for the winding's DC resistance shown beside the plan.
 */
export const ALUMINIUM_RESISTIVITY_20C_OHM_M = 2.8264e-8;

/**
 * Default relative standard uncertainties of the lumped model's L and C for a coil not yet built.
 * L: 2 % for the winding as it will really come out (form diameter, turns, length; common practice).
 * C: 15 %, the middle of the ±10–20 % docs/references.md gives for Medhurst's C paired with L on a base-grounded coil,
 * which also has to cover a mounted top load differing from its free-space value.
 */
export const PLAN_DEFAULT_RELATIVE_UNCERTAINTY = { inductance: 0.02, capacitance: 0.15 } as const;
/** Coverage factor k = 2: about 95 % for a normal distribution (JCGM 100:2008, GUM §6.3). */
export const PLAN_COVERAGE_FACTOR = 2;
/** Share of the supply's input power assumed to be dissipated in the switch when the member states none (common practice). */
export const DEFAULT_SWITCH_LOSS_FRACTION = 0.1;

export interface PlannedTransistor {
  voltageRatingV: number;
  continuousCurrentA?: number | null;
  peakCurrentA?: number | null;
  powerRating25CW: number;
  maxJunctionTempC: number;
  /** Datasheet Rθjc; when absent, the value the power rating implies. */
  thermalResistanceJcKPerW?: number | null;
  /** Pad or grease; when absent, TYPICAL_CASE_TO_SINK_K_PER_W, flagged as an estimate. */
  caseToSinkKPerW?: number | null;
}

export interface PlannedHeatSink {
  sinkThermalResistanceKPerW: number;
  /** Needed for the warm-up time constant; without it the longest run is not worked out. */
  sinkMassKg?: number | null;
}

export interface BuildPlanInput {
  formDiameterM: number;
  /** Bare conductor diameter, m. */
  wireDiameterM: number;
  wireMaterial: "copper" | "aluminium";
  /** Give turns, winding length, or both; a missing one is derived from close winding. */
  turns?: number | null;
  windingLengthM?: number | null;
  topLoad: TopLoadShape | null;
  topology: DriverTopology;
  supplyVoltageV: number;
  /** Expected average supply current, A. */
  supplyCurrentA?: number | null;
  /** Share of the input power dissipated in the one switch; DEFAULT_SWITCH_LOSS_FRACTION when absent. */
  switchLossFraction?: number | null;
  ambientTempC: number;
  transistor: PlannedTransistor;
  heatSink: PlannedHeatSink;
  /** Clamp voltage when the driver has a clamp; null for none. */
  clampVoltageV?: number | null;
}

/** The lending policy's figures the plan is judged by. */
export interface PlanPolicy {
  ituRegion: ItuRegion;
  minVoltageHeadroom: number;
  minThermalHeadroom: number;
  minJunctionMarginK: number;
}

export interface PlannedWinding {
  turns: number;
  windingLengthM: number;
  /** Which of the two was derived from close winding (turns = length / pitch), if any. */
  derived: "turns" | "windingLength" | null;
  /** Wire pitch of a close winding, m: bare diameter × the enamel's build factor. */
  closeWoundPitchM: number;
}

export interface PlannedResonance {
  inductanceH: number;
  wheelerInductanceH: number;
  /** (Wheeler − Nagaoka)/Nagaoka. */
  wheelerDeviation: number;
  selfCapacitanceF: number;
  topLoadCapacitanceF: number;
  totalCapacitanceF: number;
  firstResonanceHz: number;
  /** Relative standard uncertainty of f: ½√(u_L² + u_C²). */
  relativeUncertainty: number;
  lowHz: number;
  highHz: number;
  dcResistanceOhm: number;
  basis: string[];
}

export interface PlannedBroadcastNote {
  region: ItuRegion;
  band: BroadcastBand;
  fundamentalInBand: boolean;
  /** Odd harmonics (fundamental included) of the planned resonance that land in the band. */
  harmonics: BroadcastHarmonic[];
  /** Whether the resonance band (low to high) overlaps the broadcast band. */
  bandOverlaps: boolean;
}

export interface PlannedVoltageCase {
  peakV: number;
  headroom: number;
  status: Exclude<MarginStatus, "unknown">;
  basis: string;
}

export interface PlannedVoltage {
  unclamped: PlannedVoltageCase;
  /** With the planned clamp (its voltage), or with a generic clamp (rule of thumb) when none is planned. */
  clamped: PlannedVoltageCase;
  clampPlanned: boolean;
}

export interface PlannedThermal {
  /** Dissipation in the switch, W; null when no supply current was given. */
  dissipationW: number | null;
  dissipationBasis: string;
  /** Junction limit used: the stricter of T_j,max − the policy's junction margin and the policy's thermal headroom. */
  junctionLimitC: number;
  /** Steady junction temperature Tj = Ta + P·ΣRθ, °C; null without a dissipation. */
  steadyJunctionC: number | null;
  /** The team's thermal check at the steady state. */
  margin: Margin;
  /** Largest dissipation that keeps the steady junction at the limit, W. */
  allowedSteadyDissipationW: number;
  /** Heat-sink time constant τ = Rθsa·m·c, s; null without the sink's mass. */
  timeConstantS: number | null;
  /** Longest run before the junction reaches its limit, s: Infinity when the steady state stays under it; null when unknown. */
  longestRunS: number | null;
  notes: string[];
}

export interface BuildPlanResult {
  winding: PlannedWinding;
  resonance: PlannedResonance;
  broadcast: PlannedBroadcastNote;
  voltage: PlannedVoltage;
  thermal: PlannedThermal;
}

/** Turns from winding length or winding length from turns, by close winding (secondary-geometry.ts). */
export function planWinding(input: Pick<BuildPlanInput, "turns" | "windingLengthM" | "wireDiameterM">): PlannedWinding {
  const pitch = input.wireDiameterM * DEFAULT_INSULATION_BUILD_FACTOR;
  const turns = input.turns ?? null;
  const length = input.windingLengthM ?? null;
  if (turns !== null && length !== null) return { turns, windingLengthM: length, derived: null, closeWoundPitchM: pitch };
  if (length !== null) {
    // A part turn is not a turn: round down, as the coil form does.
    const derived = Math.floor(closeWoundTurns({ windingLength: length, wireDiameter: input.wireDiameterM }));
    if (derived < 1) throw new CalcInputError("windingLengthM", "a winding long enough for at least one turn of this wire", length);
    return { turns: derived, windingLengthM: length, derived: "turns", closeWoundPitchM: pitch };
  }
  if (turns !== null) {
    return { turns, windingLengthM: closeWoundLength({ turns, wireDiameter: input.wireDiameterM }), derived: "windingLength", closeWoundPitchM: pitch };
  }
  throw new CalcInputError("turns", "turns or a winding length (the other is derived from close winding)", "neither");
}

/**
 * First resonance of the lumped model (Nagaoka L, Medhurst C_self, free-space top load; build-prediction.ts) with a
 * band from default input tolerances. f = 1/(2π√(LC)), so by the law of propagation of uncertainty (GUM, JCGM 100:2008
 * §5.1, relative form for a product of powers) u_f/f = ½√((u_L/L)² + (u_C/C)²); the band is f(1 ± k·u_f/f), k = 2.
 * No surroundings capacitance is added: the band is meant to cover it until the coil's own sweeps calibrate one.
 */
export function planFirstResonance(
  input: Pick<BuildPlanInput, "formDiameterM" | "wireDiameterM" | "wireMaterial" | "topLoad">,
  winding: PlannedWinding,
  uncertainty: { inductance: number; capacitance: number } = PLAN_DEFAULT_RELATIVE_UNCERTAINTY,
): PlannedResonance {
  const prediction = predictBuild({
    formDiameter: input.formDiameterM,
    windingLength: winding.windingLengthM,
    turns: winding.turns,
    wireDiameter: input.wireDiameterM,
    resistivity: input.wireMaterial === "aluminium" ? ALUMINIUM_RESISTIVITY_20C_OHM_M : COPPER_RESISTIVITY_20C_OHM_M,
    topLoad: input.topLoad,
  });
  const relative = 0.5 * Math.hypot(uncertainty.inductance, uncertainty.capacitance);
  const f = prediction.firstResonance;
  return {
    inductanceH: prediction.inductance,
    wheelerInductanceH: prediction.wheelerInductance,
    wheelerDeviation: prediction.wheelerInductance / prediction.inductance - 1,
    selfCapacitanceF: prediction.selfCapacitance,
    topLoadCapacitanceF: prediction.topLoadCapacitance,
    totalCapacitanceF: prediction.totalCapacitance,
    firstResonanceHz: f,
    relativeUncertainty: relative,
    lowHz: f * (1 - PLAN_COVERAGE_FACTOR * relative),
    highHz: f * (1 + PLAN_COVERAGE_FACTOR * relative),
    dcResistanceOhm: prediction.dcResistance,
    basis: [
      `Band: ±${Math.round(PLAN_COVERAGE_FACTOR * relative * 1000) / 10} % (k = ${PLAN_COVERAGE_FACTOR}) from assumed uncertainties of ${uncertainty.inductance * 100} % on L and ${uncertainty.capacitance * 100} % on C, combined per the GUM.`,
      "No capacitance of the surroundings is added: a coil on a bench usually resonates lower than this figure; its sweeps will calibrate that.",
      ...prediction.assumptions.filter((line) => !line.startsWith("No environment capacitance")),
    ],
  };
}

/** The medium-wave broadcast note for the policy's ITU region (broadcast-band.ts, ITU RR Article 5). */
export function planBroadcastNote(resonance: Pick<PlannedResonance, "firstResonanceHz" | "lowHz" | "highHz">, region: ItuRegion): PlannedBroadcastNote {
  const band = broadcastBand(region);
  const harmonics = harmonicsInBroadcastBand(resonance.firstResonanceHz, region);
  return {
    region,
    band,
    fundamentalInBand: harmonics.some((h) => h.harmonic === 1),
    harmonics,
    bandOverlaps: resonance.lowHz <= band.upperEdge && resonance.highHz >= band.lowerEdge,
  };
}

/**
 * Expected collector/drain peak and its headroom against the rating, without and with a clamp. Unclamped: the
 * topology's rule of thumb (voltage-margin.ts). Clamped: a planned clamp holds the peak at its clamp voltage, taken
 * as the peak even when the unclamped rule of thumb is lower (the clamp is set where the spike is expected to reach);
 * with no clamp planned, the generic clamped rule of thumb.
 */
export function planVoltagePeak(input: Pick<BuildPlanInput, "supplyVoltageV" | "topology" | "clampVoltageV" | "transistor">, policy: Pick<PlanPolicy, "minVoltageHeadroom">): PlannedVoltage {
  const rating = input.transistor.voltageRatingV;
  const judge = (peakV: number, basis: string): PlannedVoltageCase => {
    const headroom = 1 - peakV / rating;
    return { peakV, headroom, status: classifyHeadroom(headroom, policy.minVoltageHeadroom), basis };
  };
  const unclampedEstimate = estimatePeakSwitchVoltage({ supplyVoltageV: input.supplyVoltageV, topology: input.topology, clamped: false });
  const unclamped = judge(unclampedEstimate.peakVoltageV, `${unclampedEstimate.factor} × supply: ${unclampedEstimate.basis}`);
  const clampV = input.clampVoltageV ?? null;
  if (clampV !== null) {
    if (clampV < input.supplyVoltageV) throw new CalcInputError("clampVoltageV", `a clamp voltage above the supply (${input.supplyVoltageV} V)`, clampV);
    return { unclamped, clamped: judge(clampV, "the planned clamp's voltage (a clamped peak is the clamp's voltage)"), clampPlanned: true };
  }
  const generic = estimatePeakSwitchVoltage({ supplyVoltageV: input.supplyVoltageV, topology: input.topology, clamped: true });
  return { unclamped, clamped: judge(generic.peakVoltageV, `${generic.factor} × supply: ${generic.basis} (no clamp voltage planned)`), clampPlanned: false };
}

/**
 * Steady junction temperature and the longest run under the junction limit. Thermal chain Tj = Ta + P·ΣRθ (derating.ts);
 * the team's thermal check (thermal-margin.ts); warm-up of the sink by the first-order model with τ = Rθsa·m·c
 * (heating.ts). The junction and case stages settle in seconds, far faster than the sink, so the junction follows the sink
 * offset by P·(Rθjc + Rθcs): the time to the limit is t = −τ ln(1 − (T_lim − Ta − P·(Rθjc + Rθcs))/(P·Rθsa))
 * (docs/references.md, "Heat sink warm-up").
 */
export function planThermal(
  input: Pick<BuildPlanInput, "supplyVoltageV" | "supplyCurrentA" | "switchLossFraction" | "ambientTempC" | "transistor" | "heatSink">,
  policy: Pick<PlanPolicy, "minThermalHeadroom" | "minJunctionMarginK">,
): PlannedThermal {
  const t = input.transistor;
  const notes: string[] = [];
  const ambient = input.ambientTempC;
  if (!(t.maxJunctionTempC > ambient)) throw new CalcInputError("maxJunctionTempC", `a temperature above the ambient (${ambient} °C)`, t.maxJunctionTempC);
  const rjc = t.thermalResistanceJcKPerW ?? junctionToCaseFromRating({ ratedPower: t.powerRating25CW, maxJunctionTemp: t.maxJunctionTempC });
  if (t.thermalResistanceJcKPerW == null) notes.push(`Rθjc not given: ${round(rjc, 3)} K/W, the value the power rating implies.`);
  const rcs = t.caseToSinkKPerW ?? TYPICAL_CASE_TO_SINK_K_PER_W;
  if (t.caseToSinkKPerW == null) notes.push(`Case-to-sink not given: ${rcs} K/W assumed (between grease and a pad).`);
  const rsa = input.heatSink.sinkThermalResistanceKPerW;
  const totalR = rjc + rcs + rsa;
  const junctionLimitC = Math.min(t.maxJunctionTempC - policy.minJunctionMarginK, ambient + (1 - policy.minThermalHeadroom) * (t.maxJunctionTempC - ambient));
  if (!(junctionLimitC > ambient)) throw new CalcInputError("ambientTempC", `an ambient below the junction limit (${round(junctionLimitC, 1)} °C)`, ambient);
  const allowedSteadyDissipationW = (junctionLimitC - ambient) / totalR;
  const lossFraction = input.switchLossFraction ?? DEFAULT_SWITCH_LOSS_FRACTION;
  const tau = input.heatSink.sinkMassKg == null ? null : thermalTimeConstant({ thermalResistance: rsa, mass: input.heatSink.sinkMassKg, specificHeat: ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K });
  if (tau === null) notes.push("No heat-sink mass: the warm-up time constant, and so the longest run, cannot be worked out.");

  const current = input.supplyCurrentA ?? null;
  if (current === null) {
    const equivalentCurrent = allowedSteadyDissipationW / (lossFraction * input.supplyVoltageV);
    notes.push(
      `No supply current given: at ${Math.round(lossFraction * 100)} % of the input lost in the switch, the junction stays under its limit in steady state up to about ${round(equivalentCurrent, 2)} A average supply current.`,
    );
    return {
      dissipationW: null,
      dissipationBasis: "no supply current given",
      junctionLimitC,
      steadyJunctionC: null,
      margin: assessThermalMargin({ ambientTempC: ambient, sinkToAmbientKPerW: rsa, caseToSinkKPerW: rcs, junctionToCaseKPerW: rjc, ratedPowerW: t.powerRating25CW, maxJunctionTempC: t.maxJunctionTempC, thinBelowHeadroom: policy.minThermalHeadroom }),
      allowedSteadyDissipationW,
      timeConstantS: tau,
      longestRunS: null,
      notes,
    };
  }
  const power = lossFraction * input.supplyVoltageV * current;
  const dissipationBasis = `${Math.round(lossFraction * 1000) / 10} % of ${round(input.supplyVoltageV * current, 1)} W input (${input.supplyVoltageV} V × ${current} A)${input.switchLossFraction == null ? ", the planner's default share" : ""}`;
  const steadyJunctionC = junctionTemperature({ referenceTemp: ambient, power, resistances: { junctionToCase: rjc, caseToSink: rcs, sinkToAmbient: rsa } });
  const margin = assessThermalMargin({
    ambientTempC: ambient,
    dissipationW: power,
    sinkToAmbientKPerW: rsa,
    caseToSinkKPerW: rcs,
    junctionToCaseKPerW: rjc,
    ratedPowerW: t.powerRating25CW,
    maxJunctionTempC: t.maxJunctionTempC,
    thinBelowHeadroom: policy.minThermalHeadroom,
  });
  let longestRunS: number | null = null;
  if (steadyJunctionC <= junctionLimitC) longestRunS = Number.POSITIVE_INFINITY;
  else if (tau !== null) longestRunS = timeToReachTemperature(modelledJunctionCurve(ambient + power * (rjc + rcs), power * rsa, tau), junctionLimitC);
  return { dissipationW: power, dissipationBasis, junctionLimitC, steadyJunctionC, margin, allowedSteadyDissipationW, timeConstantS: tau, longestRunS, notes };
}

/** The junction's first-order warm-up as a HeatingCurve, built from the model (not fitted), so heating.ts's timeToReachTemperature applies. */
function modelledJunctionCurve(startC: number, riseK: number, timeConstantS: number): HeatingCurve {
  return {
    ambient: startC,
    rise: riseK,
    timeConstant: timeConstantS,
    steadyState: startC + riseK,
    rSquared: 1,
    residualStd: 0,
    standardErrors: { ambient: 0, rise: 0, timeConstant: 0, steadyState: 0 },
    duration: 0,
    extrapolation: "reliable",
    explanation: "Modelled from the planned parts, not fitted to a run.",
  };
}

/** Everything the planner shows for one variant. */
export function planBuild(input: BuildPlanInput, policy: PlanPolicy): BuildPlanResult {
  const winding = planWinding(input);
  const resonance = planFirstResonance(input, winding);
  return {
    winding,
    resonance,
    broadcast: planBroadcastNote(resonance, policy.ituRegion),
    voltage: planVoltagePeak(input, policy),
    thermal: planThermal(input, policy),
  };
}

function round(value: number, digits: number): number {
  const scale = 10 ** digits;
  return Math.round(value * scale) / scale;
}
