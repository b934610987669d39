import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { getCoilForSweepEntry } from "@/lib/db/sweeps";
import { listCoilChoices } from "@/lib/db/coils";
import { CoilPicker } from "../coil-picker";
import { SweepImportForm } from "./sweep-import-form";

export const metadata: Metadata = { title: "Import a sweep" };

export default async function ImportSweepPage({ searchParams }: { searchParams: Promise<{ coil?: string | string[] }> }) {
  const user = await pageUser("member");
  const tag = [(await searchParams).coil].flat()[0];
  if (!tag) {
    return (
      <>
        <h1>Import a sweep</h1>
        <p className="lede">Which coil was swept?</p>
        <CoilPicker coils={await listCoilChoices(user.scope)} action="/sweeps/import" />
      </>
    );
  }
  const coil = await getCoilForSweepEntry(user.scope, tag);
  if (!coil) notFound();
  return (
    <>
      <h1>Import a sweep of {coil.tag}</h1>
      <p className="lede">
        A CSV from an oscilloscope or a logging script: one row per reading, a frequency column and an amplitude column. Nothing is saved until you
        have seen the preview; a file with a bad row is refused whole. Typing readings by hand? <Link href={`/sweeps/new?coil=${encodeURIComponent(coil.tag)}`}>Enter them in a grid</Link>.
      </p>
      <SweepImportForm coil={coil} />
    </>
  );
}
