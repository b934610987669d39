/**
 * Where a coil stands for lending, worked out on read from its latest signed decision, its failures and
 * its part replacements (lib/calc clearanceLapse), so every screen gives the same answer and the reason.
 */
import { clearanceLapse } from "../calc/clearance-lapse";

export type ClearanceStateKind = "none" | "valid" | "expired" | "lapsed-failure" | "lapsed-part" | "refused";

export interface ClearanceState {
  kind: ClearanceStateKind;
  clearanceId: string | null;
  validUntil: Date | null;
  /** When it stopped standing (null while valid, or when there is no clearance). */
  endedAt: Date | null;
  /** Short words for a badge. */
  label: string;
  /** A full sentence with the reason. */
  explanation: string;
  /**
   * One short sentence for beside a badge, saying what ended it and when without repeating the badge's
   * words ("Failure recorded (over voltage) on … UTC; needs a new clearance before lending.").
   */
  summary: string;
}

export interface ClearanceDecisionRecord {
  id: string;
  decidedAt: Date;
  validUntil: Date;
  verdict: "cleared" | "refused";
}

export function describeClearanceState(
  latest: ClearanceDecisionRecord | null,
  failures: readonly { occurredAt: Date; mode: string }[],
  partReplacements: readonly { at: Date; partDescription: string }[],
  now: Date,
): ClearanceState {
  if (latest === null) {
    return {
      kind: "none",
      clearanceId: null,
      validUntil: null,
      endedAt: null,
      label: "Not cleared",
      explanation: "No clearance has been signed for this coil.",
      summary: "No clearance has been signed.",
    };
  }
  const lapse = clearanceLapse({
    clearance: { decidedAt: latest.decidedAt, validUntil: latest.validUntil, verdict: latest.verdict },
    failuresSince: failures,
    partReplacementsSince: partReplacements,
    now,
  });
  const ended = lapse.cause ? `${lapse.cause.charAt(0).toUpperCase()}${lapse.cause.slice(1)}; needs a new clearance before lending.` : "";
  const base = { clearanceId: latest.id, validUntil: latest.validUntil, endedAt: lapse.at, explanation: lapse.explanation, summary: ended };
  if (latest.verdict === "refused") return { ...base, kind: "refused", label: "Refused" };
  if (!lapse.lapsed) return { ...base, kind: "valid", label: "Cleared", summary: `Passed the team's recorded checks; stands until ${utcDay(latest.validUntil)}.` };
  if (lapse.reason === "failure") return { ...base, kind: "lapsed-failure", label: "Lapsed: failure" };
  if (lapse.reason === "part-replaced") return { ...base, kind: "lapsed-part", label: "Lapsed: part replaced" };
  return { ...base, kind: "expired", label: "Expired" };
}

/** Why a coil in this state cannot be lent, or null when it can. */
export function describeLendingBlock(state: ClearanceState): string | null {
  switch (state.kind) {
    case "valid":
      return null;
    case "none":
      return "This coil has no clearance: a steward must clear it first.";
    case "refused":
      return "This coil's latest clearance decision was a refusal: it needs a new clearance.";
    case "expired":
      return `This coil's clearance expired on ${utcDay(state.endedAt)}: a steward must clear it again.`;
    case "lapsed-failure":
      return `This coil's clearance lapsed after a failure on ${utcDay(state.endedAt)}: a steward must clear it again.`;
    case "lapsed-part":
      return `This coil's clearance lapsed after a part replacement on ${utcDay(state.endedAt)}: a steward must clear it again.`;
  }
}

/**
 * What the steward must do about a coil that is out on loan, or null when its clearance still stands: a coil
 * whose clearance lapsed or expired while away is recalled, since it no longer matches what was checked.
 */
export function describeRecallNeed(state: ClearanceState): string | null {
  if (state.kind === "valid") return null;
  return `Recall it: ${state.summary.charAt(0).toLowerCase()}${state.summary.slice(1)}`;
}

/** "2026-03-09": the same day whatever the server's time zone (lib/calc states its instants in UTC too). */
function utcDay(d: Date | null): string {
  return d ? d.toISOString().slice(0, 10) : "an unknown date";
}
