/**
 * The law of propagation of uncertainty for uncorrelated inputs (JCGM 100:2008, the GUM, §5.1.2):
 * u_c²(y) = Σ (∂f/∂x_i)² u²(x_i), with the sensitivities ∂f/∂x_i taken numerically by central differences
 * (GUM §5.1.3 allows numerical partial derivatives). The step is a fixed fraction of each input's
 * nominal value, never of its uncertainty, so the sensitivities do not change when a tolerance does and a
 * wider input uncertainty can only widen the result.
 */
import { CalcInputError, requireFinite, requireNonNegative } from "./errors";

/** One input of a measurement model: its name, nominal value and standard uncertainty (same unit). */
export interface UncertainInput {
  readonly name: string;
  readonly value: number;
  readonly standardUncertainty: number;
}

/** What one input contributes to the result's uncertainty. */
export interface UncertaintyContribution {
  readonly name: string;
  /** ∂f/∂x at the nominal point, in result units per input unit. */
  readonly sensitivity: number;
  /** |∂f/∂x| · u(x), in the result's unit. */
  readonly contribution: number;
}

export interface PropagatedUncertainty {
  /** f at the nominal inputs. */
  readonly value: number;
  /** Combined standard uncertainty u_c, in the result's unit. */
  readonly standardUncertainty: number;
  readonly contributions: UncertaintyContribution[];
}

/** Relative central-difference step: small against any tolerance used here, large against rounding. */
const RELATIVE_STEP = 1e-5;

/** Combined standard uncertainty of f(x) by the GUM's first-order law (JCGM 100:2008 eq. 10), inputs uncorrelated. */
export function propagateUncertainty(model: (values: readonly number[]) => number, inputs: readonly UncertainInput[]): PropagatedUncertainty {
  if (inputs.length === 0) throw new CalcInputError("inputs", "at least one input", "none");
  const nominal = inputs.map((input, i) => {
    requireNonNegative(`inputs[${i}].standardUncertainty`, input.standardUncertainty);
    return requireFinite(`inputs[${i}].value`, input.value);
  });
  const value = model(nominal);
  const contributions = inputs.map((input, i): UncertaintyContribution => {
    const step = RELATIVE_STEP * (Math.abs(input.value) || 1);
    const at = (delta: number) => model(nominal.map((x, j) => (j === i ? x + delta : x)));
    const sensitivity = (at(step) - at(-step)) / (2 * step);
    return { name: input.name, sensitivity, contribution: Math.abs(sensitivity) * input.standardUncertainty };
  });
  const standardUncertainty = Math.sqrt(contributions.reduce((sum, c) => sum + c.contribution ** 2, 0));
  return { value, standardUncertainty, contributions };
}

/** Standard uncertainty of a quantity known only to lie within ±halfWidth, uniformly: a/√3 (JCGM 100:2008 §4.3.7). */
export function rectangularStandardUncertainty(halfWidth: number): number {
  return requireNonNegative("halfWidth", halfWidth) / Math.sqrt(3);
}
