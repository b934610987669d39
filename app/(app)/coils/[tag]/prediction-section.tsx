/** Predicted and measured for one coil: geometry-only and calibrated side by side, each compared out of sample, with its basis in plain words. */
import Link from "next/link";
import type { CoilComparison, ComparedRowKey } from "@/lib/analysis/coil-comparison";
import { BUILD_TOLERANCE_SOURCES } from "@/lib/calc/prediction-band";
import { formatDate, formatPercent, formatQuantity } from "@/lib/units/format";

const ROW_LABEL: Record<ComparedRowKey, string> = {
  inductance: "Inductance",
  geometryOnly: "First series resonance — from geometry and parts alone",
  calibrated: "First series resonance — calibrated on earlier sweeps",
  runningFrequency: "Running frequency",
};
const UNIT = { inductance: "H", firstResonance: "Hz", runningFrequency: "Hz" } as const;

export function PredictionSection({ comparison }: { comparison: CoilComparison }) {
  const { prediction, geometryOnly, calibrated } = comparison;
  return (
    <section aria-labelledby="prediction">
      <h2 id="prediction">Predicted and measured</h2>
      <p className="muted">No prediction below was fitted on the measurement it is compared with.</p>
      {comparison.predictionProblem && <p className="notice warn">{comparison.predictionProblem}</p>}
      <div className="table-wrap">
        <table>
          <thead>
            <tr>
              <th scope="col">Quantity</th>
              <th scope="col" className="num">Predicted</th>
              <th scope="col" className="num">Measured</th>
              <th scope="col" className="num">Deviation</th>
              <th scope="col">Within tolerance?</th>
            </tr>
          </thead>
          <tbody>
            {comparison.rows.map((row) => (
              <tr key={row.key} data-row={row.key}>
                <th scope="row">
                  {ROW_LABEL[row.key]}
                  <span className="hint" style={{ display: "block", fontWeight: "normal" }}>
                    {row.basis}
                  </span>
                </th>
                <td className="num">
                  {formatQuantity(row.predicted, UNIT[row.quantity], 4)}
                  {row.band && (
                    <span className="hint" style={{ display: "block" }}>
                      {formatQuantity(row.band.low, UNIT[row.quantity], 3)} to {formatQuantity(row.band.high, UNIT[row.quantity], 3)}
                    </span>
                  )}
                </td>
                <td className="num">{row.measured === null ? "not measured" : formatQuantity(row.measured, UNIT[row.quantity], 4)}</td>
                <td className="num">{row.comparison ? `${row.comparison.deviation >= 0 ? "+" : ""}${formatPercent(row.comparison.deviation, 1)}` : "—"}</td>
                <td>
                  {row.comparison ? (
                    <span className={`badge badge-${row.comparison.withinTolerance ? "ok" : "thin"}`}>
                      {row.comparison.withinTolerance ? "within" : "outside"} ±{formatPercent(row.comparison.tolerance)}
                    </span>
                  ) : (
                    <span className="muted">{row.note ?? "nothing to compare yet"}</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {calibrated && (
        <p>
          Calibrated environment {formatQuantity(calibrated.environmentCapacitanceF, "F")}, fitted on{" "}
          {calibrated.fittedOn.map((s, i) => (
            <span key={s.id}>
              {i > 0 ? ", " : ""}
              <Link href={`/sweeps/${s.id}`}>the sweep of {formatDate(s.takenAt)}</Link>
            </span>
          ))}
          .
        </p>
      )}
      {prediction && (
        <>
          <p>
            Model figures: wire length {formatQuantity(prediction.wireLength, "m")}, self-capacitance {formatQuantity(prediction.selfCapacitance, "F")}, top load{" "}
            {formatQuantity(prediction.topLoadCapacitance, "F")}, environment {formatQuantity(prediction.environmentCapacitance, "F")} (calibrated on every sweep so far: the
            figure for the next sweep), DC resistance {formatQuantity(prediction.dcResistance, "Ω")}, Q at most {Math.round(prediction.qEstimate)}.
          </p>
          <details>
            <summary>What the model assumes</summary>
            <ul>
              {prediction.assumptions.map((a) => (
                <li key={a}>{a}</li>
              ))}
              {geometryOnly && (
                <li>
                  The geometry-only band (k = {geometryOnly.coverageFactor}) comes from these standard uncertainties:{" "}
                  {Object.values(BUILD_TOLERANCE_SOURCES).join("; ")}. Largest share: {geometryOnly.contributions[0]?.name ?? "—"}.
                </li>
              )}
              <li>Tolerances: the current-sheet inductance ±5 %, the lumped first resonance ±15 %, the running frequency ±10 % of its prediction.</li>
            </ul>
          </details>
        </>
      )}
    </section>
  );
}
