/** The parts of a post-mortem shared by its page and its printable report. */
import Link from "next/link";
import type { PostMortemAnalysis } from "@/lib/analysis/post-mortem";
import type { ComponentRecord } from "@/lib/analysis/records";
import type { Margin } from "@/lib/calc/margin";
import { formatCount, formatDate, formatDateTime, formatNumber, formatPercent } from "@/lib/units/format";
import { COMPONENT_KIND_LABEL, FAILURE_MODE_LABEL, OUTCOME_LABEL } from "@/app/ui/labels";
import { MARGIN_STATUS_LABEL } from "@/app/ui/margin-labels";

export const CAUSE_LABEL: Record<string, string> = { ...FAILURE_MODE_LABEL, unknown: "Unexplained by the log" };

export function describeRatings(c: ComponentRecord): string {
  if (c.kind === "switch") {
    return [
      c.switchType?.toUpperCase(),
      c.voltageRatingV != null ? formatNumber(c.voltageRatingV, 0, "V") : null,
      c.continuousCurrentA != null ? `${formatNumber(c.continuousCurrentA, 0, "A")} cont.` : null,
      c.peakCurrentA != null ? `${formatNumber(c.peakCurrentA, 0, "A")} peak` : null,
      c.powerRating25CW != null ? `${formatNumber(c.powerRating25CW, 0, "W")} at 25 °C` : null,
      c.maxJunctionTempC != null ? `Tj max ${formatNumber(c.maxJunctionTempC, 0, "°C")}` : null,
    ]
      .filter(Boolean)
      .join(", ");
  }
  if (c.kind === "heat_sink") return c.sinkThermalResistanceKPerW != null ? `${formatNumber(c.sinkThermalResistanceKPerW, 2, "K/W")} sink to air` : "—";
  return "—";
}

export function PartsTable({ parts, failedId, caption }: { parts: readonly ComponentRecord[]; failedId: string | null; caption: string }) {
  return (
    <div className="table-wrap">
      <table>
        <caption>{caption}</caption>
        <thead>
          <tr>
            <th scope="col">Part</th>
            <th scope="col">Kind</th>
            <th scope="col">Ratings</th>
            <th scope="col">Installed</th>
          </tr>
        </thead>
        <tbody>
          {parts.map((c) => (
            <tr key={c.id}>
              <th scope="row">
                {c.partNumber}
                {c.id === failedId ? " (failed)" : ""}
              </th>
              <td>{COMPONENT_KIND_LABEL[c.kind]}</td>
              <td>{describeRatings(c)}</td>
              <td>{formatDate(c.installedAt)}</td>
            </tr>
          ))}
          {parts.length === 0 && (
            <tr>
              <td colSpan={4}>No parts were recorded as fitted then.</td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}

function MarginCell({ margin }: { margin: Margin }) {
  return (
    <td>
      <span className={`badge badge-${margin.status}`}>{MARGIN_STATUS_LABEL[margin.status]}</span> {margin.headroom !== null ? formatPercent(margin.headroom) : ""}
      {margin.estimated ? " (est.)" : ""}
    </td>
  );
}

export function MarginsBeforeTable({ analysis, linkSessions }: { analysis: PostMortemAnalysis; linkSessions: boolean }) {
  return (
    <div className="table-wrap">
      <table>
        <caption>Headroom of the {formatCount(analysis.sessions.length, "session")} before the failure (oldest first; est. = rests on an estimate)</caption>
        <thead>
          <tr>
            <th scope="col">Session</th>
            <th scope="col" className="num">Supply</th>
            <th scope="col">Voltage</th>
            <th scope="col">Current</th>
            <th scope="col">Thermal</th>
            <th scope="col">Outcome</th>
          </tr>
        </thead>
        <tbody>
          {analysis.sessions.map(({ session, analysis: a }) => (
            <tr key={session.id}>
              <th scope="row">{linkSessions ? <Link href={`/sessions/${session.id}`}>{formatDateTime(session.startedAt)}</Link> : formatDateTime(session.startedAt)}</th>
              <td className="num">
                {formatNumber(session.supplyVoltageV, 0, "V")}, {formatNumber(session.supplyCurrentA, 2, "A")}
              </td>
              <MarginCell margin={a.margins.voltage} />
              <MarginCell margin={a.margins.current} />
              <MarginCell margin={a.margins.thermal} />
              <td>{OUTCOME_LABEL[session.outcome]}</td>
            </tr>
          ))}
          {analysis.sessions.length === 0 && (
            <tr>
              <td colSpan={6}>No sessions were logged before the failure.</td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}

export function RankedCauses({ analysis }: { analysis: PostMortemAnalysis }) {
  const shown = analysis.causes.filter((c) => c.score > 0 || c.evidence.length > 0);
  return (
    <>
      <p className="muted">A reading aid from the log, not a verdict: each score combines the evidence listed under it (0 to 100 %).</p>
      <ol className="ranked-causes">
        {shown.map((c) => (
          <li key={c.cause}>
            <strong>{CAUSE_LABEL[c.cause]}</strong> — <span className="cause-score">{formatPercent(c.score)}</span>
            {c.evidence.length > 0 ? (
              <ul>
                {c.evidence.map((line) => (
                  <li key={line}>{line}</li>
                ))}
              </ul>
            ) : (
              <p className="muted">No evidence in the log.</p>
            )}
          </li>
        ))}
      </ol>
    </>
  );
}
