import type { ClearanceRuleResult } from "@/lib/calc/clearance-policy";

function show(value: number | string | null, unit?: string) {
  if (value === null) return "—";
  if (typeof value === "string") return value;
  if (unit === "Hz") return `${Math.round(value / 100) / 10} kHz`;
  return `${value}${unit ? ` ${unit}` : ""}`;
}

/** Every rule, one row each: what was measured, the threshold, pass or fail, and why. */
export function RuleResultsTable({ rules, caption }: { rules: readonly ClearanceRuleResult[]; caption: string }) {
  return (
    <div className="table-wrap">
      <table className="rule-table">
        <caption>{caption}</caption>
        <thead>
          <tr>
            <th scope="col">Rule</th>
            <th scope="col">Measured</th>
            <th scope="col">Threshold</th>
            <th scope="col">Result</th>
            <th scope="col">Detail</th>
          </tr>
        </thead>
        <tbody>
          {rules.map((rule) => (
            <tr key={rule.id}>
              <th scope="row">{rule.label}</th>
              <td>{show(rule.measured, rule.unit)}</td>
              <td>{typeof rule.threshold === "number" ? show(rule.threshold, rule.unit) : rule.threshold}</td>
              <td>
                <span className={`badge badge-${rule.pass ? "ok" : "hold"}`}>{rule.pass ? "pass" : "fail"}</span>
              </td>
              <td>{rule.detail}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
