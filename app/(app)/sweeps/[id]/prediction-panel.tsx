import { formatPercent, formatQuantity } from "@/lib/units/format";
import type { PredictionComparison } from "@/lib/analysis/sweep-report";

/** "+2.3 %", "−1.0 %", and "0.0 %" rather than "-0.0 %" for a deviation that rounds to nothing. */
function signedPercent(fraction: number): string {
  const rounded = Math.round(fraction * 1000) / 1000;
  return rounded === 0 ? "0.0 %" : `${rounded > 0 ? "+" : ""}${formatPercent(rounded, 1)}`;
}

export function PredictionPanel({ comparison }: { comparison: PredictionComparison }) {
  return (
    <section aria-labelledby="prediction">
      <h2 id="prediction">Measured against the prediction</h2>
      {comparison.ok ? (
        <>
          <dl className="facts">
            <dt>Measured first series resonance</dt>
            <dd>{formatQuantity(comparison.measuredHz, "Hz", 4)}</dd>
            <dt>Predicted from the build</dt>
            <dd>{formatQuantity(comparison.predictedHz, "Hz", 4)}</dd>
            <dt>Deviation</dt>
            <dd>
              {signedPercent(comparison.comparison.deviation)} ({comparison.comparison.withinTolerance ? "within" : "outside"} the ±{formatPercent(comparison.comparison.tolerance)} tolerance)
            </dd>
          </dl>
          <p className="muted">
            The prediction uses this sweep&apos;s top load and {comparison.calibrated ? "the coil's calibrated environment capacitance, which this sweep itself helped calibrate" : "no environment capacitance (the coil is not calibrated yet)"}.
          </p>
        </>
      ) : (
        <p>{comparison.reason}</p>
      )}
    </section>
  );
}
