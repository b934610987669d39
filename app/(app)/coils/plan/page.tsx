import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { hasRole } from "@/lib/auth/roles";
import { listPlanStartingPoints } from "@/lib/db/plans";
import { getCurrentPolicy } from "@/lib/db/policy";
import { PlanForm } from "./plan-form";

export const metadata: Metadata = { title: "Plan a build" };

export default async function PlanPage() {
  const user = await pageUser("member");
  const [starts, policy] = await Promise.all([listPlanStartingPoints(user.scope), getCurrentPolicy(user.scope)]);
  return (
    <>
      <div className="page-head">
        <h1>Plan a build</h1>
        <Link href="/coils">Back to coils</Link>
      </div>
      <p className="lede">
        Try a build before winding it: up to three variants side by side, judged by lending policy v{policy.version} (ITU Region {policy.rules.ituRegion}). Every
        figure is a model&apos;s estimate with its basis listed under the table; a planned coil&apos;s page later compares them with what is measured.
        {hasRole(user.role, "steward") ? " Stewards can save a variant as a planned coil." : " Any member can plan; a steward saves a plan as a planned coil."}
      </p>
      <SafetyCautions context="run" />
      <PlanForm starts={starts} canSave={hasRole(user.role, "steward")} />
    </>
  );
}
