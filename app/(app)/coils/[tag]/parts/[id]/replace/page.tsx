import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { getComponent } from "@/lib/db/components";
import { formatDate } from "@/lib/units/format";
import { COMPONENT_KIND_LABEL } from "@/app/ui/labels";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { PartForm } from "../../../part-form";

type Props = { params: Promise<{ tag: string; id: string }> };
export const metadata: Metadata = { title: "Replace a part" };

export default async function ReplacePartPage({ params }: Props) {
  const user = await pageUser("steward");
  const { tag, id } = await params;
  const part = await getComponent(user.scope, id);
  if (!part || part.coil.tag !== decodeURIComponent(tag)) notFound();
  const label = `${part.partNumber} (${COMPONENT_KIND_LABEL[part.kind]})`;
  return (
    <>
      <div className="page-head">
        <h1>
          {part.coil.tag} — replace {part.partNumber}
        </h1>
        <Link href={`/coils/${encodeURIComponent(part.coil.tag)}`}>Back to the coil</Link>
      </div>
      {part.removedAt ? (
        <p className="notice warn">
          {label} was already removed on {formatDate(part.removedAt)}{part.removalReason ? ` (${part.removalReason})` : ""}; there is nothing to replace.
        </p>
      ) : (
        <>
          <p className="lede">
            {label}, fitted {formatDate(part.installedAt)}, comes out and stays in the coil&apos;s history with the date and your reason; the new part goes in on the same day.
          </p>
          <SafetyCautions context="repair" />
          <PartForm coilId={part.coilId} replacing={{ id: part.id, kind: part.kind, label }} today={new Date().toISOString().slice(0, 10)} />
        </>
      )}
    </>
  );
}
