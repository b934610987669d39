import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { getCoilByTag } from "@/lib/db/coils";
import { TopLoadForm } from "../../top-load-forms";

type Props = { params: Promise<{ tag: string }> };
export const metadata: Metadata = { title: "Add a top load" };

export default async function NewTopLoadPage({ params }: Props) {
  const user = await pageUser("steward");
  const coil = await getCoilByTag(user.scope, decodeURIComponent((await params).tag));
  if (!coil) notFound();
  return (
    <>
      <div className="page-head">
        <h1>
          {coil.tag} — new top load
        </h1>
        <Link href={`/coils/${encodeURIComponent(coil.tag)}`}>Back to the coil</Link>
      </div>
      <p className="lede">A new top load changes the resonance by design; sweep the coil again with it fitted before running.</p>
      <TopLoadForm coilId={coil.id} />
    </>
  );
}
