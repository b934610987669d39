import type { Metadata } from "next";
import { pageUser } from "@/app/ui/page-guard";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { COMPONENT_KIND_LABEL } from "@/app/ui/labels";
import { getCoilByTag, listCoilChoices } from "@/lib/db/coils";
import { listSessions } from "@/lib/db/sessions";
import { partsFittedAt } from "@/lib/analysis/fitted-parts";
import { toLocalDateTimeValue } from "@/lib/validation/session";
import { formatDateTime, formatNumber } from "@/lib/units/format";
import { FailureForm } from "./failure-form";
import { CoilPicker } from "@/app/ui/coil-picker";

export const metadata: Metadata = { title: "Record a failure" };

type Props = { searchParams: Promise<{ coil?: string | string[]; session?: string | string[] }> };

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v)?.trim();

export default async function NewFailurePage({ searchParams }: Props) {
  const user = await pageUser("member");
  const query = await searchParams;
  const tag = first(query.coil)?.toUpperCase();
  const coil = tag ? await getCoilByTag(user.scope, tag) : null;

  if (!coil) {
    const coils = await listCoilChoices(user.scope);
    return <CoilPicker title="Record a failure" unknownTag={tag} coils={coils} />;
  }

  const recent = await listSessions(user.scope, { coilTag: coil.tag }, { pageSize: 15 });
  const sessionId = first(query.session);
  const session = recent.rows.find((s) => s.id === sessionId) ?? null;
  // The failure is taken to have happened at the end of its session, unless that is still to come.
  const occurredAt = session ? new Date(Math.min(Date.now(), session.startedAt.getTime() + session.durationS * 1000)) : new Date();
  const parts = partsFittedAt(coil.components, session?.startedAt ?? occurredAt);
  const ordered = [...parts.switches, ...parts.all.filter((c) => c.kind !== "switch")];

  return (
    <>
      <h1>Record a failure</h1>
      <SafetyCautions context="repair" />
      {sessionId && !session && <p className="notice warn">That session is not one of {coil.tag}&apos;s recent sessions; choose it below if it applies.</p>}
      <FailureForm
        coil={{ id: coil.id, tag: coil.tag }}
        sessions={recent.rows.map((s) => ({ id: s.id, label: `${formatDateTime(s.startedAt)} — ${formatNumber(s.supplyVoltageV, 0, "V")}, ${formatNumber(s.supplyCurrentA, 1, "A")}` }))}
        defaultSessionId={session?.id ?? ""}
        parts={ordered.map((c) => ({ id: c.id, label: `${c.partNumber} (${COMPONENT_KIND_LABEL[c.kind]})` }))}
        defaultOccurredAt={toLocalDateTimeValue(occurredAt)}
      />
    </>
  );
}
