/**
 * A coil's first series resonance predicted from its geometry and parts alone, with an uncertainty band.
 *
 * Nothing measured on the coil enters: Nagaoka inductance, Medhurst self-capacitance, the top load's
 * free-space capacitance and a default estimate of what the surroundings add (the environment term),
 * f = 1/(2π√(L·C)) (Thomson's formula). The band propagates the inputs' tolerances by the GUM's law of
 * propagation of uncertainty (JCGM 100:2008, docs/references.md) with numerical sensitivities; the
 * expanded band is ±k·u_c with k = 2 (about 95 % for a near-normal result, JCGM 100:2008 §6.3).
 */
import { CalcInputError, requireNonNegative, requirePositive } from "./errors";
import { predictBuild, type TopLoadSpec } from "./build-prediction";
import { solenoidInductance } from "./inductance";
import { resonantFrequency } from "./resonance";
import { medhurstSelfCapacitance } from "./self-capacitance";
import { propagateUncertainty, rectangularStandardUncertainty, type UncertaintyContribution } from "./uncertainty-propagation";

/**
 * Default estimate of the environment capacitance of a small bench secondary, F: 3 pF, standard
 * uncertainty 2 pF. common practice: a base-grounded secondary a metre or so from walls, on a bench, with
 * leads and people around picks up a few picofarads beyond its free-space figures; the spread covers a
 * bare room to a crowded bench (docs/references.md, "Honest prediction and uncertainty").
 */
export const DEFAULT_ENVIRONMENT_CAPACITANCE_F = 3e-12;

/** Standard uncertainties of a build's inputs: relative (fractions) for sizes and counts, farads for the environment. */
export interface BuildTolerances {
  readonly formDiameter: number;
  readonly windingLength: number;
  readonly turns: number;
  readonly wireDiameter: number;
  /** Relative uncertainty of the top load's size (its capacitance scales with size). */
  readonly topLoadSize: number;
  /** Standard uncertainty of the environment capacitance, F. */
  readonly environmentCapacitance: number;
  /** Relative uncertainty of the lumped capacitance models themselves (Medhurst + free-space top load). */
  readonly capacitanceModel: number;
}

/** Default standard uncertainties, each with where it comes from (shown beside the band). */
export const DEFAULT_BUILD_TOLERANCES: BuildTolerances = {
  formDiameter: 0.005,
  windingLength: 0.01,
  turns: 0.005,
  wireDiameter: 0.01,
  topLoadSize: 0.02,
  environmentCapacitance: 2e-12,
  // Knight 2016 (docs/references.md): the lumped pairing is typically within ±10–20 %; ±15 % taken as a rectangular bound.
  capacitanceModel: rectangularStandardUncertainty(0.15),
};

export const BUILD_TOLERANCE_SOURCES: Readonly<Record<keyof BuildTolerances, string>> = {
  formDiameter: "0.5 % — pipe and tube outside diameters as bought (common practice)",
  windingLength: "1 % — a winding measured with a rule, about ±2 mm on 200 mm (common practice)",
  turns: "0.5 % — turns counted or worked out from the length and the wire (common practice)",
  wireDiameter: "1 % — enamelled wire's bare diameter against its nominal size (from memory)",
  topLoadSize: "2 % — a spun or hand-made top load against its drawing (common practice)",
  environmentCapacitance: "2 pF around a default of 3 pF — what a bench, walls, leads and people add to a small secondary (common practice)",
  capacitanceModel: "±15 % as a rectangular bound (8.7 % standard) — Medhurst's capacitance paired with L for a base-grounded coil, plus a top load mounted rather than isolated (Knight 2016)",
};

/** Coverage factor of the band (JCGM 100:2008 §6.3: k = 2 gives about 95 % for a near-normal result). */
export const PREDICTION_BAND_COVERAGE_FACTOR = 2;

export interface GeometryOnlyBuild {
  /** Outside diameter of the coil form, m. */
  readonly formDiameter: number;
  /** Axial length of the winding, m. */
  readonly windingLength: number;
  readonly turns: number;
  /** Bare wire diameter, m. */
  readonly wireDiameter: number;
  readonly topLoad: TopLoadSpec | null;
}

export interface GeometryOnlyPrediction {
  /** Nominal first series resonance, Hz. */
  readonly firstResonance: number;
  /** Combined standard uncertainty, Hz. */
  readonly standardUncertainty: number;
  /** Band low and high ends, Hz (nominal ∓ k·u_c). */
  readonly low: number;
  readonly high: number;
  readonly coverageFactor: number;
  readonly inductance: number;
  readonly selfCapacitance: number;
  readonly topLoadCapacitance: number;
  readonly environmentCapacitance: number;
  /** Each input's share of the uncertainty, Hz, largest first. */
  readonly contributions: UncertaintyContribution[];
  /** The basis in plain words. */
  readonly basis: string[];
}

function requireTolerances(tolerances: BuildTolerances): void {
  for (const [name, value] of Object.entries(tolerances)) requireNonNegative(`tolerances.${name}`, value);
  if (tolerances.capacitanceModel >= 1) throw new CalcInputError("tolerances.capacitanceModel", "a relative uncertainty below 1", tolerances.capacitanceModel);
}

/**
 * First series resonance from geometry and parts alone, with its GUM band (JCGM 100:2008 eq. 10, numerical
 * sensitivities): inputs are the form diameter, winding length, turns, wire diameter, top-load size, the
 * default environment capacitance and the capacitance models' own uncertainty. Throws CalcInputError for a
 * build the models refuse (the same checks as predictBuild).
 */
export function predictFromGeometry(build: GeometryOnlyBuild, tolerances: BuildTolerances = DEFAULT_BUILD_TOLERANCES): GeometryOnlyPrediction {
  requireTolerances(tolerances);
  // predictBuild validates the build (single layer, Medhurst's range, the top load's shape) and gives the nominal parts.
  const nominal = predictBuild({ ...build, environmentCapacitance: DEFAULT_ENVIRONMENT_CAPACITANCE_F });
  const topLoadCapacitance = nominal.topLoadCapacitance;

  // The model is evaluated without predictBuild's single-layer check, which a close-wound coil sits on the edge of.
  const model = ([form, length, turns, wire, topLoadScale, environment, capacitanceScale]: readonly number[]) => {
    const diameter = form! + wire!;
    const inductance = solenoidInductance({ diameter, length: length!, turns: turns! });
    const capacitance = capacitanceScale! * (medhurstSelfCapacitance({ diameter, length: length! }) + topLoadCapacitance * topLoadScale!) + environment!;
    return resonantFrequency(inductance, requirePositive("environmentCapacitance", capacitance));
  };
  const inputs = [
    { name: "formDiameter", value: build.formDiameter, standardUncertainty: tolerances.formDiameter * build.formDiameter },
    { name: "windingLength", value: build.windingLength, standardUncertainty: tolerances.windingLength * build.windingLength },
    { name: "turns", value: build.turns, standardUncertainty: tolerances.turns * build.turns },
    { name: "wireDiameter", value: build.wireDiameter, standardUncertainty: tolerances.wireDiameter * build.wireDiameter },
    { name: "topLoadSize", value: 1, standardUncertainty: topLoadCapacitance > 0 ? tolerances.topLoadSize : 0 },
    { name: "environmentCapacitance", value: DEFAULT_ENVIRONMENT_CAPACITANCE_F, standardUncertainty: tolerances.environmentCapacitance },
    { name: "capacitanceModel", value: 1, standardUncertainty: tolerances.capacitanceModel },
  ];
  const propagated = propagateUncertainty(model, inputs);
  const k = PREDICTION_BAND_COVERAGE_FACTOR;
  const half = k * propagated.standardUncertainty;
  const relative = half / propagated.value;
  return {
    firstResonance: propagated.value,
    standardUncertainty: propagated.standardUncertainty,
    low: propagated.value - half,
    high: propagated.value + half,
    coverageFactor: k,
    inductance: nominal.inductance,
    selfCapacitance: nominal.selfCapacitance,
    topLoadCapacitance,
    environmentCapacitance: DEFAULT_ENVIRONMENT_CAPACITANCE_F,
    contributions: [...propagated.contributions].sort((a, b) => b.contribution - a.contribution),
    basis: [
      "From the recorded geometry and parts alone: Nagaoka inductance, Medhurst self-capacitance, the top load's free-space capacitance and a default 3 pF for the surroundings; no measurement of this coil is used.",
      `Band ±${(relative * 100).toFixed(1)} % (k = ${k}, about 95 %) propagated from the inputs' tolerances by the GUM's law of propagation of uncertainty (JCGM 100:2008).`,
    ],
  };
}
