import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { getCoilByTag } from "@/lib/db/coils";
import { getClearance, getCoilClearanceState } from "@/lib/db/clearances";
import { listBorrowerSites } from "@/lib/db/loans";
import { describeLendingBlock } from "@/lib/analysis/clearance-state";
import type { SearchParams } from "@/lib/validation/list-query";
import { formatDate, formatDuration, formatNumber } from "@/lib/units/format";
import { ClearanceBadge } from "../../clearances/clearance-badge";
import { LoanForm } from "./loan-form";

export const metadata: Metadata = { title: "Lend a coil" };

export default async function NewLoanPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser("steward");
  const tag = (await searchParams).coil;
  if (typeof tag !== "string" || tag === "") notFound();
  const coil = await getCoilByTag(user.scope, tag);
  if (!coil) notFound();
  const [state, sites] = await Promise.all([getCoilClearanceState(user.scope, coil.id), listBorrowerSites(user.scope)]);
  const block = describeLendingBlock(state);
  const clearance = state.clearanceId ? await getClearance(user.scope, state.clearanceId) : null;
  // Default return: a week from today, but never after the clearance ends.
  const week = new Date(Date.now() + 7 * 86_400_000);
  const back = state.validUntil && state.validUntil < week ? state.validUntil : week;
  return (
    <>
      <h1>
        Lend {coil.tag} — {coil.name}
      </h1>
      <p>
        Clearance: <ClearanceBadge state={state} />{" "}
        {clearance && <Link href={`/clearances/${clearance.id}`}>see the decision</Link>}
      </p>
      {coil.status === "planned" && (
        <p className="notice danger" role="alert">
          {coil.tag} is only planned: it is not lent until it is built, set to active and cleared.
        </p>
      )}
      {block ? (
        <p className="notice danger" role="alert">
          {block} <Link href={`/clearances/new?coil=${encodeURIComponent(coil.tag)}`}>Start a clearance</Link>
        </p>
      ) : (
        clearance && (
          <p className="notice ok">
            Conditions: supply at most {clearance.maxSupplyVoltageV === null ? "—" : formatNumber(clearance.maxSupplyVoltageV, 1, "V")}; runs of at most{" "}
            {clearance.maxRunS === null ? "—" : formatDuration(clearance.maxRunS)}. {clearance.conditions} Valid until {formatDate(clearance.validUntil)}.
          </p>
        )
      )}
      <SafetyCautions context="lend" />
      {/* The form is shown even when blocked: the server refuses with the reason either way. */}
      <LoanForm coilId={coil.id} defaultBackDate={back.toLocaleDateString("en-CA")} siteName={user.site.name} otherSites={sites} />
    </>
  );
}
