import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { LineChart, type ChartSeries } from "@/app/ui/charts/line-chart";
import { getCoilByTag } from "@/lib/db/coils";
import { getCoilHistory } from "@/lib/db/coil-history";
import { getCurrentPolicy } from "@/lib/db/policy";
import { analyzeSessions, judgeCoil } from "@/lib/analysis/coil-health-input";
import { buildComparableCurrent, buildFrequencySeries, buildMarginChart } from "@/lib/analysis/trend-series";
import { formatDate, formatNumber } from "@/lib/units/format";

type Props = { params: Promise<{ tag: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Trends ${decodeURIComponent((await params).tag)}` };
}

const MARGIN_TITLE = { voltage: "Voltage headroom", current: "Current headroom", thermal: "Thermal headroom" } as const;

export default async function TrendsPage({ params }: Props) {
  const user = await pageUser();
  const tag = decodeURIComponent((await params).tag);
  const coil = await getCoilByTag(user.scope, tag);
  if (!coil) notFound();
  const [history, policy] = await Promise.all([getCoilHistory(user.scope, coil.id), getCurrentPolicy(user.scope)]);
  if (!history) notFound();
  const now = new Date();
  // Every session for the charts; the health from the one coil judgement, as the dashboard and the coil page have it.
  const analyzed = analyzeSessions(history.coil, history.sessions, history.components, policy.rules);
  const judged = judgeCoil(history, policy.rules, now);
  if (!judged.health) return <p className="notice warn">{judged.reasons[0]}</p>;
  const health = judged.health;
  const current = buildComparableCurrent(analyzed);
  const freq = buildFrequencySeries(analyzed, history.sweeps, health);
  return (
    <>
      <h1>
        Trends: {coil.tag} — {coil.name}
      </h1>
      <p className="lede">
        Health: <span className={`badge badge-${health.status === "not enough data" ? "neutral" : health.status}`}>{health.status}</span> over {health.sessionCount}{" "}
        sessions. {health.reasons[0]} <Link href={`/coils/${encodeURIComponent(coil.tag)}`}>Back to the coil</Link>
      </p>
      {(["voltage", "current", "thermal"] as const).map((kind) => {
        const margin = health.margins[kind];
        const chart = buildMarginChart(margin, analyzed, now);
        const series: ChartSeries[] = [
          { label: `${MARGIN_TITLE[kind]} per session`, points: chart.readings, style: "points" },
          { label: `Policy threshold (${formatNumber(margin.threshold * 100, 0)} %)`, points: chart.threshold, style: "line", dashed: true, colour: "var(--chart-limit)" },
        ];
        if (chart.trend.length > 0) series.push({ label: "Fitted trend", points: chart.trend, style: "line", colour: "var(--chart-fit)" });
        if (chart.crossing.length > 0) series.push({ label: "Projected crossing", points: chart.crossing, style: "marker", colour: "var(--chart-limit)" });
        return (
          <section key={kind} aria-labelledby={`${kind}-heading`}>
            <h2 id={`${kind}-heading`}>{MARGIN_TITLE[kind]}</h2>
            <p>
              {margin.crossing
                ? margin.crossing.alreadyReached
                  ? "The fitted trend has already reached the threshold."
                  : `Falling; the fitted trend reaches the threshold around ${formatDate(margin.crossing.at)} (${formatNumber(margin.crossing.daysAway, 0)} days away).`
                : margin.trend
                  ? "No significant fall toward the threshold."
                  : `Not enough readings for a trend (${margin.observations}).`}
            </p>
            <LineChart title={MARGIN_TITLE[kind]} series={series} x={{ label: "Date", format: "date" }} y={{ label: "Headroom", format: "percent" }} />
          </section>
        );
      })}
      <section aria-labelledby="current-heading">
        <h2 id="current-heading">Supply current at comparable supply voltage</h2>
        <p>
          {current.referenceVoltageV === null
            ? "No sessions to compare."
            : `Sessions within ±10 % of ${formatNumber(current.referenceVoltageV, 1, "V")}, scaled to that voltage.`}
        </p>
        <LineChart
          title="Supply current at comparable voltage"
          series={[{ label: "Supply current (scaled)", points: current.points, style: "points" }]}
          x={{ label: "Date", format: "date" }}
          y={{ label: "Current (A)" }}
        />
      </section>
      <section aria-labelledby="frequency-heading">
        <h2 id="frequency-heading">Running frequency and first series resonance</h2>
        <p>Only readings with the top load fitted last are compared, since a different top load moves the resonance by design.</p>
        <LineChart
          title="Frequencies against their baselines"
          series={[
            { label: "Running frequency", points: freq.running, style: "points" },
            { label: "Running frequency baseline", points: freq.runningBaseline, style: "line", dashed: true },
            { label: "First series resonance (sweeps)", points: freq.resonance, style: "marker" },
            { label: "Resonance baseline", points: freq.resonanceBaseline, style: "line", dashed: true },
          ]}
          x={{ label: "Date", format: "date" }}
          y={{ label: "Frequency", format: "frequency" }}
        />
      </section>
    </>
  );
}
