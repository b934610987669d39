import { comparePlanWithMeasured } from "@/lib/analysis/plan-vs-measured";
import type { SessionRecord, SweepRecord } from "@/lib/analysis/records";
import { readStoredPlan } from "@/lib/validation/plan";
import { formatDate, formatPercent, formatQuantity, formatTemperature } from "@/lib/units/format";

const show = (value: number | null, unit: string) => (unit === "°C" ? formatTemperature(value) : formatQuantity(value, unit));

/** Planned vs measured, for a coil saved from the planner; renders nothing for a coil entered as built. */
export function PlanSection({
  planJson,
  measuredInductanceH,
  sweeps,
  sessions,
}: {
  planJson: string | null;
  measuredInductanceH: number | null;
  sweeps: readonly SweepRecord[];
  sessions: readonly SessionRecord[];
}) {
  const plan = readStoredPlan(planJson);
  if (!planJson) return null;
  if (!plan) {
    return (
      <section aria-labelledby="plan-vs-measured">
        <h2 id="plan-vs-measured">Planned vs measured</h2>
        <p className="notice warn">This coil&apos;s stored plan could not be read, so its planned figures are not shown.</p>
      </section>
    );
  }
  const chosen = plan.variants[plan.chosenVariant]!;
  const rows = comparePlanWithMeasured(plan, { measuredInductanceH }, sweeps, sessions);
  return (
    <section aria-labelledby="plan-vs-measured">
      <h2 id="plan-vs-measured">Planned vs measured</h2>
      <p className="hint">
        Planned on {formatDate(new Date(plan.plannedAt))} ({chosen.label}, lending policy v{plan.policy.version}). Planned figures are the planner&apos;s estimates,
        kept as they were; measurements are the latest recorded.
      </p>
      <div className="table-wrap">
        <table aria-label="Planned vs measured">
          <thead>
            <tr>
              <th scope="col">Figure</th>
              <th scope="col">Planned</th>
              <th scope="col">Measured</th>
              <th scope="col">Deviation</th>
              <th scope="col">Basis</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.key}>
                <th scope="row">{r.label}</th>
                <td>
                  {show(r.planned, r.unit)}
                  {r.plannedLow !== undefined && r.plannedHigh !== undefined ? ` (${show(r.plannedLow, r.unit)} – ${show(r.plannedHigh, r.unit)})` : ""}
                </td>
                <td>{r.measured === null ? "not yet measured" : show(r.measured, r.unit)}</td>
                <td>
                  {r.deviation === null ? "—" : formatPercent(r.deviation, 1)}
                  {r.withinBand === null ? "" : r.withinBand ? " (inside the planned band)" : " (outside the planned band)"}
                </td>
                <td className="hint">{r.basis}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="hint">
        Planned steady junction {formatTemperature(chosen.predicted.steadyJunctionC)} against a limit of {formatTemperature(chosen.predicted.junctionLimitC)};{" "}
        {chosen.predicted.longestRunUnlimited
          ? "the steady state stayed under the limit."
          : chosen.predicted.longestRunS === null
            ? "no longest run was worked out."
            : `longest run under the limit about ${Math.round(chosen.predicted.longestRunS / 60)} min.`}
      </p>
    </section>
  );
}
