import type { Metadata } from "next";
import Link from "next/link";
import { headers } from "next/headers";
import { notFound } from "next/navigation";
import QRCode from "qrcode";
import { pageUser } from "@/app/ui/page-guard";
import { getCoilByTag } from "@/lib/db/coils";
import { listSweeps } from "@/lib/db/sweeps";
import { formatQuantity } from "@/lib/units/format";
import { TOPOLOGY_LABEL } from "@/app/ui/labels";
import { PrintButton } from "./print-button";

type Props = { params: Promise<{ tag: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Label ${decodeURIComponent((await params).tag)}` };
}

/**
 * The coil's page on the host this page was asked for, so a label printed in the lab opens on the lab's network. Tags
 * are unique only within a site, so the link names the site too: the coil page will not show another site's coil
 * of the same tag to someone scanning while working at that other site.
 */
async function coilUrl(tag: string, siteSlug: string): Promise<string> {
  const h = await headers();
  const host = h.get("x-forwarded-host") ?? h.get("host") ?? "localhost:3000";
  const proto = h.get("x-forwarded-proto") ?? "http";
  return `${proto}://${host}/coils/${encodeURIComponent(tag)}?site=${encodeURIComponent(siteSlug)}`;
}

export default async function CoilLabelPage({ params }: Props) {
  const user = await pageUser();
  const coil = await getCoilByTag(user.scope, decodeURIComponent((await params).tag));
  if (!coil) notFound();
  const url = await coilUrl(coil.tag, user.site.slug);
  const svg = await QRCode.toString(url, { type: "svg", errorCorrectionLevel: "M", margin: 1 });
  const sweeps = await listSweeps(user.scope, { coilTag: coil.tag }, { pageSize: 1 });
  const resonance = sweeps.rows[0]?.firstSeriesResonanceHz ?? null;
  const switches = coil.components.filter((c) => c.kind === "switch" && !c.removedAt).map((c) => c.partNumber);
  return (
    <>
      <div className="page-head no-print">
        <h1>Label for {coil.tag}</h1>
        <Link href={`/coils/${encodeURIComponent(coil.tag)}`}>Back to the coil</Link>
      </div>
      <p className="lede no-print">Print on a sticky label (about 90 × 50 mm). The code opens {url}.</p>
      <article className="coil-label" aria-label={`Label for ${coil.tag}`}>
        <div className="coil-label-qr" role="img" aria-label={`QR code opening ${url}`} dangerouslySetInnerHTML={{ __html: svg }} />
        <div className="coil-label-text">
          <p className="coil-label-tag">{coil.tag}</p>
          <p className="coil-label-name">{coil.name}</p>
          <p>
            Built by {coil.builderName} · {user.site.name}
          </p>
          <p>
            {TOPOLOGY_LABEL[coil.topology]}
            {switches.length ? ` · ${switches.join(", ")}` : ""}
          </p>
          <p>
            {coil.turns} turns on {formatQuantity(coil.formDiameterM, "m")}
            {resonance !== null ? ` · Fs ${formatQuantity(resonance, "Hz")}` : ""}
          </p>
          <p className="coil-label-caution">⚠ High voltage RF: isolate the supply before touching; check the logbook before running.</p>
        </div>
      </article>
      <PrintButton />
    </>
  );
}
