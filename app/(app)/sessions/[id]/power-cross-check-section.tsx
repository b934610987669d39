import type { SwitchLossCheck } from "@/lib/analysis/switch-loss-check";
import { formatQuantity } from "@/lib/units/format";

function show(value: number, unit: string): string {
  return unit === "s" || unit === "Ω" ? formatQuantity(value, unit) : `${Number(value.toPrecision(3))}${unit ? ` ${unit}` : ""}`;
}

/** The sink-inferred power beside an independent conduction + switching loss estimate, and whether they agree. */
export function PowerCrossCheckSection({ check }: { check: SwitchLossCheck }) {
  return (
    <section aria-labelledby="power-cross-check">
      <h2 id="power-cross-check">Power cross-check</h2>
      {!check.ok ? (
        <p className="notice">{check.reason}</p>
      ) : (
        <>
          <div className="table-wrap">
            <table>
              <caption>One switch&apos;s dissipation two ways: from the heat sink, and from the currents and the part</caption>
              <thead>
                <tr>
                  <th scope="col">Figure</th>
                  <th scope="col" className="num">Power</th>
                  <th scope="col">Basis</th>
                </tr>
              </thead>
              <tbody>
                <tr>
                  <th scope="row">Inferred from the sink</th>
                  <td className="num">{show(check.sinkInferredW, "W")}</td>
                  <td>{check.sinkBasis}</td>
                </tr>
                <tr>
                  <th scope="row">Conduction + switching estimate</th>
                  <td className="num">{show(check.estimate.totalW, "W")}</td>
                  <td>
                    {show(check.estimate.conductionW, "W")} conduction + {show(check.estimate.switchingW, "W")} switching at the running frequency (estimate)
                  </td>
                </tr>
                <tr>
                  <th scope="row">Cross-check</th>
                  <td className="num" colSpan={2}>
                    <span className={`badge badge-${check.crossCheck.agrees ? "ok" : "thin"}`}>{check.crossCheck.verdict}</span>
                  </td>
                </tr>
              </tbody>
            </table>
          </div>
          <details>
            <summary>Inputs to the loss estimate</summary>
            <ul>
              {check.estimate.inputs.map((input) => (
                <li key={input.name}>
                  {input.name} = {show(input.value, input.unit)} — {input.estimated ? "estimated" : "recorded"}: {input.source}
                </li>
              ))}
            </ul>
            {check.estimate.notes.length > 0 && <p className="muted">{check.estimate.notes.join(" ")}</p>}
          </details>
          <p className="muted">
            An independent check, not a verdict: the two figures rest on different records (the sink&apos;s temperatures and Rθ against the supply current, the running
            frequency and typical or recorded switch parameters), so a large disagreement points at one of those records.
          </p>
        </>
      )}
    </section>
  );
}
