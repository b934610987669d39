import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { getSessionDetail } from "@/lib/db/sessions";
import { getCurrentPolicy } from "@/lib/db/policy";
import { analyzeRunSession } from "@/lib/analysis/session-analysis";
import { formatDate, formatDateTime, formatDuration, formatNumber, formatPercent, formatQuantity, formatTemperature } from "@/lib/units/format";
import { COMPONENT_KIND_LABEL, FAILURE_MODE_LABEL, OUTCOME_LABEL } from "@/app/ui/labels";
import { MARGIN_KIND_LABEL } from "@/app/ui/margin-labels";
import { MarginDetails } from "./margin-details";
import { WarmUpSection } from "./warm-up-section";
import { checkSwitchLosses } from "@/lib/analysis/switch-loss-check";
import { PowerCrossCheckSection } from "./power-cross-check-section";

type Props = { params: Promise<{ id: string }> };

export const metadata: Metadata = { title: "Run session" };

export default async function SessionPage({ params }: Props) {
  const user = await pageUser("member");
  const [session, policy] = await Promise.all([getSessionDetail(user.scope, (await params).id), getCurrentPolicy(user.scope)]);
  if (!session) notFound();
  // Judged by the current lending policy and the warm-up fit stored with the session, as every other view judges it.
  const analysis = analyzeRunSession(session.coil, session, session.coil.components, session.samples, { policy: policy.rules });
  const margins = [analysis.margins.voltage, analysis.margins.current, analysis.margins.thermal];
  const worrying = margins.filter((m) => m.status === "thin" || m.status === "exceeded");
  const estimated = margins.filter((m) => m.estimated);
  const tag = session.coil.tag;

  return (
    <>
      <div className="page-head">
        <h1>
          Session on {tag}, {formatDateTime(session.startedAt)}
        </h1>
        <span className={`badge badge-${session.outcome === "normal" ? "ok" : session.outcome === "failed" ? "hold" : "watch"}`}>{OUTCOME_LABEL[session.outcome]}</span>
      </div>
      <p className="lede">
        <Link href={`/coils/${encodeURIComponent(tag)}`}>
          {tag} — {session.coil.name}
        </Link>
        {session.topLoad ? ` with ${session.topLoad.name}` : ""}. Logged by {session.loggedBy?.name ?? "someone since removed"}.
        {session.loan ? ` Run while on loan to ${session.loan.borrower} (${session.loan.event}).` : ""}
      </p>

      {worrying.length > 0 && (
        <div className="notice danger" role="alert">
          <strong>Margin warning: </strong>
          {worrying.map((m) => `${MARGIN_KIND_LABEL[m.kind]} ${m.status === "exceeded" ? "exceeded the limit" : `is thin (${formatPercent(m.headroom)} headroom)`}`).join("; ")}. Do not run at
          this setting again until the cause is understood.
        </div>
      )}
      {estimated.length > 0 && (
        <p className="notice warn">
          Estimated figures: the {estimated.map((m) => MARGIN_KIND_LABEL[m.kind].toLowerCase()).join(", ")} rest on at least one estimated input (marked below). Record the
          missing values to firm them up.
        </p>
      )}

      <div className="actions-row no-print">
        <Link className="button secondary" href={`/failures/new?coil=${encodeURIComponent(tag)}&session=${session.id}`}>
          Record a failure from this session
        </Link>
        <Link className="button secondary" href={`/sessions/new?coil=${encodeURIComponent(tag)}`}>
          Log another session on {tag}
        </Link>
      </div>

      <section aria-labelledby="run">
        <h2 id="run">The run</h2>
        <dl className="facts">
          <dt>Supply</dt>
          <dd>
            {formatNumber(session.supplyVoltageV, 1, "V")}, {formatNumber(session.supplyCurrentA, 2, "A")} average
          </dd>
          <dt>Duration</dt>
          <dd>{formatDuration(session.durationS)}</dd>
          <dt>Ambient</dt>
          <dd>{formatTemperature(session.ambientTempC)}</dd>
          <dt>Heat sink</dt>
          <dd>
            {formatTemperature(session.heatSinkStartC)} at start, {formatTemperature(session.heatSinkEndC)} at end
          </dd>
          <dt>Running frequency</dt>
          <dd>{formatQuantity(session.runningFrequencyHz, "Hz")}</dd>
          <dt>Peak collector/drain voltage</dt>
          <dd>{session.peakSwitchVoltageV === null ? "Not measured" : formatNumber(session.peakSwitchVoltageV, 0, "V")}</dd>
          <dt>Duty cycle</dt>
          <dd>{session.dutyCycle === null ? "Not known" : formatPercent(session.dutyCycle)}</dd>
          {session.notes && (
            <>
              <dt>Notes</dt>
              <dd>{session.notes}</dd>
            </>
          )}
        </dl>
      </section>

      <section aria-labelledby="margins">
        <h2 id="margins">Margins</h2>
        <p className="muted">How close this run took the switching transistor to its limits, with the parts fitted that day.</p>
        <div className="margin-grid">
          {margins.map((m) => (
            <MarginDetails key={m.kind} margin={m} />
          ))}
        </div>
      </section>

      <WarmUpSection analysis={analysis} samples={session.samples} supplyVoltageV={session.supplyVoltageV} />
      <PowerCrossCheckSection check={checkSwitchLosses(session.coil, session, analysis)} />

      <section aria-labelledby="parts">
        <h2 id="parts">Parts fitted that day</h2>
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Part</th>
                <th scope="col">Kind</th>
                <th scope="col">Installed</th>
                <th scope="col">Removed</th>
              </tr>
            </thead>
            <tbody>
              {analysis.parts.all.map((c) => (
                <tr key={c.id}>
                  <th scope="row">{c.partNumber}</th>
                  <td>{COMPONENT_KIND_LABEL[c.kind]}</td>
                  <td>{formatDate(c.installedAt)}</td>
                  <td>{c.removedAt ? formatDate(c.removedAt) : "Still fitted"}</td>
                </tr>
              ))}
              {analysis.parts.all.length === 0 && (
                <tr>
                  <td colSpan={4}>No parts were recorded as fitted on that day.</td>
                </tr>
              )}
            </tbody>
          </table>
        </div>
      </section>

      {session.failures.length > 0 && (
        <section aria-labelledby="failures">
          <h2 id="failures">Failures recorded from this session</h2>
          <ul>
            {session.failures.map((f) => (
              <li key={f.id}>
                <Link href={`/failures/${f.id}`}>
                  {FAILURE_MODE_LABEL[f.mode]} on {formatDateTime(f.occurredAt)}
                </Link>{" "}
                — post-mortem {f.status === "open" ? "open" : "completed"}
              </li>
            ))}
          </ul>
        </section>
      )}
    </>
  );
}
