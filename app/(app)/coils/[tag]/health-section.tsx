/** The coil's health (lib/analysis assessCoil) and the margins of its latest session. */
import Link from "next/link";
import type { CoilVerdict } from "@/lib/calc/coil-health";
import type { SessionAnalysis } from "@/lib/analysis/session-analysis";
import { formatDateTime, formatPercent } from "@/lib/units/format";

const HEALTH_LABEL: Record<string, string> = { fine: "Fine", watch: "Watch", hold: "Hold", "not enough data": "Not enough data" };
const MARGIN_LABEL = { voltage: "Voltage", current: "Current", thermal: "Thermal" } as const;
const STATUS_LABEL: Record<string, string> = { ok: "OK", thin: "Thin", exceeded: "Exceeded", unknown: "Unknown" };

export function HealthSection({ health, latest }: { health: CoilVerdict | null; latest: { id: string; startedAt: Date; analysis: SessionAnalysis } | null }) {
  return (
    <section aria-labelledby="health">
      <h2 id="health">
        Health{" "}
        {health && (
          <span className={`badge badge-${health.status === "not enough data" ? "neutral" : health.status}`} data-testid="health-status">
            {HEALTH_LABEL[health.status]}
          </span>
        )}
      </h2>
      {health ? (
        <ul>
          {health.reasons.map((r) => (
            <li key={r}>{r}</li>
          ))}
          {health.reasons.length === 0 && <li>No findings.</li>}
        </ul>
      ) : (
        <p>The logbook could not be assessed.</p>
      )}
      <h3>Latest session margins</h3>
      {latest ? (
        <>
          <p className="muted">
            <Link href={`/sessions/${latest.id}`}>Session of {formatDateTime(latest.startedAt)}</Link>, with the parts fitted that day.
          </p>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Margin</th>
                  <th scope="col">How</th>
                  <th scope="col" className="num">Headroom</th>
                  <th scope="col">Status</th>
                  <th scope="col">Figures</th>
                </tr>
              </thead>
              <tbody>
                {(["voltage", "current", "thermal"] as const).map((kind) => {
                  const m = latest.analysis.margins[kind];
                  return (
                    <tr key={kind}>
                      <th scope="row">{MARGIN_LABEL[kind]}</th>
                      <td>{m.formula}</td>
                      <td className="num">{formatPercent(m.headroom)}</td>
                      <td>
                        <span className={`badge badge-${m.status}`}>{STATUS_LABEL[m.status]}</span>
                      </td>
                      <td>
                        {m.estimated ? "Estimated" : "Measured or datasheet"}
                        {m.notes.length > 0 && <span className="hint" style={{ display: "block" }}>{m.notes.join(" ")}</span>}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        </>
      ) : (
        <p>No sessions logged yet.</p>
      )}
    </section>
  );
}
