/**
 * A coil's recent headrooms as three small inline pictures (voltage, current, thermal), each against the policy's
 * threshold drawn as a dashed line. Plain server-rendered SVG rather than chart.js: the dashboard shows dozens of
 * these a page, and a canvas chart each would mean dozens of client scripts and layouts for a 100-pixel picture.
 * Each picture names its figures in words (role="img" with a label), so the colour and shape are never the only cue.
 */
import { buildSparkline } from "@/lib/analysis/sparkline-path";
import type { HeadroomSeries, HeadroomTrend } from "@/lib/analysis/headroom-trend";
import type { MarginKind } from "@/lib/calc/margin";
import { formatPercent } from "@/lib/units/format";

const LABEL: Record<MarginKind, string> = { voltage: "Voltage", current: "Current", thermal: "Thermal" };
const BOX = { width: 96, height: 22, min: -0.5, max: 1, pad: 3 };

function describeSeries(kind: MarginKind, { headrooms, threshold }: HeadroomSeries): string {
  const known = headrooms.filter((h): h is number => h !== null);
  if (known.length === 0) return `${LABEL[kind]} headroom: not known for any recent session`;
  const latest = known.at(-1)!;
  const below = known.filter((h) => h < threshold).length;
  return (
    `${LABEL[kind]} headroom over the last ${headrooms.length} sessions: from ${formatPercent(known[0]!)} to ${formatPercent(latest)} (lowest ${formatPercent(Math.min(...known))}); ` +
    `policy minimum ${formatPercent(threshold)}${below > 0 ? `, ${below} below it` : ", none below it"}`
  );
}

/** One margin's recent headrooms against its threshold. */
export function HeadroomSparkline({ kind, series }: { kind: MarginKind; series: HeadroomSeries }) {
  const line = buildSparkline(series.headrooms, BOX, series.threshold);
  const latest = line.points.at(-1);
  return (
    <svg className="spark" viewBox={`0 0 ${BOX.width} ${BOX.height}`} width={BOX.width} height={BOX.height} role="img" aria-label={describeSeries(kind, series)}>
      {line.limitY !== null && <line className="spark-limit" x1={0} x2={BOX.width} y1={line.limitY} y2={line.limitY} />}
      {line.path && <path className="spark-line" d={line.path} />}
      {latest && <circle className={latest.value < series.threshold ? "spark-dot spark-dot-low" : "spark-dot"} cx={latest.x} cy={latest.y} r={2.2} />}
    </svg>
  );
}

/** The three margins' trends, one line each: name, picture, latest headroom in text. */
export function HeadroomTrendPicture({ trend }: { trend: HeadroomTrend }) {
  return (
    <ul className="spark-list">
      {(["voltage", "current", "thermal"] as const).map((kind) => {
        const latest = trend[kind].headrooms.at(-1);
        return (
          <li key={kind}>
            <span className="spark-name" aria-hidden="true">
              {LABEL[kind]}
            </span>
            <HeadroomSparkline kind={kind} series={trend[kind]} />
            <span className="spark-value" aria-hidden="true">
              {latest === undefined || latest === null ? "—" : formatPercent(latest)}
            </span>
          </li>
        );
      })}
    </ul>
  );
}
