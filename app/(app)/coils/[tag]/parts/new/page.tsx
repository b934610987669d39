import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { getCoilByTag } from "@/lib/db/coils";
import { PartForm } from "../../part-form";

type Props = { params: Promise<{ tag: string }> };
export const metadata: Metadata = { title: "Fit a part" };

export default async function NewPartPage({ params }: Props) {
  const user = await pageUser("steward");
  const coil = await getCoilByTag(user.scope, decodeURIComponent((await params).tag));
  if (!coil) notFound();
  return (
    <>
      <div className="page-head">
        <h1>{coil.tag} — fit a part</h1>
        <Link href={`/coils/${encodeURIComponent(coil.tag)}`}>Back to the coil</Link>
      </div>
      <p className="lede">To swap a part that is already fitted, use “Replace” beside it on the coil page so the history keeps the old one.</p>
      <PartForm coilId={coil.id} today={new Date().toISOString().slice(0, 10)} />
    </>
  );
}
