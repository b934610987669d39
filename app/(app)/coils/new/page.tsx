import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { CoilForm } from "../coil-form";

export const metadata: Metadata = { title: "New coil" };

export default async function NewCoilPage() {
  await pageUser("steward");
  return (
    <>
      <div className="page-head">
        <h1>New coil</h1>
        <Link href="/coils">Back to coils</Link>
      </div>
      <p className="lede">Type sizes the way you measured them — millimetres, inches or a wire gauge. Each field shows what it understood.</p>
      <CoilForm mode="new" />
    </>
  );
}
