import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { hasRole } from "@/lib/auth/roles";
import { describeQuantity } from "@/lib/validation/quantity";
import { toLocalDateTimeValue } from "@/lib/validation/session";
import { formatDateTime } from "@/lib/units/format";
import { FAILURE_MODE_LABEL } from "@/app/ui/labels";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { MarginsBeforeTable, PartsTable, RankedCauses } from "./post-mortem-sections";
import { PostMortemForm } from "./post-mortem-form";
import { loadPostMortem } from "./load-post-mortem";

type Props = { params: Promise<{ id: string }> };

export const metadata: Metadata = { title: "Post-mortem" };

export default async function PostMortemPage({ params }: Props) {
  const user = await pageUser("member");
  const { failure, analysis } = await loadPostMortem(user.scope, (await params).id);
  const tag = failure.coil.tag;
  const part = failure.component;
  const replaceable = part && part.removedAt === null ? part : null;
  const ratings = replaceable
    ? [
        { name: "voltageRatingV", label: "Voltage rating", value: describeQuantity(replaceable.voltageRatingV, "voltage"), hint: "V_CEO / V_DSS" },
        { name: "continuousCurrentA", label: "Continuous current rating", value: describeQuantity(replaceable.continuousCurrentA, "current"), hint: "" },
        { name: "peakCurrentA", label: "Peak current rating", value: describeQuantity(replaceable.peakCurrentA, "current"), hint: "" },
        { name: "powerRating25CW", label: "Power rating at 25 °C", value: describeQuantity(replaceable.powerRating25CW, "power"), hint: "" },
        { name: "maxJunctionTempC", label: "Maximum junction temperature", value: describeQuantity(replaceable.maxJunctionTempC, "temperature"), hint: "" },
        { name: "thermalResistanceJcKPerW", label: "Junction-to-case resistance", value: describeQuantity(replaceable.thermalResistanceJcKPerW, "thermalResistance"), hint: "" },
        { name: "caseToSinkKPerW", label: "Case-to-sink resistance", value: describeQuantity(replaceable.caseToSinkKPerW, "thermalResistance"), hint: "Pad or grease" },
        { name: "sinkThermalResistanceKPerW", label: "Sink-to-ambient resistance", value: describeQuantity(replaceable.sinkThermalResistanceKPerW, "thermalResistance"), hint: "Heat sinks only" },
      ].filter((r) => replaceable.kind === "switch" ? r.name !== "sinkThermalResistanceKPerW" : replaceable.kind === "heat_sink" ? r.name === "sinkThermalResistanceKPerW" : false)
    : [];

  return (
    <>
      <div className="page-head">
        <h1>
          Post-mortem: {tag} failure, {formatDateTime(failure.occurredAt)}
        </h1>
        <span className={`badge badge-${failure.status}`}>{failure.status === "open" ? "Open" : "Completed"}</span>
      </div>
      <p className="lede">
        <Link href={`/coils/${encodeURIComponent(tag)}`}>
          {tag} — {failure.coil.name}
        </Link>
        . {FAILURE_MODE_LABEL[failure.mode]}, reported by {failure.reportedBy?.name ?? "someone since removed"}.
        {failure.session && (
          <>
            {" "}
            From the <Link href={`/sessions/${failure.session.id}`}>session of {formatDateTime(failure.session.startedAt)}</Link>.
          </>
        )}
      </p>
      <div className="actions-row no-print">
        <Link className="button secondary" href={`/failures/${failure.id}/report`}>
          Printable report
        </Link>
      </div>

      <section aria-labelledby="what-happened">
        <h2 id="what-happened">What happened</h2>
        <dl className="facts">
          <dt>Failed part</dt>
          <dd>{part ? `${part.partNumber}${part.manufacturer ? ` (${part.manufacturer})` : ""}` : "Not identified"}</dd>
          <dt>Mode</dt>
          <dd>{FAILURE_MODE_LABEL[failure.mode]}</dd>
          <dt>Symptoms</dt>
          <dd>{failure.symptoms}</dd>
        </dl>
      </section>

      <section aria-labelledby="parts">
        <h2 id="parts">Parts fitted that day</h2>
        <PartsTable parts={analysis.partsAtFailure.all} failedId={failure.componentId} caption={`Fitted to ${tag} on ${formatDateTime(failure.occurredAt)}`} />
      </section>

      <section aria-labelledby="margins-before">
        <h2 id="margins-before">Margins before the failure</h2>
        <MarginsBeforeTable analysis={analysis} linkSessions />
      </section>

      <section aria-labelledby="causes">
        <h2 id="causes">Likely causes</h2>
        <RankedCauses analysis={analysis} />
      </section>

      {failure.status === "closed" ? (
        <section aria-labelledby="findings">
          <h2 id="findings">Findings</h2>
          {/* A live region, so completing the post-mortem (which replaces the form with this section) is announced. */}
          <p role="status" className="notice ok">
            Post-mortem completed {formatDateTime(failure.closedAt)} by {failure.closedBy?.name ?? "—"}
            {failure.replacementComponent ? `; ${failure.replacementComponent.partNumber} recorded as the replacement` : ""}.
          </p>
          <dl className="facts">
            <dt>Root cause</dt>
            <dd>{failure.rootCause}</dd>
            <dt>Corrective action</dt>
            <dd>{failure.correctiveAction}</dd>
            <dt>Replacement</dt>
            <dd>{failure.replacementComponent ? `${failure.replacementComponent.partNumber}, fitted ${formatDateTime(failure.replacementComponent.installedAt)}` : "None recorded"}</dd>
            <dt>Completed</dt>
            <dd>
              {formatDateTime(failure.closedAt)} by {failure.closedBy?.name ?? "—"}
            </dd>
          </dl>
        </section>
      ) : hasRole(user.role, "steward") ? (
        <>
          <SafetyCautions context="repair" />
          <PostMortemForm
            failureId={failure.id}
            recordedMode={failure.mode}
            failedPart={replaceable ? { partNumber: replaceable.partNumber, manufacturer: replaceable.manufacturer, ratings } : null}
            defaultInstalledAt={toLocalDateTimeValue(new Date())}
          />
        </>
      ) : (
        <p className="notice">The post-mortem is open. A steward completes it with the root cause, the corrective action and any replacement part.</p>
      )}
    </>
  );
}
