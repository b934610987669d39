/**
 * `npm run bench -- --large`: peak memory of exporting the sessions table, against a floor that streams the same
 * rows out of better-sqlite3 into CSV text one row at a time (what a streaming export holds: a row and a line).
 * Two sizes: one busy coil's 500 sessions (GET /api/export/coils/<tag>/sessions.csv) and the whole large fleet's
 * 250 000 sessions (GET /api/export/sessions.csv), both what their routes stream: lib/db/session-export.ts's keyset
 * pages through lib/export/csv-stream.ts, read to the end here as a client would.
 *
 * Also GET /api/export/fleet.csv's server work (lib/db/fleet-summary.ts's aggregate statement and the CSV) against the
 * same counts as aggregate SQL through better-sqlite3, timed in alternation, the ratio the median of per-round ratios.
 *
 * Memory is heap + array buffers relative to a forced collection just before, sampled every 2 ms while the export
 * awaits and every 500 rows inside the synchronous floor; the peak is the highest sample.
 */
import { benchScope } from "./bench-scope";
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";
import Database from "better-sqlite3";
import { recordFigure } from "./figures";
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

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

/** Reads a route's CSV stream to the end as a client would, keeping only a byte count. */
async function drain(stream: ReadableStream<Uint8Array>): Promise<number> {
  const reader = stream.getReader();
  let bytes = 0;
  for (let next = await reader.read(); !next.done; next = await reader.read()) bytes += next.value.byteLength;
  return bytes;
}

export async function benchExportMemory(busyTag: string): Promise<void> {
  const db = new Database(LARGE_DB_PATH, { readonly: true });
  const oneCoil = db.prepare(`SELECT ${SESSION_COLUMNS} ${FROM} WHERE c."siteId" = ? AND c.tag = ? ORDER BY s."startedAt", s.id`);
  const wholeFleet = db.prepare(`SELECT ${SESSION_COLUMNS} ${FROM} WHERE c."siteId" = ? ORDER BY c.tag, s."startedAt", s.id`);
  let coilRows = { rows: 0, bytes: 0 };
  let fleetRows = { rows: 0, bytes: 0 };
  const scope = benchScope(null);
  const coilFloor = await peakOf((sample) => (coilRows = streamCsv(oneCoil, [scope.siteId, busyTag], sample)));
  const fleetFloor = await peakOf((sample) => (fleetRows = streamCsv(wholeFleet, [scope.siteId], sample)));

  // GET /api/export/fleet.csv: the route's work (aggregate read + CSV text) and the raw floor, alternating. The floor
  // prepares the route's own statement in better-sqlite3 (Prisma.Sql's `sql` is the `?`-placeholder text).
  const { fleetSummaryStatement, readFleetSummaryRows } = await import("../lib/db/fleet-summary");
  const summaryStatement = fleetSummaryStatement(scope.siteId);
  const fleetSummaryFloor = db.prepare(summaryStatement.sql);
  const { fleetSummaryRowsCsv, sessionCsvPage } = await import("../lib/export/logbook-csv");
  const { openSessionExport } = await import("../lib/db/session-export");
  const { csvStream } = await import("../lib/export/csv-stream");
  const appTimes: number[] = [];
  const floorTimes: number[] = [];
  const ratios: number[] = [];
  let summaryRows = 0;
  for (let round = 0; round < 13; round++) {
    let started = performance.now();
    const rows = await readFleetSummaryRows(scope);
    fleetSummaryRowsCsv(rows);
    summaryRows = rows.length;
    const app = performance.now() - started;
    started = performance.now();
    fleetSummaryFloor.all(...summaryStatement.values);
    const floor = performance.now() - started;
    if (round < 2) continue;
    appTimes.push(app);
    floorTimes.push(floor);
    ratios.push(app / floor);
  }
  db.close();
  console.log(`\nGET /api/export/fleet.csv, ${summaryRows} coils: readFleetSummaryRows + CSV ${median(appTimes).toFixed(0)} ms, raw aggregate SQL ${median(floorTimes).toFixed(0)} ms (medians of 11 alternating rounds), ×${median(ratios).toFixed(2)}`);
  recordFigure({ key: "fleetCsvRead", value: median(appTimes), floor: median(floorTimes), ratio: median(ratios), note: `${summaryRows} coils` });

  console.log(`\nExporting the sessions table (peak heap + array buffers above a collected start)`);
  console.log(`  floor, one coil (${busyTag}): ${coilRows.rows} rows, ${(coilRows.bytes / MB).toFixed(2)} MB of CSV streamed, peak ${coilFloor.toFixed(1)} MB`);
  console.log(`  floor, whole fleet: ${fleetRows.rows} rows, ${(fleetRows.bytes / MB).toFixed(1)} MB of CSV streamed, peak ${fleetFloor.toFixed(1)} MB`);

  // What the two routes return: openSessionExport's keyset pages through csvStream, read to the end.
  let coilBytes = 0;
  const coilPeak = await peakOf(async () => {
    const { pages } = await openSessionExport(scope, { tag: busyTag });
    coilBytes = await drain(csvStream(pages, sessionCsvPage));
  });
  console.log(`  app, one coil (GET /api/export/coils/${busyTag}/sessions.csv): ${(coilBytes / MB).toFixed(2)} MB of CSV, peak ${coilPeak.toFixed(1)} MB   ×${(coilPeak / coilFloor).toFixed(1)} the floor`);
  recordFigure({ key: "sessionExportPeak", value: coilPeak, floor: coilFloor, note: `${coilRows.rows} rows` });

  let fleetBytes = 0;
  const fleetStarted = performance.now();
  const fleetPeak = await peakOf(async () => {
    const { pages } = await openSessionExport(scope);
    fleetBytes = await drain(csvStream(pages, sessionCsvPage));
  });
  const fleetSeconds = (performance.now() - fleetStarted) / 1000;
  console.log(`  app, whole fleet (GET /api/export/sessions.csv): ${(fleetBytes / MB).toFixed(1)} MB of CSV in ${fleetSeconds.toFixed(1)} s, peak ${fleetPeak.toFixed(1)} MB   ×${(fleetPeak / fleetFloor).toFixed(1)} the floor`);
  if (fleetBytes !== fleetRows.bytes) console.log(`  (the app's file is ${fleetBytes} bytes, the floor's ${fleetRows.bytes}: the floor prints times as SQLite stores them, "…+00:00", the app as ISO "…Z")`);
  recordFigure({ key: "fleetSessionsExportPeak", value: fleetPeak, floor: fleetFloor, note: `${fleetRows.rows} rows, ${(fleetBytes / MB).toFixed(0)} MB of CSV in ${fleetSeconds.toFixed(0)} s` });
}
