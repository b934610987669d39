/**
 * The coil at a glance, above everything else on its page: health with its leading reason, clearance, loan, the
 * latest session's three margins as bars against the policy's minimum, the latest sweep's small |Z| picture and the
 * recent headroom trends. Every figure is in text beside its picture (the bars and plots are decoration for the eye,
 * hidden from screen readers or labelled in words). The full reasons and margin tables follow in the health section.
 */
import Link from "next/link";
import type { CoilVerdict } from "@/lib/calc/coil-health";
import type { ClearancePolicyRules } from "@/lib/calc/clearance-policy";
import type { MarginKind } from "@/lib/calc/margin";
import type { SessionAnalysis } from "@/lib/analysis/session-analysis";
import type { HeadroomTrend } from "@/lib/analysis/headroom-trend";
import type { LogPlot } from "@/lib/analysis/log-plot-path";
import type { CoilStanding } from "@/lib/db/coil-standing";
import { shortenReason } from "@/lib/analysis/short-reason";
import { formatDate, formatDateTime, formatPercent, formatQuantity } from "@/lib/units/format";
import { HeadroomTrendPicture } from "@/app/ui/headroom-trend-picture";
import { ClearanceBadge } from "../../clearances/clearance-badge";

const HEALTH_LABEL: Record<string, string> = { fine: "Fine", watch: "Watch", hold: "Hold", "not enough data": "Not enough data" };
const MARGIN_LABEL: Record<MarginKind, string> = { voltage: "Voltage", current: "Current", thermal: "Thermal" };
const STATUS_LABEL: Record<string, string> = { ok: "OK", thin: "Thin", exceeded: "Exceeded", unknown: "Unknown" };
const THRESHOLD: Record<MarginKind, keyof ClearancePolicyRules> = { voltage: "minVoltageHeadroom", current: "minCurrentHeadroom", thermal: "minThermalHeadroom" };

export interface SweepThumbnail {
  id: string;
  takenAt: Date;
  plot: LogPlot;
  pointCount: number;
}

interface Props {
  health: CoilVerdict | null;
  reasons: string[];
  latest: { id: string; startedAt: Date; analysis: SessionAnalysis } | null;
  standing: CoilStanding;
  rules: ClearancePolicyRules;
  trend: HeadroomTrend;
  sweep: SweepThumbnail | null;
}

const BAR = { width: 120, height: 10 };

/** A headroom bar: 0 at the left (the rating itself), 100 % at the right, the policy's minimum as a tick. */
function HeadroomBar({ headroom, threshold, status }: { headroom: number | null; threshold: number; status: string }) {
  const x = (fraction: number) => Math.max(0, Math.min(1, fraction)) * BAR.width;
  return (
    <svg className="gauge" viewBox={`0 0 ${BAR.width} ${BAR.height}`} width={BAR.width} height={BAR.height} aria-hidden="true">
      <rect className="gauge-track" x={0} y={0} width={BAR.width} height={BAR.height} rx={2} />
      {headroom !== null && <rect className={`gauge-fill gauge-${status}`} x={0} y={0} width={x(headroom)} height={BAR.height} rx={2} />}
      <line className="gauge-limit" x1={x(threshold)} x2={x(threshold)} y1={-2} y2={BAR.height + 2} />
    </svg>
  );
}

function SweepPicture({ sweep }: { sweep: SweepThumbnail }) {
  const { plot } = sweep;
  const label = plot.xRange && plot.yRange
    ? `|Z| of the sweep of ${formatDate(sweep.takenAt)} on log axes, ${formatQuantity(plot.xRange[0], "Hz")} to ${formatQuantity(plot.xRange[1], "Hz")}, |Z| from ${formatQuantity(plot.yRange[0], "Ω")} to ${formatQuantity(plot.yRange[1], "Ω")}`
    : `The sweep of ${formatDate(sweep.takenAt)} has no readings to plot`;
  return (
    <figure className="glance-sweep">
      <Link href={`/sweeps/${sweep.id}`} aria-label={`Latest sweep, ${formatDate(sweep.takenAt)}: open it`}>
        <svg viewBox="0 0 180 72" width={180} height={72} role="img" aria-label={label}>
          <rect className="plot-frame" x={0.5} y={0.5} width={179} height={71} />
          {plot.path && <path className="spark-line" d={plot.path} />}
        </svg>
      </Link>
      <figcaption>
        Latest sweep, <Link href={`/sweeps/${sweep.id}`}>{formatDate(sweep.takenAt)}</Link>: |Z| against frequency (log axes, {sweep.pointCount} readings)
      </figcaption>
    </figure>
  );
}

export function GlanceBand({ health, reasons, latest, standing, rules, trend, sweep }: Props) {
  const tone = health ? (health.status === "not enough data" ? "neutral" : health.status) : "neutral";
  return (
    <section aria-label="At a glance" className="glance-band no-print">
      <div className="glance-standing">
        <dl className="glance-facts">
          <dt>Health</dt>
          <dd>
            <span className={`badge badge-${tone}`}>{health ? HEALTH_LABEL[health.status] : "Not assessed"}</span>
            {reasons[0] && <span className="glance-reason"> {shortenReason(reasons[0])}</span>}
            {reasons.length > 0 && (
              <>
                {" "}
                <a href="#health">{reasons.length > 1 ? `all ${reasons.length} reasons` : "in full"}</a>
              </>
            )}
          </dd>
          <dt>Clearance</dt>
          <dd>
            <ClearanceBadge state={standing.clearance} withReason />
          </dd>
          <dt>Loan</dt>
          <dd>
            {standing.activeLoan ? (
              <span className={`badge badge-${standing.activeLoan.overdue ? "overdue" : "out"}`}>
                {standing.activeLoan.overdue ? "Overdue" : "Out"}: {standing.activeLoan.borrower}, back {formatDate(standing.activeLoan.expectedBackAt)}
              </span>
            ) : (
              <span className="muted">In</span>
            )}
          </dd>
        </dl>
        <table className="glance-margins">
          <caption>
            {latest ? (
              <>
                Margins of the <Link href={`/sessions/${latest.id}`}>latest session</Link> ({formatDateTime(latest.startedAt)})
              </>
            ) : (
              "Margins: no session logged yet"
            )}
          </caption>
          <thead>
            <tr>
              <th scope="col">Margin</th>
              <th scope="col">Headroom against the policy&apos;s minimum</th>
              <th scope="col">Status</th>
            </tr>
          </thead>
          <tbody>
            {(["voltage", "current", "thermal"] as const).map((kind) => {
              const margin = latest?.analysis.margins[kind];
              const threshold = rules[THRESHOLD[kind]] as number;
              const status = margin?.status ?? "unknown";
              return (
                <tr key={kind} data-testid={`glance-margin-${kind}`}>
                  <th scope="row">{MARGIN_LABEL[kind]}</th>
                  <td>
                    <HeadroomBar headroom={margin?.headroom ?? null} threshold={threshold} status={status} />{" "}
                    <span className="gauge-text">
                      {formatPercent(margin?.headroom)} <span className="muted">(min {formatPercent(threshold)})</span>
                    </span>
                  </td>
                  <td>
                    <span className={`badge badge-${status}`}>{STATUS_LABEL[status]}</span>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {sweep ? <SweepPicture sweep={sweep} /> : <p className="glance-sweep muted">No sweep recorded yet.</p>}
      <div className="glance-trends">
        <h2 className="glance-heading">Headroom, last {trend.voltage.headrooms.length} sessions</h2>
        <HeadroomTrendPicture trend={trend} />
        <p className="hint">Each line is one margin&apos;s headroom per session, oldest on the left; the dashed line is the policy&apos;s minimum.</p>
      </div>
    </section>
  );
}
