/**
 * CSV tables from a logbook file (lib/validation/export.ts): one table per file, since a zip is not
 * available. Column names carry the unit (SI, °C), times are ISO 8601 UTC, empty cells mean
 * "not recorded". Papa.unparse does the quoting.
 */
import Papa from "papaparse";
import type { CoilDocument, LogbookDocument } from "../validation/export";

export const COIL_CSV_TABLES = ["sessions", "sweep-points", "parts"] as const;
export type CoilCsvTable = (typeof COIL_CSV_TABLES)[number];

function toCsv(rows: Record<string, string | number | null>[], columns: string[]): string {
  return Papa.unparse({ fields: columns, data: rows.map((row) => columns.map((c) => row[c] ?? "")) }, { newline: "\r\n" });
}

/** The sessions table's columns, in order: the per-coil file and the site's streamed file share them. */
export const SESSION_CSV_COLUMNS = ["coil_tag", "session_id", "started_at", "top_load", "supply_voltage_v", "supply_current_a", "duration_s", "ambient_c", "heat_sink_start_c", "heat_sink_end_c", "running_frequency_hz", "peak_switch_voltage_v", "duty_cycle", "outcome", "logged_by", "notes"] as const;
export type SessionCsvRow = Record<(typeof SESSION_CSV_COLUMNS)[number], string | number | null>;

/**
 * One page of a streamed sessions table: the first page starts with the header line, every later one with the line
 * break that ends the previous page, so the pages joined are exactly `sessionsCsv`'s text for the same rows.
 */
export function sessionCsvPage(rows: SessionCsvRow[], first: boolean): string {
  const columns = [...SESSION_CSV_COLUMNS];
  const data = rows.map((row) => columns.map((c) => row[c] ?? ""));
  if (first) return Papa.unparse({ fields: columns, data }, { newline: "\r\n" });
  return rows.length === 0 ? "" : `\r\n${Papa.unparse({ fields: columns, data }, { newline: "\r\n", header: false })}`;
}

type Figure = number | null;

/** A session's own columns, as both the logbook file and the database's session rows carry them. */
export interface SessionCsvFields {
  id: string;
  topLoadId: string | null;
  supplyVoltageV: Figure;
  supplyCurrentA: Figure;
  durationS: Figure;
  ambientTempC: Figure;
  heatSinkStartC: Figure;
  heatSinkEndC: Figure;
  runningFrequencyHz: Figure;
  peakSwitchVoltageV: Figure;
  dutyCycle: Figure;
  outcome: string;
  notes: string;
}

/** One sessions-table row: ISO start time, the top load's name (its id when the name is unknown), the logger's e-mail. */
export function sessionCsvRow(coilTag: string, s: SessionCsvFields, named: { startedAt: string; topLoadName: string | undefined; loggedBy: string | null }): SessionCsvRow {
  return {
    coil_tag: coilTag,
    session_id: s.id,
    started_at: named.startedAt,
    top_load: s.topLoadId ? (named.topLoadName ?? s.topLoadId) : "",
    supply_voltage_v: s.supplyVoltageV,
    supply_current_a: s.supplyCurrentA,
    duration_s: s.durationS,
    ambient_c: s.ambientTempC,
    heat_sink_start_c: s.heatSinkStartC,
    heat_sink_end_c: s.heatSinkEndC,
    running_frequency_hz: s.runningFrequencyHz,
    peak_switch_voltage_v: s.peakSwitchVoltageV,
    duty_cycle: s.dutyCycle,
    outcome: s.outcome,
    logged_by: named.loggedBy,
    notes: s.notes,
  };
}

export function sessionsCsv(coil: CoilDocument): string {
  const topLoads = new Map(coil.topLoads.map((t) => [t.id, t.name]));
  return toCsv(
    coil.sessions.map((s) => sessionCsvRow(coil.tag, s, { startedAt: s.startedAt, topLoadName: s.topLoadId ? topLoads.get(s.topLoadId) : undefined, loggedBy: s.loggedBy })),
    [...SESSION_CSV_COLUMNS],
  );
}

/** Every sweep point, one row each, with its sweep's time and settings repeated so the table stands alone. */
export function sweepPointsCsv(coil: CoilDocument): string {
  const columns = ["coil_tag", "sweep_id", "taken_at", "series_resistance_ohm", "source_amplitude_v", "amplitude_convention", "frequency_hz", "amplitude_v"];
  return toCsv(
    coil.sweeps.flatMap((s) =>
      s.points.map((p) => ({
        coil_tag: coil.tag,
        sweep_id: s.id,
        taken_at: s.takenAt,
        series_resistance_ohm: s.seriesResistanceOhm,
        source_amplitude_v: s.sourceAmplitudeV,
        amplitude_convention: s.amplitudeConvention,
        frequency_hz: p.frequencyHz,
        amplitude_v: p.amplitudeV,
      })),
    ),
    columns,
  );
}

export function partsCsv(coil: CoilDocument): string {
  const columns = ["coil_tag", "part_id", "kind", "part_number", "manufacturer", "serial", "switch_type", "voltage_rating_v", "continuous_current_a", "peak_current_a", "power_25c_w", "tj_max_c", "rth_jc_k_per_w", "case_to_sink_k_per_w", "sink_rth_sa_k_per_w", "sink_mass_kg", "resistance_ohm", "capacitance_f", "clamp_voltage_v", "installed_at", "removed_at", "removal_reason", "replaced_by_part_id", "description"];
  return toCsv(
    coil.components.map((c) => ({
      coil_tag: coil.tag,
      part_id: c.id,
      kind: c.kind,
      part_number: c.partNumber,
      manufacturer: c.manufacturer,
      serial: c.serial,
      switch_type: c.switchType,
      voltage_rating_v: c.voltageRatingV,
      continuous_current_a: c.continuousCurrentA,
      peak_current_a: c.peakCurrentA,
      power_25c_w: c.powerRating25CW,
      tj_max_c: c.maxJunctionTempC,
      rth_jc_k_per_w: c.thermalResistanceJcKPerW,
      case_to_sink_k_per_w: c.caseToSinkKPerW,
      sink_rth_sa_k_per_w: c.sinkThermalResistanceKPerW,
      sink_mass_kg: c.sinkMassKg,
      resistance_ohm: c.resistanceOhm,
      capacitance_f: c.capacitanceF,
      clamp_voltage_v: c.clampVoltageV,
      installed_at: c.installedAt,
      removed_at: c.removedAt,
      removal_reason: c.removalReason,
      replaced_by_part_id: c.replacedById,
      description: c.description,
    })),
    columns,
  );
}

export function coilTableCsv(coil: CoilDocument, table: CoilCsvTable): string {
  return table === "sessions" ? sessionsCsv(coil) : table === "sweep-points" ? sweepPointsCsv(coil) : partsCsv(coil);
}

/** The fleet summary's columns, in order. */
export const FLEET_SUMMARY_COLUMNS = ["tag", "name", "builder", "status", "driver", "form_diameter_m", "winding_length_m", "turns", "wire_diameter_m", "wire_awg", "measured_inductance_h", "parts_fitted", "sessions", "last_session_at", "sweeps", "last_first_series_resonance_hz", "failures", "open_failures", "loans_out"] as const;
export type FleetSummaryRow = Record<(typeof FLEET_SUMMARY_COLUMNS)[number], string | number | null>;

/** The fleet summary from rows already counted (lib/db/fleet-summary.ts counts them in the database). */
export function fleetSummaryRowsCsv(rows: FleetSummaryRow[]): string {
  return toCsv(rows, [...FLEET_SUMMARY_COLUMNS]);
}

/** One row per coil: the build and how much of a logbook it has, counted from a whole logbook file. */
export function fleetSummaryCsv(doc: LogbookDocument): string {
  return fleetSummaryRowsCsv(
    doc.coils.map((c) => {
      const lastSweep = c.sweeps.at(-1);
      return {
        tag: c.tag,
        name: c.name,
        builder: c.builderName,
        status: c.status,
        driver: c.topology,
        form_diameter_m: c.formDiameterM,
        winding_length_m: c.windingLengthM,
        turns: c.turns,
        wire_diameter_m: c.wireDiameterM,
        wire_awg: c.wireGaugeAwg,
        measured_inductance_h: c.measuredInductanceH,
        parts_fitted: c.components.filter((p) => p.removedAt === null).length,
        sessions: c.sessions.length,
        last_session_at: c.sessions.at(-1)?.startedAt ?? null,
        sweeps: c.sweeps.length,
        last_first_series_resonance_hz: lastSweep?.firstSeriesResonanceHz ?? null,
        failures: c.failures.length,
        open_failures: c.failures.filter((f) => f.status === "open").length,
        loans_out: c.loans.filter((l) => l.returnedAt === null).length,
      };
    }),
  );
}
