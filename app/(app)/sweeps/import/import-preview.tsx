"use client";

import { formatNumber, formatQuantity } from "@/lib/units/format";
import { LineChart, type ChartSeries } from "@/app/ui/charts/line-chart";
import { decimateMinMax } from "@/lib/analysis/decimate-min-max";
import type { PreparedImport } from "./sweep-import-form";

/** About one bucket per pixel column of the chart: enough to keep every peak and dip of a 100 000-row file. */
const CHART_BUCKETS = 600;

/** The first readings as understood (in SI) and the resonances lib/calc finds, before anything is saved. */
export function ImportPreview({ prepared }: { prepared: PreparedImport }) {
  const { points, analysis, analysisNote } = prepared;
  const resonances = analysis
    ? [...analysis.seriesResonances.map((r, i) => ({ kind: "Series", n: i + 1, ...r })), ...analysis.parallelResonances.map((r, i) => ({ kind: "Parallel", n: i + 1, ...r }))].sort((a, b) => a.frequency - b.frequency)
    : [];
  // The readings as understood, in frequency order, so a wrong column or unit shows before anything is saved.
  const curve = decimateMinMax(
    points.map((p) => ({ x: p.frequencyHz, y: p.amplitudeV })).sort((a, b) => a.x - b.x),
    CHART_BUCKETS,
    true,
  );
  const series: ChartSeries[] = [
    { label: "Readings", points: curve },
    ...(resonances.length > 0
      ? [{ label: "Resonances found", style: "marker" as const, points: resonances.map((r) => ({ x: r.frequency, y: nearestReading(curve, r.frequency) })) }]
      : []),
  ];
  return (
    <section aria-labelledby="import-preview">
      <h2 id="import-preview">3. Preview</h2>
      <LineChart title={`The ${points.length} readings as understood`} series={series} x={{ label: "Frequency", format: "frequency", log: true }} y={{ label: "Reading (V)" }} />
      <div className="grid-2">
        <div className="table-wrap">
          <table>
            <caption>
              First {Math.min(10, points.length)} of {points.length} readings, as understood
            </caption>
            <thead>
              <tr>
                <th scope="col">File row</th>
                <th scope="col" className="num">Frequency</th>
                <th scope="col" className="num">Amplitude</th>
              </tr>
            </thead>
            <tbody>
              {points.slice(0, 10).map((p) => (
                <tr key={p.row}>
                  <td>{p.row}</td>
                  <td className="num">{formatQuantity(p.frequencyHz, "Hz", 5)}</td>
                  <td className="num">{formatQuantity(p.amplitudeV, "V", 4)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div className="table-wrap">
          <table>
            <caption>Resonances found</caption>
            <thead>
              <tr>
                <th scope="col">Kind</th>
                <th scope="col" className="num">Frequency</th>
                <th scope="col" className="num">|Z|</th>
                <th scope="col" className="num">Q</th>
              </tr>
            </thead>
            <tbody>
              {resonances.map((r) => (
                <tr key={`${r.kind}-${r.n}`}>
                  <td>
                    {r.kind} {r.n}
                  </td>
                  <td className="num">
                    {formatQuantity(r.frequency, "Hz", 4)}
                    {r.frequencyStandardError === undefined ? "" : ` ± ${formatQuantity(r.frequencyStandardError, "Hz", 2)}`}
                  </td>
                  <td className="num">{formatQuantity(r.impedance, "Ω")}</td>
                  <td className="num">{r.q === undefined ? "—" : formatNumber(r.q, 0)}</td>
                </tr>
              ))}
              {resonances.length === 0 && (
                <tr>
                  <td colSpan={4}>{analysisNote ?? "No resonance stands out from the noise in these readings."}</td>
                </tr>
              )}
            </tbody>
          </table>
        </div>
      </div>
    </section>
  );
}

/** The reading nearest a frequency, to put a resonance's marker on the curve. */
function nearestReading(curve: readonly { x: number; y: number }[], frequency: number): number {
  let best = curve[0]?.y ?? 0;
  let distance = Infinity;
  for (const p of curve) {
    const d = Math.abs(Math.log(p.x / frequency));
    if (d < distance) [best, distance] = [p.y, d];
  }
  return best;
}
