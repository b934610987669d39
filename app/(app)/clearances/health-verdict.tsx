/**
 * The coil's health verdict beside a clearance: the recorded checks can all pass while the coil is on
 * watch (a thin margin, a drifting resonance), and whoever signs or lends must see that. Worded as what
 * the recorded sessions and sweeps show, never as a promise about the equipment.
 */
import type { HealthStatus } from "@/lib/calc/coil-health";

const HEADLINE: Record<HealthStatus, string> = {
  fine: "Fine: the recorded sessions and sweeps raise no findings.",
  watch: "Watch: the recorded checks may pass, but the logbook shows findings to keep an eye on before lending.",
  hold: "Hold: the logbook shows findings that should keep this coil off loan until they are dealt with.",
  "not enough data": "Not enough data: the logbook holds too little to judge the coil's health.",
};
const NOTICE: Record<HealthStatus, string> = { fine: "ok", watch: "warn", hold: "danger", "not enough data": "neutral" };
const BADGE: Record<HealthStatus, string> = { fine: "Fine", watch: "Watch", hold: "Hold", "not enough data": "Not enough data" };

export function HealthVerdict({ health, when }: { health: { status: HealthStatus; reasons: string[] } | null; when: string }) {
  if (!health) return <p className="notice neutral">Coil health {when}: the logbook could not be assessed.</p>;
  return (
    <div className={`notice ${NOTICE[health.status]}`} data-testid="clearance-health">
      <p>
        <strong>
          Coil health {when}: <span className={`badge badge-${health.status === "not enough data" ? "neutral" : health.status}`}>{BADGE[health.status]}</span>
        </strong>{" "}
        {HEADLINE[health.status]}
      </p>
      {health.reasons.length > 0 && (
        <ul>
          {health.reasons.map((reason) => (
            <li key={reason}>{reason}</li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** The sentence under "Recorded checks" on the signing page when every check passes, which must not read as all-clear while the coil is on watch or hold. */
export function describeChecksWithHealth(status: HealthStatus | undefined): string {
  if (status === "watch" || status === "hold") {
    return `Every recorded check passes, but the coil's health is ${BADGE[status]} (below): read its findings before you sign. Work through the checklist; all items must be confirmed to clear.`;
  }
  return "Every recorded check passes. Work through the checklist below; all items must be confirmed to clear.";
}
