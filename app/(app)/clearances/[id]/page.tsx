import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { hasRole } from "@/lib/auth/roles";
import { getClearance, getClearanceStateById, getCoilHealthForClearance, recordClearanceLapse } from "@/lib/db/clearances";
import { HealthVerdict } from "../health-verdict";
import { formatCount, formatDateTime, formatDuration, formatNumber } from "@/lib/units/format";
import { ClearanceBadge } from "../clearance-badge";
import { RuleResultsTable } from "../rule-results-table";

export const metadata: Metadata = { title: "Clearance decision" };

export default async function ClearancePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser();
  const { id } = await params;
  const clearance = await getClearance(user.scope, id);
  if (!clearance) notFound();
  const [state, health] = await Promise.all([getClearanceStateById(user.scope, id).then((s) => s!), getCoilHealthForClearance(user.scope, clearance.coilId)]);
  // A lapse is recorded the first time it is seen (once; never overwritten).
  if (!clearance.lapsedAt) await recordClearanceLapse(user.scope, id, state);
  return (
    <>
      <div className="page-head">
        <h1>
          {clearance.verdict === "cleared" ? "Clearance" : "Refused clearance"}: {clearance.coil.tag} — {clearance.coil.name}
        </h1>
        <ClearanceBadge state={state} />
      </div>
      <p className={`notice ${state.kind === "valid" ? "ok" : "warn"}`}>{state.explanation}</p>
      <HealthVerdict health={health} when={`now (${formatDateTime(new Date())})`} />
      <dl className="facts">
        <dt>Decision</dt>
        <dd>{clearance.verdict === "cleared" ? "Passed the team's recorded checks; cleared for lending" : "Refused"}</dd>
        <dt>Signed by</dt>
        <dd>
          {clearance.decidedBy?.name ?? "—"} on {formatDateTime(clearance.decidedAt)}
        </dd>
        <dt>Valid until</dt>
        <dd>{clearance.verdict === "cleared" ? formatDateTime(clearance.validUntil) : "—"}</dd>
        <dt>Policy</dt>
        <dd>version {clearance.policy.version}</dd>
        <dt>Maximum supply voltage</dt>
        <dd>{clearance.maxSupplyVoltageV === null ? "—" : formatNumber(clearance.maxSupplyVoltageV, 1, "V")}</dd>
        <dt>Maximum run length</dt>
        <dd>{clearance.maxRunS === null ? "—" : formatDuration(clearance.maxRunS)}</dd>
        <dt>Other conditions</dt>
        <dd>{clearance.conditions || "—"}</dd>
        {clearance.lapsedAt && (
          <>
            <dt>Lapse recorded</dt>
            <dd>{clearance.lapseReason}</dd>
          </>
        )}
      </dl>
      <p className="no-print">
        <Link href={`/clearances/${clearance.id}/sheet`} className="button secondary">
          Printable sheet
        </Link>{" "}
        {hasRole(user.role, "steward") && state.kind === "valid" && (
          <Link href={`/loans/new?coil=${encodeURIComponent(clearance.coil.tag)}`} className="button">
            Lend this coil
          </Link>
        )}
      </p>
      <h2>Rule results as evaluated at signing</h2>
      <RuleResultsTable rules={clearance.rules} caption={`${clearance.rules.filter((r) => r.pass).length} of ${formatCount(clearance.rules.length, "rule")} passed`} />
      <h2>Checklist answers</h2>
      <ul>
        {clearance.checklist.map((item) => (
          <li key={item.id}>
            <strong>{item.answer ? "Yes" : "No"}</strong> — {item.text}
          </li>
        ))}
      </ul>
      <p className="muted">
        A signed decision is kept exactly as signed: there is no way to edit it. A later failure, part replacement or expiry is recorded as a lapse beside it;
        a changed view needs a new decision.
      </p>
    </>
  );
}
