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
    return { kind: "none", clearanceId: null, validUntil: null, endedAt: null, label: "Not cleared", explanation: "No clearance has been signed for this coil." };
  }
  const lapse = clearanceLapse({
    clearance: { decidedAt: latest.decidedAt, validUntil: latest.validUntil, verdict: latest.verdict },
    failuresSince: failures,
    partReplacementsSince: partReplacements,
    now,
  });
  const base = { clearanceId: latest.id, validUntil: latest.validUntil, endedAt: lapse.at, explanation: lapse.explanation };
  if (latest.verdict === "refused") return { ...base, kind: "refused", label: "Refused" };
  if (!lapse.lapsed) return { ...base, kind: "valid", label: "Cleared" };
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
      return `This coil's clearance expired. ${state.explanation}`;
    case "lapsed-failure":
      return `This coil's clearance lapsed after a failure. ${state.explanation}`;
    case "lapsed-part":
      return `This coil's clearance lapsed after a part replacement. ${state.explanation}`;
  }
}
