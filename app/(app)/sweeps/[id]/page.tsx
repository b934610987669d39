import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { LineChart, type ChartSeries } from "@/app/ui/charts/line-chart";
import { SafetyCautions } from "@/app/ui/safety-cautions";
import { AMPLITUDE_CONVENTION_LABEL, TOP_LOAD_SHAPE_LABEL } from "@/app/ui/labels";
import { getSweep, listCalibrationSweeps } from "@/lib/db/sweeps";
import { compareWithPrediction, impedanceCurve, predictWhatIf, summarizeCalibration } from "@/lib/analysis/sweep-report";
import { whatIfTopLoadSchema } from "@/lib/validation/sweep";
import { fieldErrorsOf, type FieldErrors } from "@/lib/validation/action-result";
import { formatDateTime, formatQuantity } from "@/lib/units/format";
import { ResonanceTable } from "./resonance-table";
import { PredictionPanel } from "./prediction-panel";
import { CalibrationPanel } from "./calibration-panel";
import { WhatIfForm } from "./what-if-form";
import { getCurrentPolicy } from "@/lib/db/policy";

type Props = { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

export const metadata: Metadata = { title: "Sweep" };

export default async function SweepPage({ params, searchParams }: Props) {
  const user = await pageUser();
  const { id } = await params;
  const sweep = await getSweep(user.scope, id);
  if (!sweep) notFound();
  const query = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, [v].flat()[0] ?? ""]));
  const [calibrationSweeps, policy] = await Promise.all([listCalibrationSweeps(user.scope, sweep.coilId), getCurrentPolicy(user.scope)]);

  const curve = impedanceCurve(sweep);
  const comparison = compareWithPrediction(sweep.coil, sweep.topLoad, sweep, calibrationSweeps);
  const calibration = summarizeCalibration(sweep.coil, calibrationSweeps);

  let whatIfErrors: FieldErrors = {};
  let whatIf = null;
  if (query.shape) {
    // Only the fields the chosen shape needs are read, so leftovers from another shape do no harm.
    const parsed = whatIfTopLoadSchema.safeParse(query);
    if (parsed.success) {
      whatIf = predictWhatIf(sweep.coil, sweep.topLoad, parsed.data, policy.rules.ituRegion);
      if (!whatIf.ok) whatIfErrors = { [whatIf.field]: [whatIf.reason] };
    } else whatIfErrors = fieldErrorsOf(parsed.error);
  }

  const series = sweep.resonances.filter((r) => r.kind === "series");
  const parallel = sweep.resonances.filter((r) => r.kind === "parallel");
  const chartSeries: ChartSeries[] = [
    { label: "|Z|", points: curve.points, style: "line" },
    { label: "Series resonances", points: series.map((r) => ({ x: r.frequencyHz, y: r.impedanceOhm })), style: "marker", colour: "var(--chart-good)" },
    { label: "Parallel resonances", points: parallel.map((r) => ({ x: r.frequencyHz, y: r.impedanceOhm })), style: "marker", colour: "var(--chart-limit)" },
  ];

  return (
    <>
      <div className="page-head">
        <h1>
          Sweep of {sweep.coil.tag} — {formatDateTime(sweep.takenAt)}
        </h1>
        <Link href={`/sweeps?coil=${encodeURIComponent(sweep.coil.tag)}`} className="no-print">
          All sweeps of {sweep.coil.tag}
        </Link>
      </div>
      <dl className="facts">
        <dt>Coil</dt>
        <dd>
          <Link href={`/coils/${encodeURIComponent(sweep.coil.tag)}`}>
            {sweep.coil.tag} — {sweep.coil.name}
          </Link>
        </dd>
        <dt>Top load</dt>
        <dd>{sweep.topLoad ? `${sweep.topLoad.name} (${TOP_LOAD_SHAPE_LABEL[sweep.topLoad.shape]})` : "None (bare secondary)"}</dd>
        <dt>Series resistor</dt>
        <dd>{formatQuantity(sweep.seriesResistanceOhm, "Ω")}</dd>
        <dt>Source amplitude</dt>
        <dd>
          {formatQuantity(sweep.sourceAmplitudeV, "V")} {AMPLITUDE_CONVENTION_LABEL[sweep.amplitudeConvention]} (readings in the same convention)
        </dd>
        <dt>Readings</dt>
        <dd>{sweep.pointCount}</dd>
        <dt>First series resonance</dt>
        <dd>
          <strong>{formatQuantity(sweep.firstSeriesResonanceHz, "Hz", 4)}</strong>
          {typeof series[0]?.frequencyStandardErrorHz === "number" && ` ± ${formatQuantity(series[0].frequencyStandardErrorHz, "Hz", 2)} (one standard error of the fit)`}
        </dd>
        <dt>Taken by</dt>
        <dd>{sweep.takenBy?.name ?? "—"}</dd>
        {sweep.environmentNotes && (
          <>
            <dt>Environment</dt>
            <dd>{sweep.environmentNotes}</dd>
          </>
        )}
      </dl>

      <section aria-labelledby="impedance">
        <h2 id="impedance">Impedance against frequency</h2>
        <LineChart title={`|Z| of ${sweep.coil.tag} seen through ${formatQuantity(sweep.seriesResistanceOhm, "Ω")}`} series={chartSeries} x={{ label: "Frequency", format: "frequency", log: true }} y={{ label: "|Z|", format: "ohms", log: true }} />
        <p className="muted">
          |Z| = R·m/(1 − m), m = reading ÷ source amplitude, assumes the coil&apos;s impedance is in phase with the current (resistive). That holds at the
          resonances themselves. Between them the impedance has a phase φ, and a reading of amplitudes alone always reads |Z| high, never low: by a
          factor (1 + m)/(m·cos φ + √(1 − m²·sin² φ)), close to 1 where |Z| is well below R and approaching 1/cos φ where it is well above R (√2 at
          ±45°, 3× at ±70°, without limit as the coil turns purely reactive). Only the resonances&apos; frequencies, impedances and Q are read where
          this error vanishes.
          {curve.decimated &&
            ` The chart shows ${curve.points.length} of ${curve.total} readings: the lowest and highest in each narrow slice of frequency, so no peak or dip is lost; the analysis used them all.`}
        </p>
      </section>

      <ResonanceTable resonances={sweep.resonances} />
      <PredictionPanel comparison={comparison} />
      <CalibrationPanel coil={sweep.coil} calibration={calibration} currentSweepId={sweep.id} />
      <WhatIfForm values={query} errors={whatIfErrors} result={whatIf} currentHz={sweep.firstSeriesResonanceHz} />
      <SafetyCautions />
    </>
  );
}
