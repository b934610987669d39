/**
 * Whether a signed clearance still stands. It lapses at the first of: its expiry, a failure of the
 * coil, or a part replacement (the build is no longer the one that was checked). A refused clearance
 * is never valid. Times are UTC instants; "at" is the instant the clearance stopped standing.
 */
import { CalcInputError } from "./errors";

export type ClearanceLapseReason = "expired" | "failure" | "part-replaced";

export interface ClearanceLapse {
  /** True when the clearance does not stand now (lapsed, or refused in the first place). */
  lapsed: boolean;
  /** Why it lapsed; null while it stands and for a refused clearance, which never stood. */
  reason: ClearanceLapseReason | null;
  /** When it stopped standing (the refusal's decision time for a refused clearance); null while it stands. */
  at: Date | null;
  /** What ended it, with its instant, e.g. "failure recorded (over voltage) on 2025-03-09 12:00 UTC"; null while it stands. */
  cause: string | null;
  explanation: string;
}

export interface ClearanceLapseInput {
  clearance: { decidedAt: Date; validUntil: Date; verdict: "cleared" | "refused" };
  /** Failures of the coil; those before the decision (already known when signing) and after `now` are ignored. */
  failuresSince: readonly { occurredAt: Date; mode: string }[];
  /** Parts fitted to the coil; same window as the failures. */
  partReplacementsSince: readonly { at: Date; partDescription: string }[];
  now: Date;
}

/**
 * On a tie the more telling reason is reported: a failure before a part replacement (a repair usually
 * follows a failure at the same moment) before a plain expiry.
 */
const TIE_ORDER: readonly ClearanceLapseReason[] = ["failure", "part-replaced", "expired"];

type LapseEvent = { reason: ClearanceLapseReason; at: Date; what: string };

/** Decides whether a clearance has lapsed by `now`, and why; the earliest lapse event wins. */
export function clearanceLapse(input: ClearanceLapseInput): ClearanceLapse {
  const decidedAt = requireDate("clearance.decidedAt", input.clearance.decidedAt);
  const validUntil = requireDate("clearance.validUntil", input.clearance.validUntil);
  const now = requireDate("now", input.now);
  if (validUntil.getTime() <= decidedAt.getTime()) {
    throw new CalcInputError("clearance.validUntil", `an instant after the decision (${formatUtc(decidedAt)})`, formatUtc(validUntil));
  }
  const events: LapseEvent[] = [];
  input.failuresSince.forEach((f, i) => {
    const at = requireDate(`failuresSince[${i}].occurredAt`, f.occurredAt);
    events.push({ reason: "failure", at, what: `failure recorded (${f.mode.replace(/_/g, " ")})` });
  });
  input.partReplacementsSince.forEach((p, i) => {
    const at = requireDate(`partReplacementsSince[${i}].at`, p.at);
    events.push({ reason: "part-replaced", at, what: `part replaced (${p.partDescription})` });
  });

  if (input.clearance.verdict === "refused") {
    return { lapsed: true, reason: null, at: decidedAt, cause: `refused on ${formatUtc(decidedAt)}`, explanation: `Refused on ${formatUtc(decidedAt)}: a refused clearance is never valid.` };
  }

  // An event at the very instant of signing counts: the steward cannot have seen it.
  const inWindow = events.filter((e) => e.at.getTime() >= decidedAt.getTime() && e.at.getTime() <= now.getTime());
  if (now.getTime() >= validUntil.getTime()) inWindow.push({ reason: "expired", at: validUntil, what: "validity ended" });
  if (inWindow.length === 0) {
    const daysLeft = Math.floor((validUntil.getTime() - now.getTime()) / 86_400_000);
    return {
      lapsed: false,
      reason: null,
      at: null,
      cause: null,
      explanation: `Stands until ${formatUtc(validUntil)} (${daysLeft} full day${daysLeft === 1 ? "" : "s"} left); no failure or part replacement since it was signed.`,
    };
  }
  inWindow.sort((a, b) => a.at.getTime() - b.at.getTime() || TIE_ORDER.indexOf(a.reason) - TIE_ORDER.indexOf(b.reason));
  const [first, ...rest] = inWindow as [LapseEvent, ...LapseEvent[]];
  const later = rest.length > 0 ? ` Since then: ${rest.map((e) => `${e.what} on ${formatUtc(e.at)}`).join("; ")}.` : "";
  return {
    lapsed: true,
    reason: first.reason,
    at: first.at,
    cause: `${first.what} on ${formatUtc(first.at)}`,
    explanation: `Lapsed on ${formatUtc(first.at)}: ${first.what}. A new clearance is needed before lending.${later}`,
  };
}

function requireDate(field: string, d: Date): Date {
  if (!(d instanceof Date) || Number.isNaN(d.getTime())) throw new CalcInputError(field, "a valid date", d);
  return d;
}

/** "2025-04-02 14:05 UTC": the same text whatever the server's time zone. */
function formatUtc(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;
}
