import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { ImportForm } from "./import-form";

export const metadata: Metadata = { title: "Import a logbook" };

export default async function ImportPage() {
  await pageUser("steward");
  return (
    <>
      <div className="page-head">
        <h1>Import a logbook file</h1>
        <Link href="/coils">Back to coils</Link>
      </div>
      <p className="lede">
        Re-import a JSON file exported from a coil&apos;s page or the fleet export. Everything in it goes in together, or nothing does. A coil whose tag is already
        here is refused; to keep both, give a new tag (one-coil files only) and a copy is made. People are matched by e-mail address.
      </p>
      <ImportForm />
    </>
  );
}
