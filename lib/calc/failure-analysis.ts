/**
 * Ranks the likely causes of a switch failure from what the logbook holds: the recorded mode, the
 * margins and trends of the sessions before it, and which part failed on which driver. The output is
 * a reading aid for the post-mortem, not a verdict: every score comes with the evidence behind it.
 *
 * Scoring rule. Each piece of evidence carries a weight w in [0, 1), its strength as a lone
 * explanation; a cause's score combines its weights as a noisy-OR, 1 − Π(1 − w), so evidence adds up
 * without ever passing 1 and no single item can be outvoted to zero. Weights (all common practice,
 * chosen so a recorded mode or an exceeded margin dominates a trend):
 * - recorded failure mode: 0.6 (strong, but other causes keep their own evidence);
 * - margin in the latest sessions: exceeded 0.5–0.7 (by how far over), thin 0.15–0.5 (80 → 100 % of the
 *   limit), +0.05 per further consecutive session (up to +0.15); × 0.7 when the margin is an estimate;
 *   × 0.5 when the thin/exceeded session is earlier in the window but not the latest;
 * - trends over sessions at comparable supply voltage (±5 %): heat-sink rise ≥ 5 K → over-temperature
 *   ΔK/30 (≤ 0.4); supply current up ≥ 10 % → over-current 2·r (≤ 0.4) and over-temperature 0.75·r
 *   (≤ 0.2); running frequency moved ≥ 5 % → over-current 2·|r| (≤ 0.2) and over-temperature |r| (≤ 0.1);
 * - the failed part and driver: a fan 0.35 mechanical / 0.15 over-temperature; a heat sink 0.25 / 0.15;
 *   a clamp or snubber 0.25 over-voltage; a gate/base drive part 0.25 reverse base breakdown; a BJT on a
 *   single-switch driver (base fed from the secondary) 0.15 reverse base breakdown, a MOSFET/IGBT 0.1;
 * - unknown: 0.25·(1 − best other score), plus 0.1 per recent session stopped early or flagged (≤ 0.3).
 */
import type { DriverTopology } from "./driver-topology";
import { CalcInputError, requireFinite, requireNonNegative, requirePositive } from "./errors";
import type { Margin, MarginKind } from "./margin";
import { theilSenTrend } from "./robust-trend";

export type FailureCause = "over_voltage" | "over_current" | "over_temperature" | "reverse_base_breakdown" | "mechanical" | "unknown";
/** As the database's ComponentKind enum. */
export type FailedComponentKind = "switch" | "heat_sink" | "snubber" | "clamp" | "fan" | "gate_drive" | "other";
/** As the database's SwitchType enum. */
export type SwitchType = "bjt" | "mosfet" | "igbt";
/** As the database's SessionOutcome enum. */
export type SessionOutcome = "normal" | "stopped" | "anomaly" | "failed";

export interface SessionHistoryEntry {
  startedAt: Date;
  /** The session's margins (as from sessionMargins, or a list). */
  margins: readonly Margin[] | Partial<Record<MarginKind, Margin>>;
  /** Supply voltage, V. */
  supplyVoltage: number;
  /** Average supply current, A. */
  supplyCurrent: number;
  /** Running frequency, Hz. */
  runningFrequency?: number | null;
  outcome?: SessionOutcome;
  /** Heat-sink temperature at the end of the run, °C. */
  heatSinkEnd?: number | null;
  /** Ambient temperature, °C; when known for the compared sessions the sink's rise over it is trended. */
  ambientTemp?: number | null;
  /** Run length, s; sessions more than a third longer or shorter than the latest are not compared for trends. */
  durationS?: number | null;
}

export interface RankedCause {
  cause: FailureCause;
  /** 0 to 1, noisy-OR of the evidence weights (see the file comment). */
  score: number;
  evidence: string[];
}

export interface FailureAnalysisInput {
  failure: { mode?: FailureCause | null; componentKind?: FailedComponentKind | null; occurredAt: Date };
  /** Sessions of the coil, in any order; those starting after the failure are ignored. */
  recentSessions: readonly SessionHistoryEntry[];
  switchType?: SwitchType | null;
  topology?: DriverTopology | null;
  /** How many sessions before the failure to look at (default 5). */
  windowSessions?: number;
  /** Relative supply-voltage difference within which sessions count as comparable (default 0.05). */
  comparableSupplyTolerance?: number;
}

const CAUSE_ORDER: readonly FailureCause[] = ["over_voltage", "over_current", "over_temperature", "reverse_base_breakdown", "mechanical", "unknown"];
const MARGIN_CAUSE: Readonly<Record<MarginKind, FailureCause>> = { voltage: "over_voltage", current: "over_current", thermal: "over_temperature" };
const COUNT_WORDS = ["zero", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine", "ten"];

/** One piece of evidence; an empty text carries weight without being shown. */
type Weighted = { weight: number; text: string };

/** Ranked likely causes of a failure, highest score first, each with its evidence (scoring rule in the file comment). */
// Weighted evidence combined as a noisy-OR (Pearl, Probabilistic Reasoning in Intelligent Systems, 1988, §4.3 — from memory); weights common practice.
export function rankLikelyCauses(input: FailureAnalysisInput): RankedCause[] {
  const occurredAt = requireDate("failure.occurredAt", input.failure.occurredAt);
  const windowSize = input.windowSessions ?? 5;
  if (!Number.isInteger(windowSize) || windowSize < 1) throw new CalcInputError("windowSessions", "a whole number of sessions, at least 1", windowSize);
  const tolerance = input.comparableSupplyTolerance ?? 0.05;
  if (!(tolerance >= 0 && tolerance < 1)) throw new CalcInputError("comparableSupplyTolerance", "a fraction from 0 to below 1", tolerance);

  const sessions = input.recentSessions
    .map((s, i) => checkSession(s, i))
    .filter((s) => s.startedAt.getTime() <= occurredAt.getTime())
    .sort((a, b) => a.startedAt.getTime() - b.startedAt.getTime())
    .slice(-windowSize);

  const found = new Map<FailureCause, Weighted[]>(CAUSE_ORDER.map((c) => [c, []]));
  const add = (cause: FailureCause, weight: number, text: string) => found.get(cause)!.push({ weight: Math.min(Math.max(weight, 0), 0.95), text });

  const mode = input.failure.mode ?? undefined;
  if (mode !== undefined && mode !== "unknown") add(mode, 0.6, `failure recorded as ${describeCause(mode)}`);
  if (mode === "unknown") add("unknown", 0, "failure mode recorded as unknown");

  for (const kind of ["voltage", "current", "thermal"] as const) addMarginEvidence(kind, sessions, add);
  addTrendEvidence(sessions, tolerance, add);
  addPartEvidence(input, add);

  if (sessions.length === 0) add("unknown", 0, "no run sessions recorded before the failure");
  const troubled = sessions.filter((s) => s.outcome === "stopped" || s.outcome === "anomaly").length;
  if (troubled > 0) add("unknown", Math.min(0.3, 0.1 * troubled), `${troubled} of the last ${sessions.length} sessions were stopped early or flagged as anomalies`);

  const scoreOf = (cause: FailureCause) => 1 - found.get(cause)!.reduce((p, e) => p * (1 - e.weight), 1);
  const bestOther = Math.max(...CAUSE_ORDER.filter((c) => c !== "unknown").map(scoreOf));
  // The residual "nothing else explains it" weight always counts; it is only worth saying when it matters.
  add("unknown", 0.25 * (1 - bestOther), bestOther < 0.3 ? "no recorded mode, margin or trend points clearly at one cause" : "");

  return CAUSE_ORDER.map((cause) => ({ cause, score: scoreOf(cause), evidence: found.get(cause)!.map((e) => e.text).filter((t) => t !== "") }))
    .filter((r) => r.cause === "unknown" || r.score > 0)
    .sort((a, b) => b.score - a.score || CAUSE_ORDER.indexOf(a.cause) - CAUSE_ORDER.indexOf(b.cause));
}

type CheckedSession = Omit<SessionHistoryEntry, "margins"> & { margins: Partial<Record<MarginKind, Margin>> };

function checkSession(s: SessionHistoryEntry, i: number): CheckedSession {
  const at = `recentSessions[${i}]`;
  requireDate(`${at}.startedAt`, s.startedAt);
  requirePositive(`${at}.supplyVoltage`, s.supplyVoltage);
  requireNonNegative(`${at}.supplyCurrent`, s.supplyCurrent);
  if (s.runningFrequency != null) requirePositive(`${at}.runningFrequency`, s.runningFrequency);
  if (s.heatSinkEnd != null) requireFinite(`${at}.heatSinkEnd`, s.heatSinkEnd);
  if (s.ambientTemp != null) requireFinite(`${at}.ambientTemp`, s.ambientTemp);
  if (s.durationS != null) requirePositive(`${at}.durationS`, s.durationS);
  const margins: Partial<Record<MarginKind, Margin>> = {};
  const list = Array.isArray(s.margins) ? (s.margins as readonly Margin[]) : Object.values(s.margins as Partial<Record<MarginKind, Margin>>);
  for (const m of list) if (m) margins[m.kind] = m;
  return { ...s, margins };
}

function requireDate(field: string, d: Date): Date {
  if (!(d instanceof Date) || Number.isNaN(d.getTime())) throw new CalcInputError(field, "a valid date", d);
  return d;
}

/** Fraction of the limit used (value/limit) for a computed thin or exceeded margin; undefined otherwise. */
function stressedUse(m: Margin | undefined): number | undefined {
  if (!m || (m.status !== "thin" && m.status !== "exceeded") || m.value === null || m.limit === null || m.limit <= 0) return undefined;
  return m.value / m.limit;
}

function stressWeight(use: number): number {
  if (use >= 1) return 0.5 + Math.min(0.2, use - 1);
  return 0.15 + 0.35 * Math.min(1, Math.max(0, (use - 0.8) / 0.2));
}

function addMarginEvidence(kind: MarginKind, sessions: readonly CheckedSession[], add: (c: FailureCause, w: number, t: string) => void): void {
  let streak = 0;
  for (let i = sessions.length - 1; i >= 0 && stressedUse(sessions[i]!.margins[kind]) !== undefined; i--) streak++;
  const considered = streak > 0 ? sessions.slice(sessions.length - streak) : sessions.filter((s) => stressedUse(s.margins[kind]) !== undefined);
  if (considered.length === 0) return;
  const worst = considered.reduce((a, b) => (stressedUse(b.margins[kind])! > stressedUse(a.margins[kind])! ? b : a));
  const margin = worst.margins[kind]!;
  const use = stressedUse(margin)!;
  let weight = stressWeight(use);
  let when: string;
  if (streak > 0) {
    weight += Math.min(0.15, 0.05 * (streak - 1));
    when = streak === 1 ? "in the last session before the failure" : `${countWord(streak)} sessions running`;
  } else {
    weight *= 0.5;
    when = `in ${considered.length} of the last ${sessions.length} sessions, though not the latest`;
  }
  if (margin.estimated) weight *= 0.7;
  const over = use > 1 ? " (over the limit)" : "";
  const estimated = margin.estimated ? " (estimated)" : "";
  add(MARGIN_CAUSE[kind], weight, `${describeStress(margin)} at ${percent(use)} of ${describeLimit(margin)}${over} ${when}${estimated}`);
}

function describeStress(m: Margin): string {
  if (m.kind === "voltage") return "peak voltage";
  if (m.kind === "current") return m.formula.startsWith("I_rms") ? "switch RMS current" : "peak switch current";
  return m.formula.startsWith("P") ? "switch dissipation" : "junction temperature rise";
}

function describeLimit(m: Margin): string {
  if (m.kind === "voltage") return "rating";
  if (m.kind === "current") return m.formula.startsWith("I_rms") ? "its continuous rating" : "its peak rating";
  return m.formula.startsWith("P") ? "the derated power" : "what T_j,max allows";
}

/** Change of a series over the sessions: robust (Theil–Sen) line end minus start for 3+ points, else the difference. */
// Theil (1950) / Sen (1968) slope via theilSenTrend; the session index is the x axis.
function fittedChange(ys: readonly number[]): { start: number; end: number } {
  const n = ys.length;
  if (n < 3) return { start: ys[0]!, end: ys[n - 1]! };
  const trend = theilSenTrend(ys.map((y, x) => ({ x, y })));
  return { start: trend.intercept, end: trend.intercept + trend.slope * (n - 1) };
}

/** Smallest average supply current a relative trend is computed from, A. */
const CURRENT_RESOLUTION_A = 0.01;

function addTrendEvidence(sessions: readonly CheckedSession[], tolerance: number, add: (c: FailureCause, w: number, t: string) => void): void {
  const latest = sessions[sessions.length - 1];
  if (!latest) return;
  const comparable = sessions.filter(
    (s) =>
      Math.abs(s.supplyVoltage - latest.supplyVoltage) <= tolerance * latest.supplyVoltage &&
      (s.durationS == null || latest.durationS == null || (s.durationS / latest.durationS <= 4 / 3 && latest.durationS / s.durationS <= 4 / 3)),
  );
  if (comparable.length < 2) return;
  const volts = comparable.map((s) => s.supplyVoltage);
  const [low, high] = [formatNumber(Math.min(...volts)), formatNumber(Math.max(...volts))];
  const atSupply = `at comparable supply voltage (${low === high ? low : `${low}–${high}`} V)`;

  const withSink = comparable.filter((s) => s.heatSinkEnd != null);
  if (withSink.length >= 2) {
    const overAmbient = withSink.every((s) => s.ambientTemp != null);
    const { start, end } = fittedChange(withSink.map((s) => s.heatSinkEnd! - (overAmbient ? s.ambientTemp! : 0)));
    const rise = end - start;
    if (rise >= 5) {
      const what = overAmbient ? "heat-sink end temperature above ambient" : "heat-sink end temperature";
      add("over_temperature", Math.min(0.4, rise / 30), `${what} rose ${formatNumber(rise)} K over the last ${withSink.length} sessions ${atSupply}`);
    }
  }

  const current = fittedChange(comparable.map((s) => s.supplyCurrent));
  // A ratio from a near-zero baseline is meaningless (and can overflow): below what a bench meter
  // resolves, no trend in current is read (common practice).
  if (current.start >= CURRENT_RESOLUTION_A) {
    const r = current.end / current.start - 1;
    if (r >= 0.1) {
      const text = `supply current up ${percent(r)} ${atSupply}, ${formatNumber(current.start)} A → ${formatNumber(current.end)} A over ${comparable.length} sessions`;
      add("over_current", Math.min(0.4, 2 * r), text);
      add("over_temperature", Math.min(0.2, 0.75 * r), text);
    }
  }

  const withFrequency = comparable.filter((s) => s.runningFrequency != null);
  if (withFrequency.length >= 2) {
    const f = fittedChange(withFrequency.map((s) => s.runningFrequency!));
    const r = f.start > 0 ? f.end / f.start - 1 : 0;
    if (Math.abs(r) >= 0.05) {
      const text = `running frequency ${r > 0 ? "up" : "down"} ${percent(Math.abs(r))} (${formatNumber(f.start / 1e3)} kHz → ${formatNumber(f.end / 1e3)} kHz) over ${withFrequency.length} sessions: the resonance the driver sees has moved`;
      add("over_current", Math.min(0.2, 2 * Math.abs(r)), text);
      add("over_temperature", Math.min(0.1, Math.abs(r)), text);
    }
  }
}

function addPartEvidence(input: FailureAnalysisInput, add: (c: FailureCause, w: number, t: string) => void): void {
  const kind = input.failure.componentKind ?? undefined;
  if (kind === "fan") {
    add("mechanical", 0.35, "the failed part is the fan");
    add("over_temperature", 0.15, "a stopped fan lets the heat sink overheat");
  } else if (kind === "heat_sink") {
    add("mechanical", 0.25, "the failed part is the heat sink (mounting, clamping or a cracked pad)");
    add("over_temperature", 0.15, "a loose or damaged heat sink lets the switch overheat");
  } else if (kind === "clamp" || kind === "snubber") {
    add("over_voltage", 0.25, `the failed part is the ${kind}, which exists to absorb turn-off voltage spikes`);
  } else if (kind === "gate_drive") {
    add("reverse_base_breakdown", 0.25, "the failed part is in the gate/base drive");
  }
  if (input.topology === "single_switch" && (kind === undefined || kind === "switch" || kind === "gate_drive")) {
    if (input.switchType === "bjt") {
      add("reverse_base_breakdown", 0.15, "a single-transistor driver fed from the secondary's base feedback can drive the base–emitter junction past its reverse rating");
    } else if (input.switchType === "mosfet" || input.switchType === "igbt") {
      add("reverse_base_breakdown", 0.1, "a single-switch driver fed from the secondary's feedback can swing the gate past its gate–source rating");
    }
  }
}

function describeCause(c: FailureCause): string {
  return c.replace(/_/g, "-").replace("reverse-base-breakdown", "reverse base breakdown");
}

function countWord(n: number): string {
  return COUNT_WORDS[n] ?? String(n);
}

function percent(fraction: number): string {
  return `${Math.round(fraction * 100)} %`;
}

function formatNumber(x: number): string {
  return String(Number(x.toPrecision(3)));
}
