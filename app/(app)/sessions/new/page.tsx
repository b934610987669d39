import type { Metadata } from "next";
import { pageUser } from "@/app/ui/page-guard";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { getCoilByTag, listCoilChoices } from "@/lib/db/coils";
import { findLastTopLoadId } from "@/lib/db/sessions";
import { toLocalDateTimeValue } from "@/lib/validation/session";
import { SessionForm } from "./session-form";

export const metadata: Metadata = { title: "Log a session" };

type Props = { searchParams: Promise<{ coil?: string | string[] }> };

export default async function NewSessionPage({ searchParams }: Props) {
  await pageUser("member");
  const raw = (await searchParams).coil;
  const tag = (Array.isArray(raw) ? raw[0] : raw)?.trim().toUpperCase();
  const coil = tag ? await getCoilByTag(tag) : null;

  if (!coil) {
    const coils = await listCoilChoices();
    return (
      <>
        <h1>Log a session</h1>
        {tag && <p className="notice warn">There is no coil tagged {tag}. Choose one below.</p>}
        <form method="get" className="stack bench-form" aria-label="Choose a coil">
          <div className="field">
            <label htmlFor="pick-coil">Coil</label>
            <select id="pick-coil" name="coil" required>
              {coils
                .filter((c) => c.status !== "retired")
                .map((c) => (
                  <option key={c.id} value={c.tag}>
                    {c.tag} — {c.name}
                  </option>
                ))}
            </select>
          </div>
          <button type="submit" className="big-button">
            Continue
          </button>
        </form>
      </>
    );
  }

  const lastTopLoadId = await findLastTopLoadId(coil.id);
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
