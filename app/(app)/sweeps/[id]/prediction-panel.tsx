import Link from "next/link";
import { formatDate, formatPercent, formatQuantity } from "@/lib/units/format";
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
            <dt>From geometry and parts alone</dt>
            <dd>
              {formatQuantity(comparison.geometryOnly.predictedHz, "Hz", 4)} (band {formatQuantity(comparison.geometryOnly.lowHz, "Hz", 3)} to {formatQuantity(comparison.geometryOnly.highHz, "Hz", 3)}), deviation{" "}
              {signedPercent(comparison.geometryOnly.comparison.deviation)}
            </dd>
            <dt>Calibrated on earlier sweeps</dt>
            <dd>
              {comparison.calibrated.ok ? (
                <>
                  {formatQuantity(comparison.calibrated.predictedHz, "Hz", 4)}, deviation {signedPercent(comparison.calibrated.comparison.deviation)} ({comparison.calibrated.comparison.withinTolerance ? "within" : "outside"} the ±
                  {formatPercent(comparison.calibrated.comparison.tolerance)} tolerance)
                </>
              ) : (
                comparison.calibrated.reason
              )}
            </dd>
          </dl>
          <p className="muted">
            Both predictions use this sweep&apos;s top load and neither was fitted on this sweep. The geometry-only figure uses a default 3 pF for the surroundings and its band comes from the
            inputs&apos; tolerances (JCGM 100:2008).
            {comparison.calibrated.ok && (
              <>
                {" "}
                The calibrated one uses the environment capacitance fitted on{" "}
                {comparison.calibrated.fittedOn.map((s, i) => (
                  <span key={s.id}>
                    {i > 0 ? ", " : ""}
                    <Link href={`/sweeps/${s.id}`}>{formatDate(s.takenAt)}</Link>
                  </span>
                ))}
                .
              </>
            )}
          </p>
        </>
      ) : (
        <p>{comparison.reason}</p>
      )}
    </section>
  );
}
