"use client";

import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { recordTypedSweep } from "../actions";
import { readSweepSettings, SweepSettingsFields, type SweepCoilChoice } from "../sweep-settings-fields";
import { checkCell, COLUMNS, isBlankReading, ReadingGrid, type ReadingRow } from "./reading-grid";
import { FormStatus } from "@/app/ui/form-status";
import type { ActionResult, FieldErrors } from "@/lib/validation/action-result";

const EMPTY_ROWS: ReadingRow[] = Array.from({ length: 5 }, () => ({ frequency: "", amplitude: "" }));

export function SweepEntryForm({ coil }: { coil: SweepCoilChoice }) {
  const router = useRouter();
  const [rows, setRows] = useState<ReadingRow[]>(EMPTY_ROWS);
  const [touched, setTouched] = useState<ReadonlySet<string>>(new Set());
  const [state, setState] = useState<ActionResult<{ id: string }> | null>(null);
  const [pending, startTransition] = useTransition();
  const fieldErrors: FieldErrors = state && !state.ok ? state.fieldErrors : {};

  const changeRows = (next: ReadingRow[]) => {
    setRows(next);
    // An edited cell's server error no longer applies; the browser's own check takes over.
    if (state && !state.ok) setState({ ...state, fieldErrors: Object.fromEntries(Object.entries(state.fieldErrors).filter(([k]) => !k.startsWith("points."))) });
  };

  const gridErrors = Object.fromEntries(Object.entries(fieldErrors).filter(([k]) => k.startsWith("points.")).map(([k, v]) => [k, v.join(" ")]));

  const onSubmit = (event: React.FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const filled = rows.map((r, index) => ({ r, index })).filter(({ r }) => !isBlankReading(r));
    // Blank rows in the middle are dropped; the row numbers shown stay the grid's own.
    const local: FieldErrors = {};
    for (const { r, index } of filled) {
      for (const column of COLUMNS) {
        const message = checkCell(r[column.key], column);
        if (message) local[`points.${index}.${column.key}`] = [message];
      }
    }
    if (Object.keys(local).length > 0) {
      setTouched(new Set([...touched, ...Object.keys(local)]));
      setState({ ok: false, message: `${Object.keys(local).length} cell${Object.keys(local).length === 1 ? " needs" : "s need"} attention; nothing was saved.`, fieldErrors: local });
      return;
    }
    const settings = readSweepSettings(event.currentTarget);
    startTransition(async () => {
      const result = await recordTypedSweep({ ...settings, points: filled.map(({ r }) => r) });
      if (result.ok) {
        router.push(`/sweeps/${result.data.id}`);
        return;
      }
      // The server numbers readings among the filled rows; map back to the grid's rows.
      const remapped: FieldErrors = {};
      for (const [key, messages] of Object.entries(result.fieldErrors)) {
        const match = /^points\.(\d+)\.(frequency|amplitude)$/.exec(key);
        const gridRow = match ? filled[Number(match[1])]?.index : undefined;
        remapped[gridRow !== undefined && match ? `points.${gridRow}.${match[2]}` : key] = messages;
      }
      setState({ ...result, fieldErrors: remapped });
    });
  };

  return (
    <form onSubmit={onSubmit} noValidate aria-label="New sweep" aria-describedby="sweep-entry-status">
      <FormStatus id="sweep-entry-status" state={state} />
      <SweepSettingsFields coil={coil} errors={fieldErrors} />
      {fieldErrors["points"] && <p className="error">{fieldErrors["points"].join(" ")}</p>}
      <ReadingGrid rows={rows} onChange={changeRows} errors={gridErrors} touched={touched} onTouch={(key) => setTouched((t) => new Set(t).add(key))} />
      <p>
        <button type="submit" disabled={pending}>
          {pending ? "Saving…" : "Save sweep"}
        </button>
      </p>
    </form>
  );
}
