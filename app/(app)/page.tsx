import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { getFleetOverview, selectFleetRows } from "@/lib/db/fleet";
import { fleetQuerySchema } from "@/lib/validation/fleet-query";
import type { SearchParams } from "@/lib/validation/list-query";
import { formatCount, formatDate, formatNumber } from "@/lib/units/format";
import { COIL_STATUS_LABEL } from "@/app/ui/labels";
import { ClearanceBadge } from "./clearances/clearance-badge";
import { MarginCell } from "./fleet/margin-cell";
import { FleetFilters } from "./fleet/fleet-filters";
import { HeadroomSparkline } from "@/app/ui/headroom-trend-picture";
import { shortenReason } from "@/lib/analysis/short-reason";

export const metadata: Metadata = { title: "Fleet" };

const HEALTH_TONE: Record<string, string> = { fine: "fine", watch: "watch", hold: "hold", "not enough data": "neutral" };

export default async function FleetPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser();
  const query = fleetQuerySchema.parse(await searchParams);
  const all = await getFleetOverview(user.scope);
  const rows = selectFleetRows(all, query);
  const out = all.filter((r) => r.activeLoan);
  const overdue = out.filter((r) => r.activeLoan!.overdue);
  return (
    <>
      <h1>Fleet</h1>
      <p className="lede">
        Every build with its health, latest margins, clearance and loan state. Health compares each coil&apos;s logbook with the lending policy&apos;s limits;
        it records the team&apos;s checks and does not say a build is safe.
      </p>
      <div className="cards">
        <div className="card">
          <div className="figure">{all.filter((r) => r.health === "hold" || r.health === "watch").length}</div>
          <div className="label">coils on watch or hold of {all.length}</div>
        </div>
        <div className="card">
          <div className="figure">{out.length}</div>
          <div className="label">out on loan{overdue.length > 0 ? `, ${overdue.length} overdue` : ""}</div>
        </div>
        <div className="card">
          <div className="figure">{all.reduce((n, r) => n + r.openFailures, 0)}</div>
          <div className="label">open failures awaiting a post-mortem</div>
        </div>
        <div className="card">
          <div className="figure">{all.filter((r) => r.clearance.kind === "valid").length}</div>
          <div className="label">coils cleared for lending now</div>
        </div>
      </div>
      {overdue.length > 0 && (
        <p className="notice danger" role="alert">
          Overdue: {overdue.map((r) => `${r.tag} with ${r.activeLoan!.borrower} (due ${formatDate(r.activeLoan!.expectedBackAt)})`).join("; ")}.
        </p>
      )}
      <p className="no-print">
        <Link href="/fleet/reliability">Reliability per part</Link> · <Link href="/fleet/predictions">Prediction quality</Link> · <Link href="/clearances">Clearance decisions</Link> · <Link href="/loans">Loans</Link>
      </p>
      <FleetFilters query={query} />
      <div className="table-wrap">
        <table className="fleet-table">
          <caption>
            {rows.length} of {formatCount(all.length, "coil")}
          </caption>
          <thead>
            <tr>
              <th scope="col">Coil</th>
              <th scope="col">Health and reasons</th>
              <th scope="col">Margins: recent trend, latest headroom</th>
              <th scope="col">Use</th>
              <th scope="col">Clearance</th>
              <th scope="col">Loan</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} aria-label={`${row.tag} ${row.name}`}>
                <th scope="row">
                  <Link href={`/coils/${encodeURIComponent(row.tag)}`}>{row.tag}</Link> {row.name}
                  <br />
                  <span className="muted">{COIL_STATUS_LABEL[row.status]}</span> ·{" "}
                  <Link href={`/fleet/${encodeURIComponent(row.tag)}/trends`} aria-label={`Trends for ${row.name}`}>
                    Trends
                  </Link>
                </th>
                <td>
                  <span className={`badge badge-${HEALTH_TONE[row.health]}`}>{row.health}</span>
                  {row.reasons[0] && <p className="reason">{shortenReason(row.reasons[0])}</p>}
                  {(row.reasons.length > 1 || (row.reasons[0] !== undefined && shortenReason(row.reasons[0]) !== row.reasons[0].replace(/\.$/, ""))) && (
                    <details>
                      <summary>{row.reasons.length > 1 ? `All ${row.reasons.length} reasons` : "In full"}</summary>
                      <ul>
                        {row.reasons.map((r, i) => (
                          <li key={i}>{r}</li>
                        ))}
                      </ul>
                    </details>
                  )}
                </td>
                <td>
                  <dl className="stacked margin-trends">
                    <dt>Voltage</dt>
                    <dd>
                      <HeadroomSparkline kind="voltage" series={row.headroomTrend.voltage} /> <MarginCell margin={row.latestMargins?.voltage} />
                    </dd>
                    <dt>Current</dt>
                    <dd>
                      <HeadroomSparkline kind="current" series={row.headroomTrend.current} /> <MarginCell margin={row.latestMargins?.current} />
                    </dd>
                    <dt>Thermal</dt>
                    <dd>
                      <HeadroomSparkline kind="thermal" series={row.headroomTrend.thermal} /> <MarginCell margin={row.latestMargins?.thermal} />
                    </dd>
                  </dl>
                </td>
                <td>
                  <dl className="stacked">
                    <dt>Hours run</dt>
                    <dd>{formatNumber(row.hoursRun, 1)}</dd>
                    <dt>Since sweep</dt>
                    <dd>{row.daysSinceSweep === null ? "never swept" : `${row.daysSinceSweep} d`}</dd>
                    <dt>Open failures</dt>
                    <dd>{row.openFailures > 0 ? <span className="badge badge-open">{row.openFailures}</span> : 0}</dd>
                  </dl>
                </td>
                <td>
                  <ClearanceBadge state={row.clearance} withReason />
                </td>
                <td>
                  {row.activeLoan ? (
                    <span className={`badge badge-${row.activeLoan.overdue ? "overdue" : "out"}`}>
                      {row.activeLoan.overdue ? "Overdue" : "Out"}: {row.activeLoan.borrower}, back {formatDate(row.activeLoan.expectedBackAt)}
                    </span>
                  ) : (
                    <span className="muted">In</span>
                  )}
                </td>
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={6}>No coil matches these filters.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </>
  );
}
