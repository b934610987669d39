import type { Margin } from "@/lib/calc/margin";
import { formatPercent } from "@/lib/units/format";
import { MARGIN_KIND_LABEL, MARGIN_STATUS_LABEL, marginValueUnit } from "@/app/ui/margin-labels";

function show(value: number, unit: string): string {
  return `${Number(value.toPrecision(4))} ${unit}`;
}

/** One margin with its figure, its formula and every input that went into it (value, unit, estimated or not, source). */
export function MarginDetails({ margin }: { margin: Margin }) {
  const headingId = `margin-${margin.kind}`;
  const unit = marginValueUnit(margin.formula);
  return (
    <section aria-labelledby={headingId} className="card margin-card">
      <h3 id={headingId}>
        {MARGIN_KIND_LABEL[margin.kind]} <span className={`badge badge-${margin.status}`}>{MARGIN_STATUS_LABEL[margin.status]}</span>
      </h3>
      {margin.headroom !== null && margin.value !== null && margin.limit !== null ? (
        <p>
          <span className="figure">{formatPercent(margin.headroom)}</span> headroom: {show(margin.value, unit)} against a limit of {show(margin.limit, unit)}.
        </p>
      ) : (
        <p>Not enough was recorded to work this margin out.</p>
      )}
      <p>
        Formula: headroom = 1 − <code>{margin.formula}</code>
      </p>
      {margin.estimated && <p className="notice warn">Estimated: at least one input below is an estimate, not a measurement or a datasheet value.</p>}
      <div className="table-wrap">
        <table>
          <caption className="visually-hidden">Inputs to the {MARGIN_KIND_LABEL[margin.kind].toLowerCase()}</caption>
          <thead>
            <tr>
              <th scope="col">Input</th>
              <th scope="col" className="num">Value</th>
              <th scope="col">Measured or estimated</th>
              <th scope="col">Source</th>
            </tr>
          </thead>
          <tbody>
            {margin.inputs.map((input, i) => (
              <tr key={`${input.name}-${i}`}>
                <th scope="row">{input.name}</th>
                <td className="num">{show(input.value, input.unit)}</td>
                <td>{input.estimated ? "Estimated" : "Recorded"}</td>
                <td>{input.source}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {margin.notes.length > 0 && (
        <ul className="margin-notes">
          {margin.notes.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      )}
    </section>
  );
}
