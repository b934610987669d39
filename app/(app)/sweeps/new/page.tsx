import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { getCoilForSweepEntry } from "@/lib/db/sweeps";
import { listCoilChoices } from "@/lib/db/coils";
import { CoilPicker } from "../coil-picker";
import { SweepEntryForm } from "./sweep-entry-form";

export const metadata: Metadata = { title: "New sweep" };

export default async function NewSweepPage({ searchParams }: { searchParams: Promise<{ coil?: string | string[] }> }) {
  const user = await pageUser("member");
  const tag = [(await searchParams).coil].flat()[0];
  if (!tag) {
    return (
      <>
        <h1>New sweep</h1>
        <p className="lede">Which coil was swept?</p>
        <CoilPicker coils={await listCoilChoices(user.scope)} action="/sweeps/new" />
      </>
    );
  }
  const coil = await getCoilForSweepEntry(user.scope, tag);
  if (!coil) notFound();
  return (
    <>
      <h1>New sweep of {coil.tag}</h1>
      <p className="lede">
        Generator → series resistor → coil → ground; each reading is the amplitude across the coil. Have a file from a scope or a script?{" "}
        <Link href={`/sweeps/import?coil=${encodeURIComponent(coil.tag)}`}>Import a CSV</Link> instead.
      </p>
      <SweepEntryForm coil={coil} />
    </>
  );
}
