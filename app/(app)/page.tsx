import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { getFleetOverview } from "@/lib/db/fleet";
import { formatDate, formatNumber } from "@/lib/units/format";
import { COIL_STATUS_LABEL } from "@/app/ui/labels";

export const metadata: Metadata = { title: "Fleet" };

function clearanceState(row: Awaited<ReturnType<typeof getFleetOverview>>[number], now: Date) {
  const c = row.latestClearance;
  if (!c) return { label: "Not cleared", tone: "neutral" };
  if (c.verdict !== "cleared") return { label: "Refused", tone: "refused" };
  if (c.lapsedAt) return { label: "Lapsed", tone: "lapsed" };
  if (c.validUntil < now) return { label: "Expired", tone: "lapsed" };
  return { label: `Cleared to ${formatDate(c.validUntil)}`, tone: "cleared" };
}

export default async function FleetPage() {
  await pageUser();
  const rows = await getFleetOverview();
  const now = new Date();
  const out = rows.filter((r) => r.activeLoan);
  const overdue = out.filter((r) => r.activeLoan!.expectedBackAt < now);
  const openFailures = rows.reduce((n, r) => n + r.openFailures, 0);
  return (
    <>
      <h1>Fleet</h1>
      <p className="lede">Every build the team keeps, with its running totals, open failures, clearance and loan state.</p>
      <div className="cards">
        <div className="card">
          <div className="figure">{rows.filter((r) => r.status === "active").length}</div>
          <div className="label">coils in service of {rows.length}</div>
        </div>
        <div className="card">
          <div className="figure">{out.length}</div>
          <div className="label">out on loan{overdue.length > 0 ? `, ${overdue.length} overdue` : ""}</div>
        </div>
        <div className="card">
          <div className="figure">{openFailures}</div>
          <div className="label">open failures awaiting a post-mortem</div>
        </div>
        <div className="card">
          <div className="figure">{formatNumber(rows.reduce((h, r) => h + r.hoursRun, 0), 1)}</div>
          <div className="label">hours run in all</div>
        </div>
      </div>
      <div className="table-wrap">
        <table>
          <caption>Coils</caption>
          <thead>
            <tr>
              <th scope="col">Tag</th>
              <th scope="col">Name</th>
              <th scope="col">Status</th>
              <th scope="col" className="num">Sessions</th>
              <th scope="col" className="num">Hours run</th>
              <th scope="col">Last run</th>
              <th scope="col" className="num">Days since sweep</th>
              <th scope="col" className="num">Open failures</th>
              <th scope="col">Clearance</th>
              <th scope="col">Loan</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => {
              const clearance = clearanceState(row, now);
              const sweepDays = row.lastSweepAt ? Math.floor((now.getTime() - row.lastSweepAt.getTime()) / 86_400_000) : null;
              const loanOverdue = row.activeLoan && row.activeLoan.expectedBackAt < now;
              return (
                <tr key={row.id}>
                  <td>
                    <Link href={`/coils/${encodeURIComponent(row.tag)}`}>{row.tag}</Link>
                  </td>
                  <td>{row.name}</td>
                  <td>
                    <span className={`badge badge-${row.status}`}>{COIL_STATUS_LABEL[row.status]}</span>
                  </td>
                  <td className="num">{row.sessionCount}</td>
                  <td className="num">{formatNumber(row.hoursRun, 1)}</td>
                  <td>{formatDate(row.lastSessionAt)}</td>
                  <td className="num">{sweepDays ?? "never"}</td>
                  <td className="num">{row.openFailures > 0 ? <span className="badge badge-open">{row.openFailures}</span> : 0}</td>
                  <td>
                    <span className={`badge badge-${clearance.tone}`}>{clearance.label}</span>
                  </td>
                  <td>
                    {row.activeLoan ? (
                      <span className={`badge badge-${loanOverdue ? "overdue" : "out"}`}>
                        {loanOverdue ? "Overdue" : "Out"}: {row.activeLoan.borrower}, back {formatDate(row.activeLoan.expectedBackAt)}
                      </span>
                    ) : (
                      <span className="muted">In</span>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </>
  );
}
