import type { Metadata } from "next";
import { headers } from "next/headers";
import { notFound } from "next/navigation";
import QRCode from "qrcode";
import { pageUser } from "@/app/ui/page-guard";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { getClearanceSheet } from "@/lib/db/clearances";
import { HealthVerdict } from "../../health-verdict";
import { formatCount, formatDateTime, formatDuration, formatNumber } from "@/lib/units/format";
import { TOPOLOGY_LABEL } from "@/app/ui/labels";
import { RuleResultsTable } from "../../rule-results-table";
import { PrintButton } from "./print-button";

export const metadata: Metadata = { title: "Clearance sheet" };

/** The page's own address as the visitor reached it, so the QR code works on this installation. */
async function liveUrl(path: string): Promise<string> {
  const h = await headers();
  const host = h.get("x-forwarded-host") ?? h.get("host") ?? "localhost";
  const proto = h.get("x-forwarded-proto") ?? (host.startsWith("localhost") || host.startsWith("127.") ? "http" : "https");
  return `${proto}://${host}${path}`;
}

/**
 * The sheet that travels with a lent coil. Read by the coil's site and by a site it was lent to (that site sees this
 * sheet and the loan's, nothing else of the lending site: its code links to this sheet rather than the decision page).
 */
export default async function ClearanceSheetPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser();
  const { id } = await params;
  const clearance = await getClearanceSheet(user.scope, id);
  if (!clearance) notFound();
  const { state, health } = clearance;
  const borrowed = clearance.viewer === "borrowing-site";
  const url = await liveUrl(borrowed ? `/clearances/${clearance.id}/sheet` : `/clearances/${clearance.id}`);
  const qrSvg = await QRCode.toString(url, { type: "svg", margin: 1, errorCorrectionLevel: "M" });
  return (
    <article className="clearance-sheet">
      <header className="sheet-head">
        <div>
          <h1>
            Lending sheet: {clearance.coil.tag} — {clearance.coil.name}
          </h1>
          <p>
            Built by {clearance.coil.builderName}; {TOPOLOGY_LABEL[clearance.coil.topology]} driver.
            {borrowed && <> On loan from {clearance.coil.site.name}.</>}
          </p>
          <p className="sheet-verdict">
            {clearance.verdict === "cleared" ? (
              <>
                Passed the team&apos;s recorded checks. Cleared by {clearance.decidedBy?.name ?? "—"} on {formatDateTime(clearance.decidedAt)}, valid until{" "}
                <strong>{formatDateTime(clearance.validUntil)}</strong> (policy version {clearance.policy.version}).
              </>
            ) : (
              <>Refused by {clearance.decidedBy?.name ?? "—"} on {formatDateTime(clearance.decidedAt)}: not for lending.</>
            )}
          </p>
          <p>
            <strong>Status now:</strong> {state.explanation} Scan the code for the live record.
          </p>
        </div>
        <figure className="sheet-qr">
          <div role="img" aria-label={`QR code linking to ${url}`} dangerouslySetInnerHTML={{ __html: qrSvg }} />
          <figcaption className="mono">{url}</figcaption>
        </figure>
      </header>
      <HealthVerdict health={health} when={`when printed (${formatDateTime(new Date())})`} />
      <section aria-labelledby="conditions-heading">
        <h2 id="conditions-heading">Conditions</h2>
        <ul>
          <li>Supply at most {clearance.maxSupplyVoltageV === null ? "—" : formatNumber(clearance.maxSupplyVoltageV, 1, "V")}</li>
          <li>Runs of at most {clearance.maxRunS === null ? "—" : formatDuration(clearance.maxRunS)}</li>
          {clearance.conditions && <li>{clearance.conditions}</li>}
        </ul>
      </section>
      <SafetyCautions context="lend" />
      <section aria-labelledby="rules-heading">
        <h2 id="rules-heading">Rule results at signing</h2>
        <RuleResultsTable rules={clearance.rules.filter((r) => !r.id.startsWith("checklist:"))} caption="Recorded checks" />
        <p>
          Checklist: {clearance.checklist.filter((c) => c.answer).length} of {formatCount(clearance.checklist.length, "item")} confirmed by the steward.
        </p>
      </section>
      <p className="muted">Coilyard records the team&apos;s checks; it does not certify a build as safe. Local codes, venue rules and licensed practice come first.</p>
      <PrintButton />
    </article>
  );
}
