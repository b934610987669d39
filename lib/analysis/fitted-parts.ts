/** Which parts were on a coil at a given moment: what a margin or a post-mortem must use. */
import type { ComponentRecord } from "./records";

export interface FittedParts {
  /** The switching transistors fitted (one for a single-switch driver, two or four for the others). */
  switches: ComponentRecord[];
  sink: ComponentRecord | null;
  clamp: ComponentRecord | null;
  fan: ComponentRecord | null;
  all: ComponentRecord[];
}

export function isFittedAt(component: Pick<ComponentRecord, "installedAt" | "removedAt">, at: Date): boolean {
  return component.installedAt.getTime() <= at.getTime() && (component.removedAt === null || component.removedAt.getTime() > at.getTime());
}

export function partsFittedAt(components: readonly ComponentRecord[], at: Date): FittedParts {
  const all = components.filter((c) => isFittedAt(c, at));
  return {
    switches: all.filter((c) => c.kind === "switch"),
    sink: all.find((c) => c.kind === "heat_sink") ?? null,
    clamp: all.find((c) => c.kind === "clamp") ?? null,
    fan: all.find((c) => c.kind === "fan") ?? null,
    all,
  };
}
