"use client";

/**
 * Import a sweep from a CSV: read the start of the file to detect its layout, let the user map the
 * columns and units, read the whole file in chunks with a progress bar, preview the readings as
 * understood and the resonances found, then send the mapped readings to the server.
 */
import { useRef, useState } from "react";
import { useRouter } from "next/navigation";
import { checkSweepReadings, DELIMITER_NAMES, describeLayoutProblem, detectSweepCsvLayout, type MappedSweepPoint, type SweepColumnMapping, type SweepCsvLayout } from "@/lib/import/sweep-csv";
import { analyzeSweep, type SweepAnalysis } from "@/lib/calc/sweep";
import { CalcInputError } from "@/lib/calc/errors";
import { parseQuantity } from "@/lib/units/parse";
import type { FieldErrors } from "@/lib/validation/action-result";
import { readSweepSettings, SweepSettingsFields, type SweepCoilChoice } from "../sweep-settings-fields";
import { streamSweepCsv } from "./stream-sweep-csv";
import { MappingFields } from "./mapping-fields";
import { ImportPreview } from "./import-preview";

/** Enough of the file to see its delimiter, header and first rows. */
const SAMPLE_BYTES = 64 * 1024;

export interface PreparedImport {
  points: MappedSweepPoint[];
  analysis: SweepAnalysis | null;
  analysisNote: string | null;
  settings: Record<string, string>;
}

type Status = { tone: "ok" | "danger" | "info"; message: string } | null;

export function SweepImportForm({ coil }: { coil: SweepCoilChoice }) {
  const router = useRouter();
  const form = useRef<HTMLFormElement>(null);
  const [file, setFile] = useState<Blob | null>(null);
  const [pasted, setPasted] = useState("");
  const [layout, setLayout] = useState<SweepCsvLayout | null>(null);
  /** The start of the file as read, kept so a header row picked by hand re-reads the same text. */
  const [sample, setSample] = useState("");
  const [mapping, setMapping] = useState<SweepColumnMapping | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [prepared, setPrepared] = useState<PreparedImport | null>(null);
  const [fieldErrors, setFieldErrors] = useState<FieldErrors>({});
  const [status, setStatus] = useState<Status>(null);
  const [busy, setBusy] = useState(false);

  const source = (): Blob | null => file ?? (pasted.trim() ? new Blob([pasted], { type: "text/csv" }) : null);

  const describeLayout = (detected: SweepCsvLayout) => {
    const skipped = detected.skippedRows.length;
    return `Read as ${DELIMITER_NAMES[detected.delimiter] ?? `“${detected.delimiter}”`}-separated, ${detected.headerRow !== null ? `with the header on row ${detected.headerRow}` : "without a header row"}${skipped > 0 ? `, ${skipped} comment or preamble line${skipped === 1 ? "" : "s"} skipped` : ""}${detected.decimalComma ? ", decimal commas" : ""}, ${detected.columns.length} columns. Check the header row and the mapping below.`;
  };

  const applyLayout = (detected: SweepCsvLayout) => {
    setPrepared(null);
    const problem = describeLayoutProblem(detected);
    if (problem) {
      setLayout(null);
      return setStatus({ tone: "danger", message: `${problem}. Nothing was imported.` });
    }
    if (detected.columns.length < 2) {
      setLayout(null);
      return setStatus({ tone: "danger", message: "Only one column was found: a sweep needs a frequency column and an amplitude column." });
    }
    setLayout(detected);
    setMapping(detected.suggested);
    setStatus({ tone: "info", message: describeLayout(detected) });
  };

  const readLayout = async () => {
    const blob = source();
    setPrepared(null);
    if (!blob) return setStatus({ tone: "danger", message: "Choose a CSV file or paste its contents first." });
    const text = await blob.slice(0, SAMPLE_BYTES).text();
    setSample(text);
    applyLayout(detectSweepCsvLayout(text));
  };

  /** The user's pick of the header row ("" for none), read again from the same start of the file. */
  const pickHeaderRow = (value: string) => {
    const detected = detectSweepCsvLayout(sample, { headerRow: value === "" ? null : Number(value) });
    // Keep the picker on screen even when the pick leaves nothing to read, so it can be changed back.
    if (describeLayoutProblem(detected) || detected.columns.length < 2) {
      setPrepared(null);
      return setStatus({ tone: "danger", message: `${describeLayoutProblem(detected) ?? "Only one column is left below that row"}. Pick another header row.` });
    }
    applyLayout(detected);
  };

  const settingErrors = (settings: Record<string, string>): FieldErrors => {
    const errors: FieldErrors = {};
    const resistance = parseQuantity(settings.seriesResistanceOhm ?? "", "resistance");
    if (!resistance.ok) errors.seriesResistanceOhm = [`Series resistor: ${resistance.message}`];
    const amplitude = parseQuantity(settings.sourceAmplitudeV ?? "", "voltage");
    if (!amplitude.ok) errors.sourceAmplitudeV = [`Source amplitude: ${amplitude.message}`];
    if (!settings.takenAt) errors.takenAt = ["Taken at: enter a date and time."];
    return errors;
  };

  const preview = async () => {
    const blob = source();
    if (!blob || !layout || !mapping || !form.current) return;
    setPrepared(null);
    const settings = readSweepSettings(form.current);
    const errors = settingErrors(settings);
    setFieldErrors(errors);
    if (Object.keys(errors).length > 0) return setStatus({ tone: "danger", message: "Some settings need attention before the preview." });
    setBusy(true);
    setProgress(0);
    setStatus({ tone: "info", message: "Reading the file…" });
    try {
      const result = await streamSweepCsv(blob, layout, mapping, setProgress);
      if (!result.ok) return setStatus({ tone: "danger", message: `${result.error.message}. Nothing was imported.` });
      const sourceAmplitude = (parseQuantity(settings.sourceAmplitudeV!, "voltage") as { value: number }).value;
      const names = { frequency: layout.columns[mapping.frequencyColumn] ?? "", amplitude: layout.columns[mapping.amplitudeColumn] ?? "" };
      const problem = checkSweepReadings(result.points, sourceAmplitude, names);
      if (problem) return setStatus({ tone: "danger", message: `${problem.message}. Nothing was imported.` });
      let analysis: SweepAnalysis | null = null;
      let analysisNote: string | null = null;
      try {
        analysis = analyzeSweep({
          seriesResistance: (parseQuantity(settings.seriesResistanceOhm!, "resistance") as { value: number }).value,
          sourceAmplitude,
          points: result.points.map((p) => ({ frequency: p.frequencyHz, amplitude: p.amplitudeV })),
        });
      } catch (error) {
        if (!(error instanceof CalcInputError)) throw error;
        analysisNote = `The readings cannot be analysed: ${error.message}.`;
      }
      setPrepared({ points: result.points, analysis, analysisNote, settings });
      setStatus({ tone: "ok", message: `${result.points.length} readings understood. Check the preview, then import.` });
    } catch {
      setStatus({ tone: "danger", message: "The file could not be read. Nothing was imported." });
    } finally {
      setBusy(false);
    }
  };

  const importSweep = async () => {
    if (!prepared) return;
    setBusy(true);
    setStatus({ tone: "info", message: `Saving ${prepared.points.length} readings…` });
    try {
      const response = await fetch("/api/sweeps/import", {
        method: "POST",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify({ ...prepared.settings, frequenciesHz: prepared.points.map((p) => p.frequencyHz), amplitudesV: prepared.points.map((p) => p.amplitudeV) }),
      });
      const body = (await response.json()) as { ok: boolean; message?: string; fieldErrors?: FieldErrors; data?: { id: string } };
      if (body.ok && body.data) return router.push(`/sweeps/${body.data.id}`);
      setFieldErrors(body.fieldErrors ?? {});
      setStatus({ tone: "danger", message: body.message ?? "The import was refused. Nothing was saved." });
    } catch {
      setStatus({ tone: "danger", message: "The server could not be reached. Nothing was saved." });
    } finally {
      setBusy(false);
    }
  };

  return (
    <form ref={form} onSubmit={(e) => e.preventDefault()} noValidate aria-label="Import a sweep">
      <fieldset>
        <legend>1. The file</legend>
        <div className="grid-2">
          <div className="field">
            <label htmlFor="import-file">CSV file</label>
            <input id="import-file" type="file" accept=".csv,.txt,.tsv,text/csv,text/plain" onChange={(e) => { setFile(e.target.files?.[0] ?? null); setLayout(null); setPrepared(null); }} aria-describedby="import-file-hint" />
            <span id="import-file-hint" className="hint">Comma, semicolon or tab separated, with or without a header row; # comment lines and a preamble above the header are skipped.</span>
          </div>
          <div className="field">
            <label htmlFor="import-paste">…or paste the contents</label>
            <textarea id="import-paste" rows={4} value={pasted} onChange={(e) => { setPasted(e.target.value); setLayout(null); setPrepared(null); }} />
          </div>
        </div>
        <p>
          <button type="button" onClick={readLayout} disabled={busy}>
            Read the file
          </button>
        </p>
      </fieldset>

      {layout && mapping && (
        <>
          <div className="field">
            <label htmlFor="import-header-row">Header row</label>
            <select id="import-header-row" value={layout.headerRow ?? ""} onChange={(e) => pickHeaderRow(e.target.value)} aria-describedby="import-header-row-hint">
              <option value="">No header row</option>
              {layout.headerChoices.map((line) => (
                <option key={line.row} value={line.row}>
                  Row {line.row}: {line.text.length > 60 ? `${line.text.slice(0, 60)}…` : line.text}
                </option>
              ))}
            </select>
            <span id="import-header-row-hint" className="hint">
              Lines starting with # and any lines above the header are skipped.
            </span>
          </div>
          <MappingFields layout={layout} mapping={mapping} onChange={(m) => { setMapping(m); setPrepared(null); }} />
          <SweepSettingsFields coil={coil} errors={fieldErrors} />
          <p>
            <button type="button" onClick={preview} disabled={busy}>
              Preview
            </button>
          </p>
        </>
      )}

      {progress !== null && (
        <p>
          <label htmlFor="import-progress">Reading the file</label>{" "}
          <progress id="import-progress" max={1} value={progress}>
            {Math.round(progress * 100)} %
          </progress>{" "}
          {Math.round(progress * 100)} %
        </p>
      )}

      <p id="import-status" role="status" aria-live="polite" className={status ? `notice ${status.tone === "danger" ? "danger" : status.tone === "ok" ? "ok" : ""}` : undefined}>
        {status?.message ?? ""}
      </p>

      {prepared && (
        <>
          <ImportPreview prepared={prepared} />
          <p>
            <button type="button" onClick={importSweep} disabled={busy}>
              Import {prepared.points.length} readings
            </button>
          </p>
        </>
      )}
    </form>
  );
}
