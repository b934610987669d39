/**
 * Operating hours and failures per fitted part, for fleet reliability: a part's hours are the durations of
 * the sessions run while it was fitted; its failures are those recorded against it. Parts are pooled by
 * part number across coils (lib/calc partReliability), so a transistor that keeps failing shows up.
 */
import type { PartExposure } from "../calc/reliability";
import { isFittedAt } from "./fitted-parts";
import type { ComponentRecord } from "./records";

export interface PartExposureRow extends PartExposure {
  kind: string;
  partNumber: string;
  componentId: string;
}

/** "irfp 260n " and "IRFP260N" are the same part. */
export function normalizePartKey(partNumber: string): string {
  return partNumber.trim().toUpperCase().replace(/[\s-]+/g, "");
}

export function computePartExposures(
  coils: readonly { components: readonly ComponentRecord[]; sessions: readonly { startedAt: Date; durationS: number }[] }[],
  failures: readonly { componentId: string | null }[],
): PartExposureRow[] {
  const fittedSeconds = new Map<string, number>();
  for (const coil of coils) {
    for (const component of coil.components) {
      fittedSeconds.set(component.id, coil.sessions.filter((s) => isFittedAt(component, s.startedAt)).reduce((sum, s) => sum + Math.max(0, s.durationS), 0));
    }
  }
  return partExposuresFromSeconds(coils.flatMap((coil) => coil.components), fittedSeconds, failures);
}

/**
 * The same rows from each part's seconds of sessions run while it was fitted, summed elsewhere (lib/db/part-hours.ts
 * sums them in the database, so the fleet's reliability page does not read every session). A part missing from
 * `fittedSeconds` ran no session. Rows come in the order of `components`.
 */
export function partExposuresFromSeconds(
  components: readonly Pick<ComponentRecord, "id" | "kind" | "partNumber">[],
  fittedSeconds: ReadonlyMap<string, number>,
  failures: readonly { componentId: string | null }[],
): PartExposureRow[] {
  const failuresByComponent = new Map<string, number>();
  for (const f of failures) if (f.componentId) failuresByComponent.set(f.componentId, (failuresByComponent.get(f.componentId) ?? 0) + 1);
  const rows: PartExposureRow[] = [];
  for (const component of components) {
    const partKey = normalizePartKey(component.partNumber);
    if (partKey === "") continue;
    rows.push({
      partKey,
      partNumber: component.partNumber.trim(),
      kind: component.kind,
      componentId: component.id,
      operatingHours: (fittedSeconds.get(component.id) ?? 0) / 3600,
      failures: failuresByComponent.get(component.id) ?? 0,
    });
  }
  return rows;
}

/** The kinds each part key was fitted as (normally one), for the table. */
export function collectPartKinds(rows: readonly PartExposureRow[]): Map<string, string[]> {
  const kinds = new Map<string, Set<string>>();
  for (const r of rows) (kinds.get(r.partKey) ?? kinds.set(r.partKey, new Set()).get(r.partKey)!).add(r.kind);
  return new Map([...kinds].map(([k, v]) => [k, [...v].sort()]));
}

/**
 * How the failures recorded against each part key split by mode, as [mode, count] pairs, most frequent first
 * (ties by mode name). Read from the failures as stored now, so a mode a post-mortem corrected counts as corrected.
 */
export function countFailureModesByPart(
  rows: readonly PartExposureRow[],
  failures: readonly { componentId: string | null; mode: string }[],
): Map<string, [mode: string, count: number][]> {
  const keyOfComponent = new Map(rows.map((r) => [r.componentId, r.partKey]));
  const counts = new Map<string, Map<string, number>>();
  for (const f of failures) {
    const key = f.componentId ? keyOfComponent.get(f.componentId) : undefined;
    if (key === undefined) continue;
    const byMode = counts.get(key) ?? counts.set(key, new Map()).get(key)!;
    byMode.set(f.mode, (byMode.get(f.mode) ?? 0) + 1);
  }
  return new Map([...counts].map(([key, byMode]) => [key, [...byMode].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))]));
}
