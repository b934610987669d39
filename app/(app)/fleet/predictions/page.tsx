import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { FLEET_PREDICTION_WINDOW, readFleetPredictionInputs } from "@/lib/db/prediction-history";
import { assessPredictionQuality, type PredictionModel } from "@/lib/analysis/prediction-quality";
import { formatDate, formatPercent } from "@/lib/units/format";

export const metadata: Metadata = { title: "Prediction quality" };

const MODEL_LABEL: Record<PredictionModel, string> = {
  geometryOnly: "First series resonance from geometry and parts alone",
  calibrated: "First series resonance calibrated on earlier sweeps",
  runningFrequency: "Running frequency from the sweep before and the learnt offset",
};

const signed = (x: number) => `${x >= 0 ? "+" : ""}${formatPercent(x, 1)}`;

export default async function PredictionQualityPage() {
  const user = await pageUser();
  const { summaries } = assessPredictionQuality(await readFleetPredictionInputs(user.scope));
  return (
    <>
      <h1>How far the predictions have landed</h1>
      <p className="lede">
        Every deviation here is out of sample: a sweep is compared with a calibration fitted only on the coil&apos;s earlier sweeps, a session with an offset learnt only
        from sessions before it. Deviation is (measured − predicted) ÷ predicted; the spread is the middle half of the deviations (first to third quartile). The figures cover the site&apos;s latest{" "}
        {FLEET_PREDICTION_WINDOW.toLocaleString("en")} sweeps and latest {FLEET_PREDICTION_WINDOW.toLocaleString("en")} sessions.
      </p>
      <div className="table-wrap">
        <table>
          <caption>Out-of-sample deviations across all coils</caption>
          <thead>
            <tr>
              <th scope="col">Model</th>
              <th scope="col" className="num">Compared</th>
              <th scope="col" className="num">Median</th>
              <th scope="col" className="num">Middle half</th>
              <th scope="col">Worst</th>
            </tr>
          </thead>
          <tbody>
            {(Object.keys(MODEL_LABEL) as PredictionModel[]).map((model) => {
              const summary = summaries[model];
              return (
                <tr key={model}>
                  <th scope="row">{MODEL_LABEL[model]}</th>
                  <td className="num">{summary?.count ?? 0}</td>
                  <td className="num">{summary ? signed(summary.median) : "—"}</td>
                  <td className="num nowrap">{summary ? `${signed(summary.lowerQuartile)} to ${signed(summary.upperQuartile)}` : "—"}</td>
                  <td>
                    {summary ? (
                      <>
                        {signed(summary.worst.deviation)} — <Link href={`/coils/${encodeURIComponent(summary.worst.label.coilTag)}`}>{summary.worst.label.coilTag}</Link>,{" "}
                        {summary.worst.label.recordKind === "sweep" ? <Link href={`/sweeps/${summary.worst.label.recordId}`}>sweep of {formatDate(summary.worst.label.at)}</Link> : <Link href={`/sessions/${summary.worst.label.recordId}`}>session of {formatDate(summary.worst.label.at)}</Link>}
                      </>
                    ) : (
                      "nothing compared yet"
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="muted">
        For a new build only the geometry-only model is available: expect its deviation to fall within the spread above. Once a coil has a sweep, the calibrated
        model takes over for its next sweep.
      </p>
    </>
  );
}
