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
  const failuresByComponent = new Map<string, number>();
  for (const f of failures) if (f.componentId) failuresByComponent.set(f.componentId, (failuresByComponent.get(f.componentId) ?? 0) + 1);
  const rows: PartExposureRow[] = [];
  for (const coil of coils) {
    for (const component of coil.components) {
      const partKey = normalizePartKey(component.partNumber);
      if (partKey === "") continue;
      const seconds = coil.sessions.filter((s) => isFittedAt(component, s.startedAt)).reduce((sum, s) => sum + Math.max(0, s.durationS), 0);
      rows.push({
        partKey,
        partNumber: component.partNumber.trim(),
        kind: component.kind,
        componentId: component.id,
        operatingHours: seconds / 3600,
        failures: failuresByComponent.get(component.id) ?? 0,
      });
    }
  }
  return rows;
}

/** The kinds each part key was fitted as (normally one), for the table. */
export function collectPartKinds(rows: readonly PartExposureRow[]): Map<string, string[]> {
  const kinds = new Map<string, Set<string>>();
  for (const r of rows) (kinds.get(r.partKey) ?? kinds.set(r.partKey, new Set()).get(r.partKey)!).add(r.kind);
  return new Map([...kinds].map(([k, v]) => [k, [...v].sort()]));
}
