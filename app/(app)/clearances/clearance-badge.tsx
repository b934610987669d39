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

/** The badge's word when the reason sits beside it, so the two never say the same thing twice. */
const WORD: Record<ClearanceState["kind"], string> = {
  valid: "Cleared",
  none: "Not cleared",
  refused: "Refused",
  expired: "Expired",
  "lapsed-failure": "Lapsed",
  "lapsed-part": "Lapsed",
};

/** A coil's clearance state in a few words, with one sentence of reason beside it when asked for. */
export function ClearanceBadge({ state, withReason = false }: { state: ClearanceState; withReason?: boolean }) {
  const showReason = withReason && state.kind !== "valid" && state.kind !== "none";
  const words = state.kind === "valid" && state.validUntil ? `Cleared until ${formatDate(state.validUntil)}` : showReason ? WORD[state.kind] : state.label;
  return (
    <>
      <span className={`badge badge-${TONE[state.kind]}`}>{words}</span>
      {showReason && <span className="reason"> {state.summary}</span>}
    </>
  );
}
