import { formatNumber, formatQuantity } from "@/lib/units/format";

interface StoredResonance {
  id: string;
  kind: "series" | "parallel";
  ordinal: number;
  frequencyHz: number;
  impedanceOhm: number;
  q: number | null;
}

export function ResonanceTable({ resonances }: { resonances: StoredResonance[] }) {
  const sorted = [...resonances].sort((a, b) => a.frequencyHz - b.frequencyHz);
  return (
    <section aria-labelledby="resonances">
      <h2 id="resonances">Resonances found</h2>
      <div className="table-wrap">
        <table>
          <caption>Series resonances are |Z| minima, parallel resonances |Z| maxima; Q only where the readings bracket both half-power points.</caption>
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
                <td className="num">{formatQuantity(r.frequencyHz, "Hz", 4)}</td>
                <td className="num">{formatQuantity(r.impedanceOhm, "Ω")}</td>
                <td className="num">{r.q === null ? "not resolved" : formatNumber(r.q, 0)}</td>
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
