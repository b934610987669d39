import type { Metadata } from "next";
import { pageUser } from "@/app/ui/page-guard";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { getCoilByTag, listCoilChoices } from "@/lib/db/coils";
import { findLastTopLoadId } from "@/lib/db/sessions";
import { toLocalDateTimeValue } from "@/lib/validation/session";
import { SessionForm } from "./session-form";
import { CoilPicker } from "@/app/ui/coil-picker";

export const metadata: Metadata = { title: "Log a session" };

type Props = { searchParams: Promise<{ coil?: string | string[] }> };

export default async function NewSessionPage({ searchParams }: Props) {
  const user = await pageUser("member");
  const raw = (await searchParams).coil;
  const tag = (Array.isArray(raw) ? raw[0] : raw)?.trim().toUpperCase();
  const coil = tag ? await getCoilByTag(user.scope, tag) : null;

  if (!coil) {
    const coils = await listCoilChoices(user.scope);
    return <CoilPicker title="Log a session" unknownTag={tag} coils={coils.filter((c) => c.status !== "retired")} />;
  }

  const lastTopLoadId = await findLastTopLoadId(user.scope, coil.id);
  const topLoads = coil.topLoads.filter((t) => !t.retiredAt || t.id === lastTopLoadId);
  return (
    <>
      <h1>Log a session</h1>
      <SafetyCautions context="run" />
      <SessionForm
        coil={{ id: coil.id, tag: coil.tag, name: coil.name }}
        topLoads={topLoads.map((t) => ({ id: t.id, name: t.name }))}
        defaultTopLoadId={lastTopLoadId ?? topLoads.at(-1)?.id ?? ""}
        defaultStartedAt={toLocalDateTimeValue(new Date())}
      />
    </>
  );
}
