"use client";

import type { AmplitudeUnit, FrequencyUnit, SweepColumnMapping, SweepCsvLayout } from "@/lib/import/sweep-csv";

/** Which column is which and in what unit, with the first rows of the file as read. */
export function MappingFields({ layout, mapping, onChange }: { layout: SweepCsvLayout; mapping: SweepColumnMapping; onChange: (mapping: SweepColumnMapping) => void }) {
  const columnOptions = layout.columns.map((name, i) => (
    <option key={i} value={i}>
      {name}
    </option>
  ));
  const same = mapping.frequencyColumn === mapping.amplitudeColumn;
  return (
    <fieldset>
      <legend>2. Columns and units</legend>
      <div className="grid-2">
        <div className="field">
          <label htmlFor="map-frequency-column">Frequency column</label>
          <select id="map-frequency-column" value={mapping.frequencyColumn} onChange={(e) => onChange({ ...mapping, frequencyColumn: Number(e.target.value) })} aria-invalid={same} aria-describedby="map-columns-error">
            {columnOptions}
          </select>
        </div>
        <div className="field">
          <label htmlFor="map-frequency-unit">Frequency unit</label>
          <select id="map-frequency-unit" value={mapping.frequencyUnit} onChange={(e) => onChange({ ...mapping, frequencyUnit: e.target.value as FrequencyUnit })}>
            <option value="Hz">Hz</option>
            <option value="kHz">kHz</option>
            <option value="MHz">MHz</option>
          </select>
        </div>
        <div className="field">
          <label htmlFor="map-amplitude-column">Amplitude column</label>
          <select id="map-amplitude-column" value={mapping.amplitudeColumn} onChange={(e) => onChange({ ...mapping, amplitudeColumn: Number(e.target.value) })} aria-invalid={same} aria-describedby="map-columns-error">
            {columnOptions}
          </select>
        </div>
        <div className="field">
          <label htmlFor="map-amplitude-unit">Amplitude unit</label>
          <select id="map-amplitude-unit" value={mapping.amplitudeUnit} onChange={(e) => onChange({ ...mapping, amplitudeUnit: e.target.value as AmplitudeUnit })}>
            <option value="V">V</option>
            <option value="mV">mV</option>
          </select>
        </div>
      </div>
      <span id="map-columns-error" className="error">
        {same ? "Frequency and amplitude must be different columns." : ""}
      </span>
      <div className="table-wrap">
        <table>
          <caption>First rows of the file as read</caption>
          <thead>
            <tr>
              {layout.columns.map((name, i) => (
                <th scope="col" key={i}>
                  {name}
                  {i === mapping.frequencyColumn ? ` → frequency (${mapping.frequencyUnit})` : i === mapping.amplitudeColumn ? ` → amplitude (${mapping.amplitudeUnit})` : ""}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {layout.sampleRows.slice(0, 5).map((row, r) => (
              <tr key={r}>
                {layout.columns.map((_, i) => (
                  <td key={i}>{row[i] ?? ""}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </fieldset>
  );
}
