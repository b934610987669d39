/** Predicted vs measured for one coil, with the model's assumptions in plain words. */
import type { CoilComparison } from "@/lib/analysis/coil-comparison";
import { formatPercent, formatQuantity } from "@/lib/units/format";

const QUANTITY_LABEL = { inductance: "Inductance", firstResonance: "First series resonance", runningFrequency: "Running frequency" } as const;
const UNIT = { inductance: "H", firstResonance: "Hz", runningFrequency: "Hz" } as const;
const PREDICTED_WORD = { inductance: "Predicted", firstResonance: "Predicted", runningFrequency: "Expected (latest sweep)" } as const;

export function PredictionSection({ comparison }: { comparison: CoilComparison }) {
  const { prediction } = comparison;
  return (
    <section aria-labelledby="prediction">
      <h2 id="prediction">Predicted and measured</h2>
      {comparison.predictionProblem && <p className="notice warn">{comparison.predictionProblem}</p>}
      <div className="table-wrap">
        <table>
          <thead>
            <tr>
              <th scope="col">Quantity</th>
              <th scope="col" className="num">Predicted or expected</th>
              <th scope="col" className="num">Measured</th>
              <th scope="col" className="num">Deviation</th>
              <th scope="col">Within tolerance?</th>
            </tr>
          </thead>
          <tbody>
            {comparison.rows.map((row) => (
              <tr key={row.quantity}>
                <th scope="row">
                  {QUANTITY_LABEL[row.quantity]}
                  <span className="hint" style={{ display: "block", fontWeight: "normal" }}>
                    {PREDICTED_WORD[row.quantity]}: {row.basis}
                  </span>
                </th>
                <td className="num">{formatQuantity(row.predicted, UNIT[row.quantity], 4)}</td>
                <td className="num">{row.measured === null ? "not measured" : formatQuantity(row.measured, UNIT[row.quantity], 4)}</td>
                <td className="num">{row.comparison ? `${row.comparison.deviation >= 0 ? "+" : ""}${formatPercent(row.comparison.deviation, 1)}` : "—"}</td>
                <td>
                  {row.comparison ? (
                    <span className={`badge badge-${row.comparison.withinTolerance ? "ok" : "thin"}`}>
                      {row.comparison.withinTolerance ? "within" : "outside"} ±{formatPercent(row.comparison.tolerance)}
                    </span>
                  ) : (
                    <span className="muted">nothing to compare yet</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {prediction && (
        <>
          <p>
            Model figures: wire length {formatQuantity(prediction.wireLength, "m")}, self-capacitance {formatQuantity(prediction.selfCapacitance, "F")}, top load{" "}
            {formatQuantity(prediction.topLoadCapacitance, "F")}, environment {formatQuantity(prediction.environmentCapacitance, "F")}, DC resistance{" "}
            {formatQuantity(prediction.dcResistance, "Ω")}, Q at most {Math.round(prediction.qEstimate)}.
          </p>
          <details>
            <summary>What the model assumes</summary>
            <ul>
              {prediction.assumptions.map((a) => (
                <li key={a}>{a}</li>
              ))}
              <li>Tolerances: the current-sheet inductance ±5 %, the lumped first resonance ±15 %, the running frequency ±10 % of the swept resonance with the same top load.</li>
            </ul>
          </details>
        </>
      )}
    </section>
  );
}
