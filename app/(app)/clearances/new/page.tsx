import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { getCoilByTag } from "@/lib/db/coils";
import { evaluateCoilForClearance, getCoilHealthForClearance } from "@/lib/db/clearances";
import type { SearchParams } from "@/lib/validation/list-query";
import { formatDate } from "@/lib/units/format";
import { RuleResultsTable } from "../rule-results-table";
import { ClearanceForm } from "./clearance-form";
import { HealthVerdict, describeChecksWithHealth } from "../health-verdict";

export const metadata: Metadata = { title: "Clear a coil for lending" };

export default async function NewClearancePage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser("steward");
  const tag = (await searchParams).coil;
  if (typeof tag !== "string" || tag === "") notFound();
  const coil = await getCoilByTag(user.scope, tag);
  if (!coil) notFound();
  const now = new Date();
  const [evaluated, health] = await Promise.all([evaluateCoilForClearance(user.scope, coil.id, {}, now), getCoilHealthForClearance(user.scope, coil.id, now)]);
  if (!evaluated) notFound();
  const { policy, evaluation, latestSession, latestAnalysis, latestSweep, maxRun, hardestSessionIds } = evaluated;
  const dataRules = evaluation.rules.filter((r) => !r.id.startsWith("checklist:"));
  const dataRulesPass = dataRules.every((r) => r.pass);
  // Pre-filled only from a lower confidence bound of a usable warm-up fit (lib/analysis/clearance-facts.ts findMaxRunBound).
  const runS = maxRun.seconds;
  const runPrefill = runS !== null && Number.isFinite(runS) && runS > 0 ? `${Math.max(1, Math.floor(runS / 60))} min` : "";
  return (
    <>
      <h1>
        Clearance for {coil.tag} — {coil.name}
      </h1>
      <p className="lede">
        Lending policy version {policy.version} (ITU Region {policy.rules.ituRegion}; valid {policy.rules.validityDays} days once signed). Latest session{" "}
        {formatDate(latestSession?.startedAt)}, latest sweep with the current top load {formatDate(latestSweep?.takenAt)}.
      </p>
      <SafetyCautions context="lend" />
      {coil.status === "planned" && (
        <p className="notice danger" role="alert">
          {coil.tag} is only planned: it cannot be cleared until it is built and set to active. A refusal may still be recorded.
        </p>
      )}
      <h2>Recorded checks</h2>
      <p className={`notice ${dataRulesPass ? (health?.status === "watch" || health?.status === "hold" ? "warn" : "ok") : "danger"}`}>
        {dataRulesPass
          ? describeChecksWithHealth(health?.status)
          : `${failingChecks(dataRules.filter((r) => !r.pass).length)}, so this coil cannot be cleared now. You may record a refusal with these reasons.`}
      </p>
      <HealthVerdict health={health} when="now" />
      <RuleResultsTable rules={dataRules} caption="Rules evaluated from the logbook (checked again on the server when you sign)" />
      <p className="muted">
        Margins are judged on the hardest of the recent sessions at the coil&apos;s current setup
        {hardestSessionIds.thermal ? (
          <>
            {" "}
            (thermal: <Link href={`/sessions/${hardestSessionIds.thermal}`}>this session</Link>)
          </>
        ) : null}
        , not only the latest.
      </p>
      {latestAnalysis?.warmUp && <p className="muted">Warm-up of the latest session: {latestAnalysis.warmUp.explanations[0]}</p>}
      <p className="muted" data-testid="max-run-basis">
        Maximum run: {maxRun.reason}
      </p>
      <h2>Checklist, conditions and signature</h2>
      <ClearanceForm
        coilId={coil.id}
        checklist={policy.rules.requiredChecklist}
        rulesPass={dataRulesPass}
        defaults={{
          maxSupplyVoltageV: latestSession ? `${latestSession.supplyVoltageV} V` : "",
          maxRunS: runPrefill,
          conditions: runPrefill ? `Runs of at most ${runPrefill} at up to ${maxRun.supplyVoltageV} V (${maxRun.reason})` : "",
        }}
      />
      <p>
        <Link href={`/coils/${encodeURIComponent(coil.tag)}`}>Back to {coil.tag}</Link>
      </p>
    </>
  );
}

const failingChecks = (n: number) => `${n} recorded check${n === 1 ? " fails" : "s fail"}`;
