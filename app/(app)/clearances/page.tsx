import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { listClearancesWithState } from "@/lib/db/clearances";
import { formatDate } from "@/lib/units/format";
import { ClearanceBadge } from "./clearance-badge";

export const metadata: Metadata = { title: "Clearances" };

export default async function ClearancesPage() {
  const user = await pageUser();
  const rows = await listClearancesWithState(user.scope);
  return (
    <>
      <h1>Clearance decisions</h1>
      <p className="lede">Every signed decision, newest first. Decisions are never edited; where each stands now is worked out from the coil&apos;s failures, part changes and the date, as on the dashboard.</p>
      <div className="table-wrap">
        <table>
          <caption>{rows.length} decision{rows.length === 1 ? "" : "s"}</caption>
          <thead>
            <tr>
              <th scope="col">Coil</th>
              <th scope="col">Decision</th>
              <th scope="col">Signed</th>
              <th scope="col">By</th>
              <th scope="col">Valid until</th>
              <th scope="col">Policy</th>
              <th scope="col">Stands now</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((c) => (
              <tr key={c.id}>
                <td>
                  <Link href={`/clearances/${c.id}`}>{c.coil.tag}</Link> {c.coil.name}
                </td>
                <td>
                  <span className={`badge badge-${c.verdict}`}>{c.verdict}</span>
                </td>
                <td>{formatDate(c.decidedAt)}</td>
                <td>{c.decidedBy?.name ?? "—"}</td>
                <td>{c.verdict === "cleared" ? formatDate(c.validUntil) : "—"}</td>
                <td>v{c.policy.version}</td>
                <td>
                  {c.superseded ? <span className="muted">Superseded by a later decision. </span> : null}
                  <ClearanceBadge state={c.state} withReason />
                </td>
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={7}>No decisions yet.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </>
  );
}
