/**
 * The planner's engineering: what a build not yet wound is expected to do, composed from lib/calc.
 *
 * Each figure is worked out by one small function (planWinding, planFirstResonance, planBroadcastNote,
 * planVoltagePeak, planThermal) so a better model can replace one of them without touching the others.
 * Inputs are SI (m, V, A, W, K/W, kg), temperatures in °C. Pure TypeScript: no framework or database.
 */
import { broadcastBands, harmonicsInBroadcastBand, type NamedBroadcastBand, type BroadcastHarmonic, type ItuRegion } from "../calc/broadcast-band";
import { predictBuild } from "../calc/build-prediction";
import { DEFAULT_BUILD_TOLERANCES, PREDICTION_BAND_COVERAGE_FACTOR, predictFromGeometry, type BuildTolerances } from "../calc/prediction-band";
import { junctionTemperature, junctionToCaseFromRating } from "../calc/derating";
import type { DriverTopology } from "../calc/driver-topology";
import { CalcInputError } from "../calc/errors";
import { ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K, thermalTimeConstant, timeToReachTemperature, type HeatingCurve } from "../calc/heating";
import type { Margin, MarginStatus } from "../calc/margin";
import { closeWoundLength, closeWoundTurns, DEFAULT_INSULATION_BUILD_FACTOR } from "../calc/secondary-geometry";
import { assessThermalMargin, TYPICAL_CASE_TO_SINK_K_PER_W } from "../calc/thermal-margin";
import type { TopLoadShape } from "../calc/top-load";
import { assessVoltageMargin, estimatePeakSwitchVoltage } from "../calc/voltage-margin";

/** Coverage factor k = 2: about 95 % for a normal distribution (JCGM 100:2008, GUM §6.3). */
export const PLAN_COVERAGE_FACTOR = PREDICTION_BAND_COVERAGE_FACTOR;
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
  /** The region's broadcast bands (long wave in Region 1, medium wave everywhere). */
  bands: NamedBroadcastBand[];
  fundamentalInBand: boolean;
  /** Harmonics (fundamental included; even ones too, a single switch drives asymmetrically) that land in a band. */
  harmonics: BroadcastHarmonic[];
  /** The band the resonance's uncertainty band (low to high) reaches into, if any. */
  bandReached: NamedBroadcastBand | null;
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
 * The planned first resonance is the same geometry-only prediction every coil page shows (prediction-band.ts:
 * Nagaoka L, Medhurst C_self, the top load's free-space capacitance and the documented default surroundings
 * capacitance, with its GUM band from the input tolerances), so the coil's later sweeps are compared with
 * exactly what was planned. Wheeler's L and the winding's DC resistance (for the wire's material) come from
 * predictBuild beside it.
 */
export function planFirstResonance(
  input: Pick<BuildPlanInput, "formDiameterM" | "wireDiameterM" | "wireMaterial" | "topLoad">,
  winding: PlannedWinding,
  tolerances: BuildTolerances = DEFAULT_BUILD_TOLERANCES,
): PlannedResonance {
  const geometry = { formDiameter: input.formDiameterM, windingLength: winding.windingLengthM, turns: winding.turns, wireDiameter: input.wireDiameterM };
  const prediction = predictBuild({ ...geometry, wireMaterial: input.wireMaterial, topLoad: input.topLoad });
  const band = predictFromGeometry({ ...geometry, topLoad: input.topLoad }, tolerances);
  const f = band.firstResonance;
  return {
    inductanceH: band.inductance,
    wheelerInductanceH: prediction.wheelerInductance,
    wheelerDeviation: prediction.wheelerInductance / band.inductance - 1,
    selfCapacitanceF: band.selfCapacitance,
    topLoadCapacitanceF: band.topLoadCapacitance,
    totalCapacitanceF: band.selfCapacitance + band.topLoadCapacitance + band.environmentCapacitance,
    firstResonanceHz: f,
    relativeUncertainty: band.standardUncertainty / f,
    lowHz: band.low,
    highHz: band.high,
    dcResistanceOhm: prediction.dcResistance,
    basis: band.basis,
  };
}

/** The broadcast note for the policy's ITU region, every band of it (broadcast-band.ts, ITU RR Article 5). */
export function planBroadcastNote(resonance: Pick<PlannedResonance, "firstResonanceHz" | "lowHz" | "highHz">, region: ItuRegion): PlannedBroadcastNote {
  const bands = broadcastBands(region);
  const harmonics = harmonicsInBroadcastBand(resonance.firstResonanceHz, region);
  return {
    region,
    bands,
    fundamentalInBand: harmonics.some((h) => h.harmonic === 1),
    harmonics,
    bandReached: bands.find((band) => resonance.lowHz <= band.upperEdge && resonance.highHz >= band.lowerEdge) ?? null,
  };
}

/**
 * Expected collector/drain peak and its headroom against the rating, without and with a clamp, judged by the same
 * voltage margin a logged session gets (voltage-margin.ts): unclamped, the topology's rule of thumb; with a planned
 * clamp, the clamp's voltage (a clamped peak is the clamp's voltage); with none planned, the generic clamped rule of thumb.
 */
export function planVoltagePeak(input: Pick<BuildPlanInput, "supplyVoltageV" | "topology" | "clampVoltageV" | "transistor">, policy: Pick<PlanPolicy, "minVoltageHeadroom">): PlannedVoltage {
  const clampV = input.clampVoltageV ?? null;
  if (clampV !== null && clampV < input.supplyVoltageV) throw new CalcInputError("clampVoltageV", `a clamp voltage above the supply (${input.supplyVoltageV} V)`, clampV);
  const judge = (clamped: boolean, clampVoltageV: number | null, basis: (factor: number, estimateBasis: string) => string): PlannedVoltageCase => {
    const margin = assessVoltageMargin({
      voltageRatingV: input.transistor.voltageRatingV,
      supplyVoltageV: input.supplyVoltageV,
      topology: input.topology,
      clamped,
      clampVoltageV,
      thinBelowHeadroom: policy.minVoltageHeadroom,
    });
    if (margin.value === null || margin.headroom === null || margin.status === "unknown") {
      throw new CalcInputError("transistor.voltageRatingV", "a voltage rating to judge the planned peak against", input.transistor.voltageRatingV);
    }
    const estimate = estimatePeakSwitchVoltage({ supplyVoltageV: input.supplyVoltageV, topology: input.topology, clamped });
    return { peakV: margin.value, headroom: margin.headroom, status: margin.status, basis: basis(estimate.factor, estimate.basis) };
  };
  const unclamped = judge(false, null, (factor, basis) => `${factor} × supply: ${basis}`);
  if (clampV !== null) {
    return { unclamped, clamped: judge(true, clampV, () => "the planned clamp's voltage (a clamped peak is the clamp's voltage)"), clampPlanned: true };
  }
  return { unclamped, clamped: judge(true, null, (factor, basis) => `${factor} × supply: ${basis} (no clamp voltage planned)`), clampPlanned: false };
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
