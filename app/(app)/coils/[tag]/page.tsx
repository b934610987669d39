import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { hasRole } from "@/lib/auth/roles";
import { readCoilPage, type CoilPageRecords } from "@/lib/db/coil-page";
import type { ClearancePolicyRules } from "@/lib/calc/clearance-policy";
import { judgeCoilFigures } from "@/lib/analysis/coil-health-input";
import { readCoilComparison } from "@/lib/db/prediction-history";
import { describeTurnsCount } from "@/lib/validation/coil";
import { formatDate, formatQuantity } from "@/lib/units/format";
import { COIL_STATUS_LABEL, TOP_LOAD_SHAPE_LABEL, TOPOLOGY_LABEL } from "@/app/ui/labels";
import { CoilStatusForm } from "./status-form";
import { PredictionSection } from "./prediction-section";
import { PlanSection } from "./plan-section";
import { HealthSection } from "./health-section";
import { PartsSection } from "./parts-section";
import { TimelineSection } from "./timeline-section";
import { RetireTopLoadButton } from "./top-load-forms";
import { checkMeasuredInductance } from "@/lib/analysis/inductance-plausibility";
import { collectHeadroomTrendOf } from "@/lib/analysis/headroom-trend";
import { plotSweepThumbnail } from "@/lib/analysis/sweep-thumbnail";
import { readCoilStanding } from "@/lib/db/coil-standing";
import { readSweepThumbnail } from "@/lib/db/sweep-thumbnail";
import { timelineFilterSchema } from "@/lib/validation/timeline";
import { GlanceBand, type SweepThumbnail } from "./glance-band";

type Props = { params: Promise<{ tag: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: decodeURIComponent((await params).tag) };
}

/**
 * Health under the current lending policy, judged as the dashboard judges it (judgeCoilFigures: the one coil judgement's
 * verdict, latest margins and headrooms, without the trend fits and older sessions' notes this page does not show).
 */
function assess(history: CoilPageRecords["history"], rules: ClearancePolicyRules) {
  const { health, reasons, latest, headrooms } = judgeCoilFigures(history, rules, new Date());
  return {
    health,
    reasons,
    latest: latest ? { id: latest.session.id, startedAt: latest.session.startedAt, analysis: latest.analysis } : null,
    trend: collectHeadroomTrendOf(headrooms, rules),
  };
}

/**
 * A label's link names the coil's site (label/page.tsx). Opened while working at another site, the current site's coil
 * of the same tag is not shown in its place: a member of the label's site is told to switch, anyone else sees not found.
 */
function LabelOfAnotherSite({ tag, labelSite, currentSite }: { tag: string; labelSite: string; currentSite: string }) {
  return (
    <>
      <h1>{tag}</h1>
      <p className="notice warn" role="status">
        This link is for coil {tag} of {labelSite}, but you are working at {currentSite}. Switch to {labelSite} with the site switcher, then open the link again.
      </p>
    </>
  );
}

export default async function CoilPage({ params, searchParams }: Props) {
  const user = await pageUser();
  const tag = decodeURIComponent((await params).tag);
  const query = await searchParams;
  if (typeof query.site === "string" && query.site !== user.site.slug) {
    const labelSite = user.sites.find((site) => site.slug === query.site);
    if (!labelSite) notFound();
    return <LabelOfAnotherSite tag={tag} labelSite={labelSite.name} currentSite={user.site.name} />;
  }
  const timelineFilter = timelineFilterSchema.parse(query.log);
  const records = await readCoilPage(user.scope, tag, undefined, timelineFilter);
  if (!records) notFound();
  const { coil, history, timeline, policy } = records;
  const latestSweepId = history.sweeps.at(-1)?.id;
  const [comparison, standing, latestSweep] = await Promise.all([
    readCoilComparison(user.scope, history, timeline.counts?.sessions),
    readCoilStanding(user.scope, coil.id, coil.components, undefined, timeline.standingRecords),
    latestSweepId ? readSweepThumbnail(user.scope, latestSweepId) : null,
  ]);
  const { health, reasons, latest, trend } = assess(history, policy.rules);
  const sweepThumbnail: SweepThumbnail | null = latestSweep
    ? { id: latestSweep.id, takenAt: latestSweep.takenAt, plot: plotSweepThumbnail(latestSweep), pointCount: latestSweep.points.length }
    : null;
  const canEdit = hasRole(user.role, "steward");
  const base = `/coils/${encodeURIComponent(coil.tag)}`;
  const justSaved = query.added ?? query.saved;
  // A plausibility warning, never a refusal: the record is kept as typed.
  const inductanceWarning = justSaved ? checkMeasuredInductance(coil)?.warning : null;

  return (
    <>
      <div className="page-head">
        <h1>
          {coil.tag} — {coil.name}
        </h1>
        <span className={`badge badge-${coil.status}`}>{COIL_STATUS_LABEL[coil.status]}</span>
      </div>
      <GlanceBand health={health} reasons={reasons} latest={latest} standing={standing} rules={policy.rules} trend={trend} sweep={sweepThumbnail} />
      <p className="lede">
        Built by {coil.builderName}. {TOPOLOGY_LABEL[coil.topology]} driver.
        {coil.createdBy ? ` Recorded by ${coil.createdBy.name}.` : ""}
      </p>
      {justSaved && (
        <div className="notice ok" role="status">
          {query.added ? "Coil added." : "Changes saved."} Read as: form {formatQuantity(coil.formDiameterM, "m", 4)}, winding {formatQuantity(coil.windingLengthM, "m", 4)}, wire{" "}
          {formatQuantity(coil.wireDiameterM, "m", 4)}
          {coil.wireGaugeAwg !== null ? ` (AWG ${coil.wireGaugeAwg})` : ""},{" "}
          {justSaved === "counted" ? describeTurnsCount(coil.windingLengthM, coil.wireDiameterM) : `${coil.turns} turns`}.
        </div>
      )}
      {query.planned && (
        <div className="notice ok" role="status">
          Plan saved: {coil.tag} is recorded as planned, with its planned parts and figures. Set its status to active when it goes into service.
        </div>
      )}
      {justSaved && inductanceWarning && (
        <p className="notice warn" role="alert">
          {inductanceWarning}
        </p>
      )}
      <nav aria-label="Coil actions" className="no-print actions-row">
        {canEdit && <Link href={`${base}/edit`}>Edit the build</Link>}
        {canEdit && <Link href={`${base}/top-loads/new`}>Add a top load</Link>}
        {canEdit && <Link href={`${base}/parts/new`}>Fit a part</Link>}
        <Link href={`${base}/label`}>Print label</Link>
        <Link href={`/fleet/${encodeURIComponent(coil.tag)}/trends`}>Trends</Link>
        {canEdit && coil.status !== "planned" && <Link href={`/clearances/new?coil=${encodeURIComponent(coil.tag)}`}>Clear for lending</Link>}
        {canEdit && coil.status !== "planned" && <Link href={`/loans/new?coil=${encodeURIComponent(coil.tag)}`}>Lend</Link>}
      </nav>
      {canEdit && <CoilStatusForm coilId={coil.id} status={coil.status} />}

      <HealthSection health={health} latest={latest} />

      <div className="grid-2">
        <section aria-labelledby="geometry">
          <h2 id="geometry">Secondary</h2>
          <dl className="facts">
            <dt>Form diameter</dt>
            <dd>{formatQuantity(coil.formDiameterM, "m")}</dd>
            <dt>Winding length</dt>
            <dd>{formatQuantity(coil.windingLengthM, "m")}</dd>
            <dt>Turns</dt>
            <dd>{coil.turns}</dd>
            <dt>Wire</dt>
            <dd>
              {formatQuantity(coil.wireDiameterM, "m")} {coil.wireMaterial}
              {coil.wireGaugeAwg !== null ? ` (AWG ${coil.wireGaugeAwg})` : ""}
            </dd>
            <dt>Measured DC resistance</dt>
            <dd>{formatQuantity(coil.measuredDcResistanceOhm, "Ω")}</dd>
            <dt>Measured inductance</dt>
            <dd>{formatQuantity(coil.measuredInductanceH, "H")}</dd>
            <dt>Primary</dt>
            <dd>
              {coil.primaryTurns ?? "—"} turns, {formatQuantity(coil.primaryDiameterM, "m")} diameter
            </dd>
            <dt>Environment capacitance</dt>
            <dd>
              {formatQuantity(coil.environmentCapacitanceF, "F")}
              {coil.environmentCalibratedAt ? ` (calibrated ${formatDate(coil.environmentCalibratedAt)})` : " (not yet calibrated)"}
            </dd>
          </dl>
        </section>
        <section aria-labelledby="top-loads">
          <h2 id="top-loads">Top loads</h2>
          <ul>
            {coil.topLoads.map((t) => (
              <li key={t.id}>
                {t.name} — {TOP_LOAD_SHAPE_LABEL[t.shape]}
                {t.diameterM ? `, ${formatQuantity(t.diameterM, "m")}` : ""}
                {t.tubeDiameterM ? ` × ${formatQuantity(t.tubeDiameterM, "m")} tube` : ""}
                {t.heightM ? `, ${formatQuantity(t.heightM, "m")} high` : ""}
                {t.measuredCapacitanceF ? `, measured ${formatQuantity(t.measuredCapacitanceF, "F")}` : ""}
                {t.id === comparison.currentTopLoad?.id ? " (fitted now)" : ""}
                {t.retiredAt ? ` (retired ${formatDate(t.retiredAt)})` : ""}
                {canEdit && !t.retiredAt && <RetireTopLoadButton topLoadId={t.id} name={t.name} />}
              </li>
            ))}
            {coil.topLoads.length === 0 && <li>No top loads recorded.</li>}
          </ul>
        </section>
      </div>

      <PlanSection planJson={coil.planJson} measuredInductanceH={coil.measuredInductanceH} sweeps={history.sweeps} sessions={history.sessions} />
      <PredictionSection comparison={comparison} />
      <PartsSection tag={coil.tag} parts={coil.components} canEdit={canEdit} />
      <TimelineSection tag={coil.tag} events={timeline.events} truncated={timeline.truncated} counts={timeline.counts} filter={timelineFilter} />

      <section aria-labelledby="export" className="no-print">
        <h2 id="export">Export</h2>
        <ul>
          <li>
            <a href={`/api/export/coils/${encodeURIComponent(coil.tag)}.json`} download>
              Whole logbook as JSON
            </a>{" "}
            (re-importable on any Coilyard install)
          </li>
          <li>
            CSV tables: <a href={`/api/export/coils/${encodeURIComponent(coil.tag)}/sessions.csv`}>sessions</a>,{" "}
            <a href={`/api/export/coils/${encodeURIComponent(coil.tag)}/sweep-points.csv`}>sweep points</a>,{" "}
            <a href={`/api/export/coils/${encodeURIComponent(coil.tag)}/parts.csv`}>parts</a>
          </li>
          {canEdit && (
            <li>
              <Link href="/coils/import">Import a logbook file</Link> (for example a copy of this coil under a new tag)
            </li>
          )}
        </ul>
      </section>
    </>
  );
}
