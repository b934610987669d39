/**
 * "Planned vs measured" for a coil saved from the planner: each figure the plan predicted beside what has since been
 * measured, with the deviation and the basis in words. Pure TypeScript over stored records.
 */
import type { SessionRecord, SweepRecord } from "./records";
import type { StoredPlan } from "../validation/plan";

export interface PlanVsMeasuredRow {
  key: "inductance" | "firstResonance" | "runningFrequency" | "peakVoltage" | "sinkTemperature";
  label: string;
  unit: "H" | "Hz" | "V" | "°C";
  planned: number | null;
  /** Planned band, when the plan gave one. */
  plannedLow?: number;
  plannedHigh?: number;
  measured: number | null;
  /** (measured − planned)/planned; for temperatures, the rise over ambient is compared. Null until both exist. */
  deviation: number | null;
  /** Whether the measurement fell inside the planned band (null without a band or a measurement). */
  withinBand: boolean | null;
  basis: string;
}

type Session = Pick<SessionRecord, "startedAt" | "supplyVoltageV" | "supplyCurrentA" | "ambientTempC" | "heatSinkEndC" | "runningFrequencyHz" | "peakSwitchVoltageV">;
type Sweep = Pick<SweepRecord, "takenAt" | "firstSeriesResonanceHz">;

function latest<T extends { startedAt?: Date; takenAt?: Date }>(rows: readonly T[], has: (row: T) => boolean): T | undefined {
  const time = (row: T) => (row.startedAt ?? row.takenAt ?? new Date(0)).getTime();
  return [...rows].filter(has).sort((a, b) => time(b) - time(a))[0];
}

const relative = (planned: number | null, measured: number | null) => (planned === null || measured === null || planned === 0 ? null : measured / planned - 1);

/** The plan's chosen variant against the coil's measurements (latest of each). */
export function comparePlanWithMeasured(plan: StoredPlan, coil: { measuredInductanceH: number | null }, sweeps: readonly Sweep[], sessions: readonly Session[]): PlanVsMeasuredRow[] {
  const chosen = plan.variants[plan.chosenVariant] ?? plan.variants[0]!;
  const p = chosen.predicted;
  const inputs = chosen.inputs;
  const rows: PlanVsMeasuredRow[] = [];

  rows.push({
    key: "inductance",
    label: "Inductance",
    unit: "H",
    planned: p.inductanceH,
    measured: coil.measuredInductanceH,
    deviation: relative(p.inductanceH, coil.measuredInductanceH),
    withinBand: null,
    basis: "Nagaoka current sheet for the planned winding; measured value from the build record.",
  });

  const sweep = latest(sweeps, (s) => s.firstSeriesResonanceHz !== null);
  const swept = sweep?.firstSeriesResonanceHz ?? null;
  rows.push({
    key: "firstResonance",
    label: "First resonance",
    unit: "Hz",
    planned: p.firstResonanceHz,
    plannedLow: p.firstResonanceLowHz,
    plannedHigh: p.firstResonanceHighHz,
    measured: swept,
    deviation: relative(p.firstResonanceHz, swept),
    withinBand: swept === null ? null : swept >= p.firstResonanceLowHz && swept <= p.firstResonanceHighHz,
    basis: "Planned from geometry and the free-space top load alone (no sweep existed); measured: the latest sweep's first series resonance.",
  });

  const running = latest(sessions, (s) => s.runningFrequencyHz !== null);
  const runningHz = running?.runningFrequencyHz ?? null;
  rows.push({
    key: "runningFrequency",
    label: "Running frequency",
    unit: "Hz",
    planned: p.firstResonanceHz,
    plannedLow: p.firstResonanceLowHz,
    plannedHigh: p.firstResonanceHighHz,
    measured: runningHz,
    deviation: relative(p.firstResonanceHz, runningHz),
    withinBand: runningHz === null ? null : runningHz >= p.firstResonanceLowHz && runningHz <= p.firstResonanceHighHz,
    basis: "The plan's first resonance: a self-oscillating driver runs within a few per cent of it (common practice); measured: the latest session's.",
  });

  const peakSession = latest(sessions, (s) => s.peakSwitchVoltageV !== null);
  let plannedPeak: number | null = null;
  let peakBasis = "No session has a measured collector/drain peak yet.";
  if (peakSession) {
    // Scaled to the session's supply: the rule of thumb is a multiple of the supply; a clamp holds its own voltage.
    plannedPeak = p.clampPlanned ? p.peakClampedV : (p.peakUnclampedV / inputs.supplyVoltageV) * peakSession.supplyVoltageV;
    peakBasis = p.clampPlanned
      ? "Planned: the clamp's voltage; measured: the latest session's peak."
      : `Planned: the unclamped rule of thumb (${Math.round((p.peakUnclampedV / inputs.supplyVoltageV) * 10) / 10} × supply) at that session's ${peakSession.supplyVoltageV} V; measured: the latest session's peak.`;
  }
  const peak = peakSession?.peakSwitchVoltageV ?? null;
  rows.push({
    key: "peakVoltage",
    label: "Collector/drain peak",
    unit: "V",
    planned: plannedPeak ?? (p.clampPlanned ? p.peakClampedV : p.peakUnclampedV),
    measured: peak,
    deviation: relative(plannedPeak, peak),
    withinBand: null,
    basis: peakBasis,
  });

  const sinkSession = latest(sessions, (s) => s.heatSinkEndC !== null);
  let plannedSink: number | null = p.steadySinkC;
  let sinkBasis = p.dissipationW === null ? "The plan had no supply current, so no sink temperature was planned." : "Planned steady sink temperature Ta + P·Rθsa at the planned supply.";
  let sinkDeviation: number | null = null;
  const plannedPower = inputs.supplyCurrentA === null ? null : inputs.supplyVoltageV * inputs.supplyCurrentA;
  if (sinkSession && p.steadySinkC !== null && plannedPower !== null) {
    // The steady rise scales with the input power (a fixed share is lost in the switch): rescaled to the session's supply and ambient.
    const rise = (p.steadySinkC - inputs.ambientTempC) * ((sinkSession.supplyVoltageV * sinkSession.supplyCurrentA) / plannedPower);
    plannedSink = sinkSession.ambientTempC + rise;
    sinkBasis = `Planned steady rise scaled to the latest session's ${sinkSession.supplyVoltageV} V × ${sinkSession.supplyCurrentA} A and ${sinkSession.ambientTempC} °C ambient; measured: its end temperature (a short run may not have reached steady state).`;
    sinkDeviation = rise === 0 ? null : (sinkSession.heatSinkEndC! - sinkSession.ambientTempC) / rise - 1;
  }
  rows.push({
    key: "sinkTemperature",
    label: "Heat-sink temperature",
    unit: "°C",
    planned: plannedSink,
    measured: sinkSession?.heatSinkEndC ?? null,
    deviation: sinkDeviation,
    withinBand: null,
    basis: sinkBasis,
  });
  return rows;
}
