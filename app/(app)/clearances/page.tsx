import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { listClearances } from "@/lib/db/clearances";
import { formatDate } from "@/lib/units/format";

export const metadata: Metadata = { title: "Clearances" };

export default async function ClearancesPage() {
  await pageUser();
  const rows = await listClearances();
  return (
    <>
      <h1>Clearance decisions</h1>
      <p className="lede">Every signed decision, newest first. Decisions are never edited; a lapse is recorded beside them.</p>
      <div className="table-wrap">
        <table>
          <caption>{rows.length} decisions</caption>
          <thead>
            <tr>
              <th scope="col">Coil</th>
              <th scope="col">Decision</th>
              <th scope="col">Signed</th>
              <th scope="col">By</th>
              <th scope="col">Valid until</th>
              <th scope="col">Policy</th>
              <th scope="col">Lapse</th>
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
                <td>{c.lapseReason ?? "—"}</td>
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
