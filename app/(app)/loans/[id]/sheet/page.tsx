import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { getLoanHandover } from "@/lib/db/loans";
import { formatDate, formatDateTime, formatDuration, formatNumber } from "@/lib/units/format";
import { PrintButton } from "../../../clearances/[id]/sheet/print-button";

export const metadata: Metadata = { title: "Handover sheet" };

/**
 * The confirmation of a loan: what went out, to whom, until when, under which conditions, signed by both sides. Read
 * by the lending site and, for a loan to another site's event, by that site (with the clearance sheet it links to).
 */
export default async function LoanHandoverPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ lent?: string }> }) {
  const user = await pageUser();
  const [{ id }, { lent }] = await Promise.all([params, searchParams]);
  const loan = await getLoanHandover(user.scope, id);
  if (!loan) notFound();
  const { clearance } = loan;
  return (
    <article className="clearance-sheet handover-sheet">
      {lent === "1" && loan.viewer === "lending-site" && (
        <p role="status" className="notice ok no-print">
          <span className="nowrap">{loan.coil.tag}</span> is lent to {loan.borrower}. Print this handover sheet and have it signed when the coil leaves.{" "}
          <Link href="/loans?state=out">Back to the loans</Link>
        </p>
      )}
      <h1>
        Handover sheet: <span className="nowrap">{loan.coil.tag}</span> — {loan.coil.name}
      </h1>
      <dl className="facts">
        <dt>Borrower</dt>
        <dd>
          {loan.borrower}
          {loan.borrowerContact ? ` (${loan.borrowerContact})` : ""}
          {loan.borrowerSite ? `, for ${loan.borrowerSite.name}` : ""}
        </dd>
        <dt>Event</dt>
        <dd>{loan.event}</dd>
        <dt>Goes out</dt>
        <dd className="nowrap">{formatDateTime(loan.outAt)}</dd>
        <dt>Return by</dt>
        <dd>
          <strong className="nowrap">{formatDate(loan.expectedBackAt)}</strong>
        </dd>
        <dt>Lent by</dt>
        <dd>
          {loan.lentBy?.name ?? "—"}
          {loan.borrowerSite ? ` (${loan.coil.site.name})` : ""}
        </dd>
        <dt>Clearance</dt>
        <dd>
          Passed the team&apos;s recorded checks on <span className="nowrap">{formatDate(clearance.decidedAt)}</span>, valid until{" "}
          <span className="nowrap">{formatDate(clearance.validUntil)}</span> (policy version {clearance.policy.version}).{" "}
          <Link href={`/clearances/${clearance.id}/sheet`} className="no-print">
            Clearance sheet
          </Link>
        </dd>
      </dl>
      <section aria-labelledby="handover-conditions">
        <h2 id="handover-conditions">Conditions of use</h2>
        <ul>
          <li>Supply at most {clearance.maxSupplyVoltageV === null ? "as on the clearance sheet" : formatNumber(clearance.maxSupplyVoltageV, 1, "V")}</li>
          <li>Runs of at most {clearance.maxRunS === null ? "as on the clearance sheet" : formatDuration(clearance.maxRunS)}</li>
          {clearance.conditions && <li>{clearance.conditions}</li>}
          <li>Report any failure, smell of burning or change in sound at once, and do not run the coil again until a steward has looked at it.</li>
        </ul>
      </section>
      <SafetyCautions context="lend" />
      <section aria-labelledby="handover-signatures">
        <h2 id="handover-signatures">Signatures</h2>
        <p>The borrower received the coil in the condition described and agrees to the conditions above and to return it by the date shown.</p>
        <div className="signature-lines">
          <p>
            Borrower (name and signature): <span className="signature-line" aria-hidden="true" />
          </p>
          <p>
            Steward (name and signature): <span className="signature-line" aria-hidden="true" />
          </p>
          <p>
            Date: <span className="signature-line short" aria-hidden="true" />
          </p>
        </div>
      </section>
      <p className="muted">Coilyard records the team&apos;s checks; it does not certify a build as safe. Local codes, venue rules and licensed practice come first.</p>
      <PrintButton />
    </article>
  );
}
