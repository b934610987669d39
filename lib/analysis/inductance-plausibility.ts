/**
 * Whether a measured secondary inductance is plausible for the recorded geometry. A reading several times
 * off the current-sheet prediction is almost always a unit slip ("4.2 H" for 4.2 mH) or a meter on the wrong
 * range, so the record is kept as typed and the steward is warned, never refused: the meter may be right.
 */
import { solenoidInductance } from "../calc/inductance";
import { windingCentreDiameter } from "../calc/secondary-geometry";
import { CalcInputError } from "../calc/errors";
import { formatQuantity } from "../units/format";

/**
 * How far from the prediction a reading may sit before it is questioned. A close-wound single-layer secondary
 * measures near Nagaoka's current-sheet value (docs/references.md, "Inductance, current-sheet model"); a factor
 * of 3 leaves room for odd windings and meter error while still catching unit slips, which are factors of 1000.
 * common practice
 */
export const INDUCTANCE_PLAUSIBLE_FACTOR = 3;

export interface InductancePlausibility {
  predictedH: number;
  /** measured ÷ predicted */
  ratio: number;
  /** One sentence for the steward, or null when the reading is plausible. */
  warning: string | null;
}

export function checkMeasuredInductance(coil: {
  formDiameterM: number;
  windingLengthM: number;
  wireDiameterM: number;
  turns: number;
  measuredInductanceH: number | null;
}): InductancePlausibility | null {
  if (coil.measuredInductanceH === null || !(coil.measuredInductanceH > 0)) return null;
  let predictedH: number;
  try {
    const diameter = windingCentreDiameter({ formDiameter: coil.formDiameterM, wireDiameter: coil.wireDiameterM });
    predictedH = solenoidInductance({ diameter, length: coil.windingLengthM, turns: coil.turns });
  } catch (error) {
    if (error instanceof CalcInputError) return null; // no prediction to compare with
    throw error;
  }
  const ratio = coil.measuredInductanceH / predictedH;
  const far = ratio > INDUCTANCE_PLAUSIBLE_FACTOR || ratio < 1 / INDUCTANCE_PLAUSIBLE_FACTOR;
  const times = ratio >= 1 ? `${formatRatio(ratio)} times` : `1/${formatRatio(1 / ratio)} of`;
  const warning = far
    ? `The measured inductance, ${formatQuantity(coil.measuredInductanceH, "H")}, is ${times} the ${formatQuantity(predictedH, "H")} this geometry predicts: it was saved as typed, but check the unit (mH typed as H?) and the meter's range.`
    : null;
  return { predictedH, ratio, warning };
}

function formatRatio(r: number): string {
  return r >= 100 ? Math.round(r).toLocaleString("en-GB") : String(Number(r.toPrecision(2)));
}
