import { formatNumber, formatQuantity } from "@/lib/units/format";

interface StoredResonance {
  id: string;
  kind: "series" | "parallel";
  ordinal: number;
  frequencyHz: number;
  impedanceOhm: number;
  q: number | null;
  frequencyStandardErrorHz: number | null;
  qStandardError: number | null;
}

/** "± 120 Hz" beside a fitted value, or nothing when the fit could not judge its own error. */
function plusMinus(standardError: number | null, format: (value: number) => string): string {
  return standardError === null ? "" : ` ± ${format(standardError)}`;
}

export function ResonanceTable({ resonances }: { resonances: StoredResonance[] }) {
  const sorted = [...resonances].sort((a, b) => a.frequencyHz - b.frequencyHz);
  return (
    <section aria-labelledby="resonances">
      <h2 id="resonances">Resonances found</h2>
      <div className="table-wrap">
        <table>
          <caption>
            Series resonances are |Z| minima, parallel resonances |Z| maxima, each located by fitting a resonance model to the readings around
            it (not the highest or lowest reading, which is off by up to half a frequency step and biased on a broad peak). ± is one standard
            error of the fit; Q only where the readings bracket both half-power points.
          </caption>
          <thead>
            <tr>
              <th scope="col">Resonance</th>
              <th scope="col" className="num">Frequency</th>
              <th scope="col" className="num">|Z|</th>
              <th scope="col" className="num">Q</th>
            </tr>
          </thead>
          <tbody>
            {sorted.map((r) => (
              <tr key={r.id}>
                <th scope="row">
                  {r.kind === "series" ? "Series" : "Parallel"} {r.ordinal}
                </th>
                <td className="num">
                  {formatQuantity(r.frequencyHz, "Hz", 4)}
                  {plusMinus(r.frequencyStandardErrorHz, (e) => formatQuantity(e, "Hz", 2))}
                </td>
                <td className="num">{formatQuantity(r.impedanceOhm, "Ω")}</td>
                <td className="num">{r.q === null ? "not resolved" : `${formatNumber(r.q, r.q < 20 ? 1 : 0)}${plusMinus(r.qStandardError, (e) => formatNumber(e, r.q !== null && r.q < 20 ? 1 : 0))}`}</td>
              </tr>
            ))}
            {sorted.length === 0 && (
              <tr>
                <td colSpan={4}>No resonance stands out from the noise in this sweep.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </section>
  );
}
