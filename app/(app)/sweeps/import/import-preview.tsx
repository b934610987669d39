"use client";

import { formatNumber, formatQuantity } from "@/lib/units/format";
import type { PreparedImport } from "./sweep-import-form";

/** The first readings as understood (in SI) and the resonances lib/calc finds, before anything is saved. */
export function ImportPreview({ prepared }: { prepared: PreparedImport }) {
  const { points, analysis, analysisNote } = prepared;
  const resonances = analysis
    ? [...analysis.seriesResonances.map((r, i) => ({ kind: "Series", n: i + 1, ...r })), ...analysis.parallelResonances.map((r, i) => ({ kind: "Parallel", n: i + 1, ...r }))].sort((a, b) => a.frequency - b.frequency)
    : [];
  return (
    <section aria-labelledby="import-preview">
      <h2 id="import-preview">3. Preview</h2>
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
