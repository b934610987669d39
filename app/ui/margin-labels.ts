/** Words for margins, shared by the session, post-mortem and report pages. */
export const MARGIN_KIND_LABEL: Record<"voltage" | "current" | "thermal", string> = {
  voltage: "Voltage margin",
  current: "Current margin",
  thermal: "Thermal margin",
};

export const MARGIN_STATUS_LABEL: Record<"ok" | "thin" | "exceeded" | "unknown", string> = {
  ok: "Within threshold",
  thin: "Thin",
  exceeded: "Exceeded",
  unknown: "Not enough data",
};

/** The unit of a margin's value and limit, read from the ratio it was taken from (lib/calc's formula strings). */
export function marginValueUnit(formula: string): string {
  if (formula.startsWith("V_")) return "V";
  if (formula.startsWith("I_")) return "A";
  if (formula.startsWith("P")) return "W";
  return "K";
}
