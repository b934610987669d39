/**
 * The fleet summary (GET /api/export/fleet.csv): one row per coil of the scope's site, its build and how much of a
 * logbook it has, counted in the database. The summary used to read every coil's whole logbook file (every session,
 * heat-sink sample, sweep and sweep point) to print a few counts: at 250 000 sessions that was the whole database per
 * download. One statement now, with a correlated subquery per figure, each on its (coilId, …) index.
 *
 * Raw SQL because the query API cannot say it in one statement: its relation `_count` allows one filter per relation
 * (failures are counted twice, all and open) and a nested `take: 1` per coil is applied in memory after reading every
 * coil's rows. The statement is portable (quoted identifiers, no provider-only functions); test/export-stream.test.ts
 * checks it against the whole-logbook answer (exportFleet + fleetSummaryCsv) on SQLite and PostgreSQL.
 */
import { readRows } from "./adapter-read";
import { Prisma } from "./generated/client";
import { rawCount, rawDateOrNull } from "./raw-read";
import type { SiteScope } from "./site-scope";
import type { FleetSummaryRow } from "../export/logbook-csv";

interface FleetSummaryRaw {
  tag: string;
  name: string;
  builderName: string | null;
  status: string;
  topology: string;
  formDiameterM: number;
  windingLengthM: number;
  turns: number;
  wireDiameterM: number;
  wireGaugeAwg: number | null;
  measuredInductanceH: number | null;
  partsFitted: unknown;
  sessions: unknown;
  lastSessionAt: unknown;
  sweeps: unknown;
  lastResonanceHz: number | null;
  failures: unknown;
  openFailures: unknown;
  loansOut: unknown;
}

/** The one statement, also prepared as it is by the benchmark's floor (bench/export-memory.ts). */
export function fleetSummaryStatement(siteId: string): Prisma.Sql {
  return Prisma.sql`
    SELECT c.tag, c.name, c."builderName", c.status, c.topology, c."formDiameterM", c."windingLengthM", c.turns, c."wireDiameterM", c."wireGaugeAwg", c."measuredInductanceH",
      (SELECT count(*) FROM "Component" p WHERE p."coilId" = c.id AND p."removedAt" IS NULL) AS "partsFitted",
      (SELECT count(*) FROM "RunSession" s WHERE s."coilId" = c.id) AS sessions,
      (SELECT max(s."startedAt") FROM "RunSession" s WHERE s."coilId" = c.id) AS "lastSessionAt",
      (SELECT count(*) FROM "Sweep" w WHERE w."coilId" = c.id) AS sweeps,
      (SELECT w."firstSeriesResonanceHz" FROM "Sweep" w WHERE w."coilId" = c.id ORDER BY w."takenAt" DESC, w.id DESC LIMIT 1) AS "lastResonanceHz",
      (SELECT count(*) FROM "Failure" f WHERE f."coilId" = c.id) AS failures,
      (SELECT count(*) FROM "Failure" f WHERE f."coilId" = c.id AND f.status = 'open') AS "openFailures",
      (SELECT count(*) FROM "Loan" l WHERE l."coilId" = c.id AND l."returnedAt" IS NULL) AS "loansOut"
    FROM "Coil" c
    WHERE c."siteId" = ${siteId}
    ORDER BY c.tag`;
}

/** Every coil of the scope's site, by tag, with its counts and latest values (lib/export/logbook-csv.ts's columns). */
export async function readFleetSummaryRows(scope: SiteScope): Promise<FleetSummaryRow[]> {
  // "Last session" is the latest startedAt (the logbook file orders by startedAt, then id); "last sweep" is the
  // latest takenAt with the id breaking a tie, as the file orders them.
  const rows = await readRows<FleetSummaryRaw>(fleetSummaryStatement(scope.siteId));
  return rows.map((r) => ({
    tag: r.tag,
    name: r.name,
    builder: r.builderName,
    status: r.status,
    driver: r.topology,
    form_diameter_m: r.formDiameterM,
    winding_length_m: r.windingLengthM,
    turns: r.turns,
    wire_diameter_m: r.wireDiameterM,
    wire_awg: r.wireGaugeAwg,
    measured_inductance_h: r.measuredInductanceH,
    parts_fitted: rawCount(r.partsFitted),
    sessions: rawCount(r.sessions),
    last_session_at: rawDateOrNull(r.lastSessionAt)?.toISOString() ?? null,
    sweeps: rawCount(r.sweeps),
    last_first_series_resonance_hz: r.lastResonanceHz === null ? null : Number(r.lastResonanceHz),
    failures: rawCount(r.failures),
    open_failures: rawCount(r.openFailures),
    loans_out: rawCount(r.loansOut),
  }));
}
