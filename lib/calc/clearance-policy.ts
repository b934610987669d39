/**
 * The team's lending policy and its evaluation against a coil's recorded facts. Every rule reports
 * what was measured, the threshold, and why it passed or failed; anything that could not be worked
 * out fails its rule and says what is missing, so nothing passes silently. Passing means the coil
 * passed the team's recorded checks; it is not a statement that the build is safe.
 */
import { broadcastBandAt, broadcastBands, harmonicsInBroadcastBand, inBroadcastBand, type ItuRegion } from "./broadcast-band";
import { CalcInputError, requireInRange, requireNonNegative, requirePositive } from "./errors";
import { DEFAULT_LENDING_CHECKLIST, type ChecklistItem } from "./lending-checklist";
import { DEFAULT_MARGIN_THRESHOLDS, type Margin, type MarginKind, type MarginThresholds } from "./margin";
import { THERMAL_INPUT_NAMES } from "./thermal-margin";

export interface ClearancePolicyRules {
  /** Least voltage headroom, fraction of the rating. */
  minVoltageHeadroom: number;
  /** Least current headroom, fraction of the tighter current rating. */
  minCurrentHeadroom: number;
  /** Least thermal headroom, fraction (see thermal-margin.ts for the two criteria). */
  minThermalHeadroom: number;
  /** Least T_j,max − T_j, K. */
  minJunctionMarginK: number;
  /** Whether a margin resting on estimates (e.g. an unmeasured peak voltage) may pass. */
  acceptEstimatedMargins: boolean;
  /** ITU region whose medium-wave broadcast band the fundamental must stay out of. */
  ituRegion: ItuRegion;
  /** Oldest acceptable frequency sweep, days. */
  maxSweepAgeDays: number;
  /** Sessions without failure needed since the last failure or repair. */
  minFailureFreeSessions: number;
  /** Checklist items that must be answered "yes". */
  requiredChecklist: readonly ChecklistItem[];
  /** How long a clearance stays valid after signing, days. */
  validityDays: number;
}

export const DEFAULT_CLEARANCE_POLICY: Readonly<ClearancePolicyRules> = {
  // The margin thresholds' one table (margin.ts, with their sources); an admin's policy replaces them everywhere.
  minVoltageHeadroom: DEFAULT_MARGIN_THRESHOLDS.voltage,
  minCurrentHeadroom: DEFAULT_MARGIN_THRESHOLDS.current,
  minThermalHeadroom: DEFAULT_MARGIN_THRESHOLDS.thermal,
  // 25 K below T_j,max, e.g. 125 °C on a 150 °C part (common practice).
  minJunctionMarginK: 25,
  // Estimates are flagged on every rule they feed; the steward sees them (common practice).
  acceptEstimatedMargins: true,
  // Region 2's band (525–1705 kHz, ITU RR Article 5) contains Regions 1 and 3's (526.5–1606.5 kHz): the strictest default.
  ituRegion: 2,
  // Rooms, top loads and coils drift; a season-old sweep is stale (common practice).
  maxSweepAgeDays: 90,
  // Three clean runs after a failure or repair before lending (common practice).
  minFailureFreeSessions: 3,
  requiredChecklist: DEFAULT_LENDING_CHECKLIST,
  // Two months, long enough for a loan, short enough to come back for a fresh look (common practice).
  validityDays: 60,
};

export interface ClearanceFacts {
  /** The latest session's margins (as sessionMargins returns them); absent when no session is logged. */
  margins: Partial<Record<MarginKind, Margin | null>>;
  firstSeriesResonanceHz: number | null;
  runningFrequencyHz: number | null;
  openFailures: number;
  lastSweepAt: Date | null;
  /** Sessions without failure since the last failure or repair. */
  failureFreeSessions: number;
  /** Checklist answers by item id. */
  checklist: Readonly<Record<string, boolean>>;
}

export interface ClearanceRuleResult {
  id: string;
  label: string;
  measured: number | string | null;
  threshold: number | string;
  unit?: string;
  pass: boolean;
  detail: string;
}

export interface ClearanceEvaluation {
  rules: ClearanceRuleResult[];
  verdict: "pass" | "fail";
  failedRuleIds: string[];
  /** One sentence for the signing page. */
  summary: string;
}

const DAY_MS = 86_400_000;
/** A sweep dated up to a day ahead is taken as clock or date-entry skew, not as an error. */
const FUTURE_SKEW_MS = DAY_MS;

/** The policy's margin rules as the thresholds every per-session margin status is judged by (the only thresholds). */
export function marginThresholdsOf(policy: Pick<ClearancePolicyRules, "minVoltageHeadroom" | "minCurrentHeadroom" | "minThermalHeadroom">): MarginThresholds {
  return {
    voltage: requireInRange("policy.minVoltageHeadroom", policy.minVoltageHeadroom, 0, 1),
    current: requireInRange("policy.minCurrentHeadroom", policy.minCurrentHeadroom, 0, 1),
    thermal: requireInRange("policy.minThermalHeadroom", policy.minThermalHeadroom, 0, 1),
  };
}

/** Throws a CalcInputError naming the first out-of-range policy field. */
export function validateClearancePolicy(policy: ClearancePolicyRules): ClearancePolicyRules {
  requireInRange("policy.minVoltageHeadroom", policy.minVoltageHeadroom, 0, 1);
  requireInRange("policy.minCurrentHeadroom", policy.minCurrentHeadroom, 0, 1);
  requireInRange("policy.minThermalHeadroom", policy.minThermalHeadroom, 0, 1);
  requireNonNegative("policy.minJunctionMarginK", policy.minJunctionMarginK);
  if (policy.ituRegion !== 1 && policy.ituRegion !== 2 && policy.ituRegion !== 3) throw new CalcInputError("policy.ituRegion", "ITU region 1, 2 or 3", policy.ituRegion);
  requirePositive("policy.maxSweepAgeDays", policy.maxSweepAgeDays);
  requireWholeNumber("policy.minFailureFreeSessions", policy.minFailureFreeSessions);
  requirePositive("policy.validityDays", policy.validityDays);
  const ids = new Set<string>();
  policy.requiredChecklist.forEach((item, i) => {
    if (!item.id || ids.has(item.id)) throw new CalcInputError(`policy.requiredChecklist[${i}].id`, "a non-empty id used once", item.id);
    ids.add(item.id);
  });
  return policy;
}

/** When a clearance signed at `decidedAt` under `policy` stops being valid (UTC instant; whole days of 24 h). */
export function computeClearanceExpiry(decidedAt: Date, policy: Pick<ClearancePolicyRules, "validityDays">): Date {
  requireDate("decidedAt", decidedAt);
  return new Date(decidedAt.getTime() + requirePositive("policy.validityDays", policy.validityDays) * DAY_MS);
}

/** Evaluates every rule of the policy against the facts; the verdict passes only when every rule does. */
export function evaluateClearance(args: { policy: ClearancePolicyRules; facts: ClearanceFacts; now: Date }): ClearanceEvaluation {
  const policy = validateClearancePolicy(args.policy);
  const { facts } = args;
  const now = requireDate("now", args.now);
  requireWholeNumber("facts.openFailures", facts.openFailures);
  requireWholeNumber("facts.failureFreeSessions", facts.failureFreeSessions);

  const rules: ClearanceRuleResult[] = [
    marginRule("voltage-headroom", "Voltage headroom: switch peak voltage against its rating", facts.margins.voltage, policy.minVoltageHeadroom, policy),
    marginRule("current-headroom", "Current headroom: switch current against its ratings", facts.margins.current, policy.minCurrentHeadroom, policy),
    marginRule("thermal-headroom", "Thermal headroom: dissipation and junction rise against their limits", facts.margins.thermal, policy.minThermalHeadroom, policy),
    junctionRule(facts.margins.thermal, policy),
    broadcastRule(facts, policy.ituRegion),
    sweepAgeRule(facts.lastSweepAt, policy.maxSweepAgeDays, now),
    {
      id: "open-failures",
      label: "No open failures",
      measured: facts.openFailures,
      threshold: 0,
      unit: "failures",
      pass: facts.openFailures === 0,
      detail: facts.openFailures === 0 ? "No failure is waiting for its post-mortem." : `${facts.openFailures} failure${facts.openFailures === 1 ? " is" : "s are"} still open: close the post-mortem first.`,
    },
    {
      id: "failure-free-sessions",
      label: "Clean sessions since the last failure or repair",
      measured: facts.failureFreeSessions,
      threshold: policy.minFailureFreeSessions,
      unit: "sessions",
      pass: facts.failureFreeSessions >= policy.minFailureFreeSessions,
      detail: `${facts.failureFreeSessions} session${facts.failureFreeSessions === 1 ? "" : "s"} without failure since the last failure or repair; the policy asks for at least ${policy.minFailureFreeSessions}.`,
    },
    ...policy.requiredChecklist.map((item) => checklistRule(item, facts.checklist[item.id])),
  ];
  const failedRuleIds = rules.filter((r) => !r.pass).map((r) => r.id);
  const verdict = failedRuleIds.length === 0 ? "pass" : "fail";
  const summary =
    verdict === "pass"
      ? `Passed the team's recorded checks (${rules.length} rules). This records what was checked; it does not certify the build as safe.`
      : `Did not pass ${failedRuleIds.length} of ${rules.length} recorded checks.`;
  return { rules, verdict, failedRuleIds, summary };
}

function marginRule(id: string, label: string, margin: Margin | null | undefined, minHeadroom: number, policy: ClearancePolicyRules): ClearanceRuleResult {
  const base = { id, label, threshold: pct(minHeadroom), unit: "%" };
  if (!margin) return { ...base, measured: null, pass: false, detail: "No run session with this margin is recorded: log a session first." };
  if (margin.status === "unknown" || margin.headroom === null) {
    return { ...base, measured: null, pass: false, detail: `Could not be worked out: ${margin.notes.join(" ")}` };
  }
  const enough = margin.headroom >= minHeadroom - 1e-12;
  const estimateBlocked = margin.estimated && !policy.acceptEstimatedMargins;
  const estimates = margin.inputs.filter((i) => i.estimated).map((i) => i.name);
  const parts = [
    `${margin.formula} = ${roundUp(100 * (1 - margin.headroom))} % of the limit, ${pct(margin.headroom)} % headroom; the policy asks for at least ${round(100 * minHeadroom)} %.`,
  ];
  if (margin.estimated) {
    parts.push(`Rests on estimates (${estimates.join(", ")})${estimateBlocked ? ", which this policy does not accept: measure them." : "."}`);
  }
  return { ...base, measured: pct(margin.headroom), pass: enough && !estimateBlocked, detail: parts.join(" ") };
}

function junctionRule(thermal: Margin | null | undefined, policy: ClearancePolicyRules): ClearanceRuleResult {
  const base = { id: "junction-margin", label: "Junction temperature below its maximum", threshold: policy.minJunctionMarginK, unit: "K" };
  const tj = thermal?.inputs.find((i) => i.name === THERMAL_INPUT_NAMES.junctionTemp);
  const tjMax = thermal?.inputs.find((i) => i.name === THERMAL_INPUT_NAMES.maxJunctionTemp);
  if (!thermal) return { ...base, measured: null, pass: false, detail: "No run session recorded: log a session first." };
  if (!tj || !tjMax) {
    return { ...base, measured: null, pass: false, detail: `The junction temperature could not be worked out. ${thermal.notes.join(" ")}`.trim() };
  }
  const marginK = tjMax.value - tj.value;
  const estimateBlocked = tj.estimated && !policy.acceptEstimatedMargins;
  const detail =
    `T_j ≈ ${roundUp(tj.value)} °C against T_j,max ${round(tjMax.value)} °C: ${roundDown(marginK)} K to spare; the policy asks for ${policy.minJunctionMarginK} K.` +
    (tj.estimated ? ` T_j rests on estimates${estimateBlocked ? ", which this policy does not accept." : "."}` : "");
  return { ...base, measured: roundDown(marginK), pass: marginK >= policy.minJunctionMarginK && !estimateBlocked, detail };
}

function broadcastRule(facts: ClearanceFacts, region: ItuRegion): ClearanceRuleResult {
  const bands = broadcastBands(region);
  const threshold = `outside ${bands.map((b) => `${b.lowerEdge / 1e3}–${b.upperEdge / 1e3} kHz`).join(" and ")} (ITU Region ${region})`;
  const base = { id: "broadcast-band", label: bands.length > 1 ? "Fundamental outside the long- and medium-wave broadcast bands" : "Fundamental outside the medium-wave broadcast band", threshold, unit: "Hz" };
  const known = [
    { name: "running frequency", f: facts.runningFrequencyHz, field: "facts.runningFrequencyHz" },
    { name: "first series resonance", f: facts.firstSeriesResonanceHz, field: "facts.firstSeriesResonanceHz" },
  ].filter((k): k is { name: string; f: number; field: string } => k.f !== null && k.f !== undefined);
  if (known.length === 0) return { ...base, measured: null, pass: false, detail: "Neither a running frequency nor a swept first series resonance is recorded." };
  known.forEach((k) => requirePositive(k.field, k.f));
  const inside = known.filter((k) => inBroadcastBand(k.f, region));
  const parts = known.map((k) => `${k.name} ${round(k.f / 1e3)} kHz${inBroadcastBand(k.f, region) ? ` is INSIDE the ${broadcastBandAt(k.f, region)?.name} band` : ""}`);
  // Harmonics of the drive in a band are worth showing, not worth blocking (docs/references.md); a single switch's
  // asymmetric drive has even harmonics as well as odd (broadcast-band.ts).
  const harmonics = harmonicsInBroadcastBand(known[0]!.f, region).filter((h) => h.harmonic > 1);
  const note =
    harmonics.length > 0
      ? ` For information: harmonics ${harmonics.map((h) => h.harmonic).join(", ")} of the drive land in a broadcast band (a single switch's drive has even harmonics as well as odd).`
      : "";
  const verdict = inside.length === 0 ? ": outside the bands" : "";
  return { ...base, measured: (inside[0] ?? known[0]!).f, pass: inside.length === 0, detail: `${parts.join("; ")}${verdict}.${note}` };
}

function sweepAgeRule(lastSweepAt: Date | null, maxDays: number, now: Date): ClearanceRuleResult {
  const base = { id: "sweep-age", label: "Recent frequency sweep", threshold: maxDays, unit: "days" };
  if (lastSweepAt === null) return { ...base, measured: null, pass: false, detail: "No sweep recorded: sweep the coil first." };
  const ageMs = now.getTime() - requireDate("facts.lastSweepAt", lastSweepAt).getTime();
  if (ageMs < -FUTURE_SKEW_MS) {
    return { ...base, measured: null, pass: false, detail: `The last sweep is dated ${lastSweepAt.toISOString()}, after now: check its date.` };
  }
  const days = Math.max(0, ageMs) / DAY_MS;
  return {
    ...base,
    measured: roundUp(days),
    pass: days <= maxDays,
    detail: `Last sweep ${roundUp(days)} days ago (${lastSweepAt.toISOString().slice(0, 10)}); the policy accepts up to ${maxDays}.`,
  };
}

function checklistRule(item: ChecklistItem, answer: boolean | undefined): ClearanceRuleResult {
  return {
    id: `checklist:${item.id}`,
    label: item.text,
    measured: answer === undefined ? "not answered" : answer ? "yes" : "no",
    threshold: "yes",
    pass: answer === true,
    detail: answer === true ? "Confirmed." : answer === false ? "Answered no." : "Not answered.",
  };
}

function requireDate(field: string, d: Date): Date {
  if (!(d instanceof Date) || Number.isNaN(d.getTime())) throw new CalcInputError(field, "a valid date", d);
  return d;
}

function requireWholeNumber(field: string, n: number): number {
  if (!Number.isInteger(n) || n < 0) throw new CalcInputError(field, "a whole number ≥ 0", n);
  return n;
}

// Shown figures are rounded to 0.1 towards the failing side, so a shown value never looks like a pass
// that the unrounded comparison refused (the 1e-9 absorbs binary rounding such as 100·(1 − 0.8) = 19.999…).
function pct(fraction: number): number {
  return roundDown(100 * fraction);
}

function roundDown(x: number): number {
  return Math.floor(x * 10 + 1e-9) / 10;
}

function roundUp(x: number): number {
  return Math.ceil(x * 10 - 1e-9) / 10;
}

function round(x: number): number {
  return Math.round(x * 10) / 10;
}
