import { LineChart } from "@/app/ui/charts/line-chart";
import type { SessionAnalysis } from "@/lib/analysis/session-analysis";
import { buildWarmUpSeries } from "@/lib/analysis/warm-up-chart";
import type { SampleRecord } from "@/lib/analysis/records";
import { formatDuration, formatNumber } from "@/lib/units/format";

const EXTRAPOLATION_LABEL = { reliable: "Reliable", uncertain: "Uncertain", "too-short": "Run too short to extrapolate" } as const;

/** The warm-up: samples, fitted curve, steady state and limit lines, fit quality and the longest run at this supply. */
export function WarmUpSection({ analysis, samples, supplyVoltageV }: { analysis: SessionAnalysis; samples: readonly SampleRecord[]; supplyVoltageV: number }) {
  const warmUp = analysis.warmUp;
  if (!warmUp) {
    return (
      <section aria-labelledby="warm-up">
        <h2 id="warm-up">Heat-sink warm-up</h2>
        <p className="notice">{analysis.warmUpNote}</p>
      </section>
    );
  }
  const series = buildWarmUpSeries(samples, warmUp);
  const { fit } = warmUp;
  const longest = warmUp.longestRunBelowLimitS;
  return (
    <section aria-labelledby="warm-up">
      <h2 id="warm-up">Heat-sink warm-up</h2>
      <p className={`notice ${Number.isFinite(longest) ? (longest <= fit.duration ? "danger" : "warn") : "ok"}`} data-testid="longest-run">
        <strong>Longest run at {formatNumber(supplyVoltageV, 0, "V")}: </strong>
        {Number.isFinite(longest)
          ? `about ${formatDuration(longest)} before the junction reaches ${formatNumber(analysis.junctionLimitC, 0, "°C")} (the sink at ${formatNumber(warmUp.sinkLimitC, 1, "°C")}).`
          : `never reaches the limit — the sink levels off below ${formatNumber(warmUp.sinkLimitC, 1, "°C")}.`}
      </p>
      <LineChart
        title="Heat-sink temperature: logged samples, fitted curve and limits"
        x={{ label: "Time since switch-on", format: "duration" }}
        y={{ label: "Sink temperature", format: "celsius" }}
        series={[
          { label: "Logged samples", points: series.samples, style: "points" },
          { label: "Fitted curve", points: series.fitted, style: "line" },
          { label: `Predicted steady state (${formatNumber(warmUp.predictedSteadySinkC, 1, "°C")})`, points: series.steady, dashed: true },
          { label: `Sink temperature at the junction limit (${formatNumber(warmUp.sinkLimitC, 1, "°C")})`, points: series.sinkLimit, colour: "var(--chart-limit)" },
        ]}
      />
      <dl className="facts">
        <dt>Fit</dt>
        <dd>
          T(t) = {formatNumber(fit.ambient, 1, "°C")} + {formatNumber(fit.rise, 1, "K")}·(1 − e<sup>−t/τ</sup>), τ = {formatDuration(fit.timeConstant)}
        </dd>
        <dt>Predicted steady sink temperature</dt>
        <dd>
          {formatNumber(fit.steadyState, 1, "°C")}
          {Number.isFinite(fit.standardErrors.steadyState) ? ` ± ${formatNumber(fit.standardErrors.steadyState, 1, "K")}` : " (uncertainty unbounded)"}
        </dd>
        {warmUp.predictedSteadyJunctionC !== null && (
          <>
            <dt>Predicted steady junction temperature</dt>
            <dd>{formatNumber(warmUp.predictedSteadyJunctionC, 1, "°C")} (estimated)</dd>
          </>
        )}
        <dt>Longest run, lower {formatNumber(warmUp.confidence * 100, 0)} % bound</dt>
        <dd data-testid="longest-run-lower-bound">
          {warmUp.longestRunLowerBoundS === null
            ? "None offered: this fit is too short or too uncertain to extrapolate."
            : Number.isFinite(warmUp.longestRunLowerBoundS)
              ? formatDuration(warmUp.longestRunLowerBoundS)
              : "no limit at this supply"}
        </dd>
        <dt>Fit quality</dt>
        <dd>
          R² = {fit.rSquared.toFixed(3)}, residual spread {formatNumber(fit.residualStd, 2, "K")} over {samples.length} samples
        </dd>
        <dt>Extrapolation</dt>
        <dd>
          <span className={`badge badge-${fit.extrapolation === "reliable" ? "ok" : fit.extrapolation === "uncertain" ? "watch" : "hold"}`}>{EXTRAPOLATION_LABEL[fit.extrapolation]}</span>
        </dd>
      </dl>
      <ul>
        {warmUp.explanations.map((line) => (
          <li key={line}>{line}</li>
        ))}
      </ul>
    </section>
  );
}
