import type { ClearanceState } from "@/lib/analysis/clearance-state";
import { formatDate } from "@/lib/units/format";

const TONE: Record<ClearanceState["kind"], string> = {
  valid: "cleared",
  none: "neutral",
  refused: "refused",
  expired: "lapsed",
  "lapsed-failure": "lapsed",
  "lapsed-part": "lapsed",
};

/** A coil's clearance state in a few words, with the full reason beside it when asked for. */
export function ClearanceBadge({ state, withReason = false }: { state: ClearanceState; withReason?: boolean }) {
  const words = state.kind === "valid" && state.validUntil ? `Cleared until ${formatDate(state.validUntil)}` : state.label;
  return (
    <>
      <span className={`badge badge-${TONE[state.kind]}`}>{words}</span>
      {withReason && state.kind !== "valid" && state.kind !== "none" && <span className="reason"> {state.explanation}</span>}
    </>
  );
}
