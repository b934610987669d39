import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { getCoilByTag } from "@/lib/db/coils";
import { CoilForm } from "../../coil-form";
import { quantityText } from "../../quantity-text";

type Props = { params: Promise<{ tag: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Edit ${decodeURIComponent((await params).tag)}` };
}

export default async function EditCoilPage({ params }: Props) {
  const user = await pageUser("steward");
  const coil = await getCoilByTag(user.scope, decodeURIComponent((await params).tag));
  if (!coil) notFound();
  const values = {
    name: coil.name,
    builderName: coil.builderName,
    status: coil.status,
    topology: coil.topology,
    formDiameterM: quantityText(coil.formDiameterM, "length", "mm"),
    windingLengthM: quantityText(coil.windingLengthM, "length", "mm"),
    wireDiameterM: coil.wireGaugeAwg !== null ? `AWG ${coil.wireGaugeAwg < 0 ? "0".repeat(1 - coil.wireGaugeAwg) : coil.wireGaugeAwg}` : quantityText(coil.wireDiameterM, "wireDiameter"),
    wireMaterial: coil.wireMaterial,
    turns: String(coil.turns),
    measuredInductanceH: quantityText(coil.measuredInductanceH, "inductance"),
    measuredDcResistanceOhm: quantityText(coil.measuredDcResistanceOhm, "resistance"),
    primaryTurns: coil.primaryTurns === null ? "" : String(coil.primaryTurns),
    primaryDiameterM: quantityText(coil.primaryDiameterM, "length", "mm"),
    notes: coil.notes,
  };
  return (
    <>
      <div className="page-head">
        <h1>
          Edit {coil.tag} — {coil.name}
        </h1>
        <Link href={`/coils/${encodeURIComponent(coil.tag)}`}>Back to the coil</Link>
      </div>
      <p className="lede">The tag stays: printed labels point to it.</p>
      <CoilForm mode="edit" coilId={coil.id} version={coil.version} values={values} />
    </>
  );
}
