/**
 * `npm run bench -- --large`: peak memory of exporting the sessions table, against a floor that streams the same
 * rows out of better-sqlite3 into CSV text one row at a time (what a streaming export holds: a row and a line).
 * Two sizes: one busy coil's 500 sessions (GET /api/export/coils/<tag>/sessions.csv, which today builds the coil's
 * whole logbook document first) and the whole large fleet's 250 000 sessions (no such export exists yet: a SLOT, its
 * floor printed so the export written for issue 13 has a figure to meet).
 *
 * Also the floor of GET /api/export/fleet.csv: its few per-coil counts as aggregate SQL (the app today reads every
 * coil's whole logbook, sweep points and samples included, to count them: at this size not run, a SLOT).
 *
 * Memory is heap + array buffers relative to a forced collection just before, sampled every 2 ms while the export
 * awaits and every 500 rows inside the synchronous floor; the peak is the highest sample.
 */
import { benchScope } from "./bench-scope";
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";
import Database from "better-sqlite3";
import { recordFigure, recordFloorOnly } from "./figures";
import { LARGE_DB_PATH } from "./large-fleet";

setFlagsFromString("--expose-gc");
const collect = runInNewContext("gc") as () => void;
const used = () => {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
};
const MB = 1_048_576;

/** Peak memory (MB above the start) while `run` works, sampled on a timer and by `run` itself through `sample`. */
async function peakOf(run: (sample: () => void) => unknown): Promise<number> {
  collect();
  const start = used();
  let peak = start;
  const sample = () => {
    const now = used();
    if (now > peak) peak = now;
  };
  const timer = setInterval(sample, 2);
  try {
    await run(sample);
    sample();
  } finally {
    clearInterval(timer);
  }
  return (peak - start) / MB;
}

const SESSION_COLUMNS = `c.tag, s.id, s."startedAt", t.name AS "topLoad", s."supplyVoltageV", s."supplyCurrentA", s."durationS", s."ambientTempC", s."heatSinkStartC", s."heatSinkEndC",
  s."runningFrequencyHz", s."peakSwitchVoltageV", s."dutyCycle", s.outcome, u.email, s.notes`;
const FROM = `FROM "RunSession" s JOIN "Coil" c ON c.id = s."coilId" LEFT JOIN "TopLoad" t ON t.id = s."topLoadId" LEFT JOIN "User" u ON u.id = s."loggedById"`;

/** CSV cell quoting as RFC 4180 has it: quote when the cell holds a quote, comma or line break. */
const cell = (value: unknown) => {
  const text = value === null || value === undefined ? "" : String(value);
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
};

/** Streams the rows of `statement` to CSV lines, keeping only a byte count (the response body would be sent on). */
function streamCsv(statement: Database.Statement, params: unknown[], sample: () => void): { rows: number; bytes: number } {
  let rows = 0;
  let bytes = 0;
  for (const row of statement.raw().iterate(...params) as Iterable<unknown[]>) {
    bytes += Buffer.byteLength(row.map(cell).join(",") + "\r\n");
    if (++rows % 500 === 0) sample();
  }
  return { rows, bytes };
}

/** fleetSummaryCsv's columns (lib/export/logbook-csv.ts), each coil's counts and latest values by aggregate SQL. */
function fleetSummaryFloorMs(db: Database.Database): { ms: number; rows: number } {
  const summary = db.prepare(`
    SELECT c.tag, c.name, c."builderName", c.status, c.topology, c."formDiameterM", c."windingLengthM", c.turns, c."wireDiameterM", c."wireGaugeAwg", c."measuredInductanceH",
      (SELECT count(*) FROM "Component" p WHERE p."coilId" = c.id AND p."removedAt" IS NULL) AS "partsFitted",
      (SELECT count(*) FROM "RunSession" s WHERE s."coilId" = c.id) AS sessions,
      (SELECT max(s."startedAt") FROM "RunSession" s WHERE s."coilId" = c.id) AS "lastSessionAt",
      (SELECT count(*) FROM "Sweep" w WHERE w."coilId" = c.id) AS sweeps,
      (SELECT w."firstSeriesResonanceHz" FROM "Sweep" w WHERE w."coilId" = c.id ORDER BY w."takenAt" DESC, w.id DESC LIMIT 1) AS "lastResonanceHz",
      (SELECT count(*) FROM "Failure" f WHERE f."coilId" = c.id) AS failures,
      (SELECT count(*) FROM "Failure" f WHERE f."coilId" = c.id AND f.status = 'open') AS "openFailures",
      (SELECT count(*) FROM "Loan" l WHERE l."coilId" = c.id AND l."returnedAt" IS NULL) AS "loansOut"
    FROM "Coil" c ORDER BY c.tag`);
  let rows = 0;
  const times: number[] = [];
  for (let i = 0; i < 6; i++) {
    const started = performance.now();
    rows = summary.all().length;
    if (i > 0) times.push(performance.now() - started);
  }
  return { ms: times.sort((a, b) => a - b)[2]!, rows };
}

export async function benchExportMemory(busyTag: string): Promise<void> {
  const db = new Database(LARGE_DB_PATH, { readonly: true });
  const oneCoil = db.prepare(`SELECT ${SESSION_COLUMNS} ${FROM} WHERE c.tag = ? ORDER BY s."startedAt", s.id`);
  const wholeFleet = db.prepare(`SELECT ${SESSION_COLUMNS} ${FROM} ORDER BY c.tag, s."startedAt", s.id`);
  let coilRows = { rows: 0, bytes: 0 };
  let fleetRows = { rows: 0, bytes: 0 };
  const coilFloor = await peakOf((sample) => (coilRows = streamCsv(oneCoil, [busyTag], sample)));
  const fleetFloor = await peakOf((sample) => (fleetRows = streamCsv(wholeFleet, [], sample)));
  const fleetCsvFloor = fleetSummaryFloorMs(db);
  db.close();

  console.log(`\nGET /api/export/fleet.csv floor: its per-coil counts as aggregate SQL, ${fleetCsvFloor.ms.toFixed(0)} ms (median of 5), ${fleetCsvFloor.rows} rows`);
  recordFloorOnly("fleetCsvRead", fleetCsvFloor.ms, `${fleetCsvFloor.rows} coils`);

  console.log(`\nExporting the sessions table (peak heap + array buffers above a collected start)`);
  console.log(`  floor, one coil (${busyTag}): ${coilRows.rows} rows, ${(coilRows.bytes / MB).toFixed(2)} MB of CSV streamed, peak ${coilFloor.toFixed(1)} MB`);
  console.log(`  floor, whole fleet: ${fleetRows.rows} rows, ${(fleetRows.bytes / MB).toFixed(1)} MB of CSV streamed, peak ${fleetFloor.toFixed(1)} MB`);
  recordFloorOnly("fleetSessionsExportPeak", fleetFloor, `${fleetRows.rows} rows, ${(fleetRows.bytes / MB).toFixed(0)} MB of CSV`);

  // What GET /api/export/coils/<tag>/sessions.csv does today: the coil's whole logbook document, then the table.
  const { exportCoil } = await import("../lib/db/export");
  const { coilTableCsv } = await import("../lib/export/logbook-csv");
  try {
    let csvBytes = 0;
    const appPeak = await peakOf(async () => {
      const doc = await exportCoil(benchScope(null), busyTag);
      const coil = doc?.coils[0];
      if (!coil) throw new Error(`No coil ${busyTag} in the fixture`);
      csvBytes = Buffer.byteLength(coilTableCsv(coil, "sessions"));
    });
    console.log(`  app, one coil (exportCoil + coilTableCsv "sessions"): ${(csvBytes / MB).toFixed(2)} MB of CSV, peak ${appPeak.toFixed(1)} MB   ×${(appPeak / coilFloor).toFixed(1)} the floor`);
    recordFigure({ key: "sessionExportPeak", value: appPeak, floor: coilFloor, note: `${coilRows.rows} rows` });
  } catch (error) {
    console.log(`  app, one coil: failed on this code (${(error as Error).message.split("\n").filter(Boolean).at(-1)})`);
    recordFloorOnly("sessionExportPeak", coilFloor, "the app's export failed on this code, see above");
  }
}
