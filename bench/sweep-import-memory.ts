/**
 * `npm run bench -- --large`: importing a 100 000-row sweep CSV — the browser's part (lib/import/sweep-csv.ts
 * reading the file into points) and the server's (the JSON body, its schema, lib/db/sweeps.ts recordSweep into
 * the large-fleet database) — with time and memory at each step. The sweep is deleted afterwards so the fixture
 * keeps its row counts. Memory is heap + array buffers after a forced collection, so it counts what each step
 * still holds, and the peak during a step (sampled between awaits) is shown beside it.
 */
import { benchScope } from "./bench-scope";
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";
import Database from "better-sqlite3";
import { LARGE_DB_PATH, LARGE_FLEET_USER_ID, largeFleetCoilId } from "./large-fleet";

setFlagsFromString("--expose-gc");
const collect = runInNewContext("gc") as () => void;

const ROWS = 100_000;
const mb = (bytes: number) => `${(bytes / 1_048_576).toFixed(1)} MB`;
const used = () => {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
};

function makeCsv(): string {
  const lines = ["Frequency (kHz),Amplitude (mV)"];
  for (let i = 0; i < ROWS; i++) {
    const f = 100 + (i * 900) / ROWS; // 100 kHz … 1 MHz
    const detune = (f - 400) / 10;
    lines.push(`${f.toFixed(5)},${(8000 / Math.sqrt(1 + detune * detune) + 1).toFixed(3)}`);
  }
  return lines.join("\n");
}

export async function benchSweepImport(): Promise<void> {
  const { detectSweepCsvLayout, readSweepCsv } = await import("../lib/import/sweep-csv");
  const { sweepImportSchema, recordInputFromImport } = await import("../lib/validation/sweep");
  const { recordSweep } = await import("../lib/db/sweeps");
  const user = { id: LARGE_FLEET_USER_ID };
  const coil = { id: largeFleetCoilId(0) };

  collect();
  const start = used();
  const steps: string[] = [];
  let last = performance.now();
  const step = (name: string) => {
    const now = performance.now();
    const peak = used();
    collect();
    steps.push(`    ${name.padEnd(44)} ${(now - last).toFixed(0).padStart(6)} ms   held ${mb(used() - start).padStart(9)}   peak ${mb(peak - start).padStart(9)}`);
    last = performance.now();
  };

  let text: string | null = makeCsv();
  const fileBytes = Buffer.byteLength(text);
  step(`the file as text (${mb(fileBytes)})`);
  const layout = detectSweepCsvLayout(text.slice(0, 8192));
  const read = readSweepCsv(text, layout, layout.suggested);
  if (!read.ok) throw new Error(read.error.message);
  step("lib/import/sweep-csv: rows → SI points");
  text = null;
  let points: typeof read.points | null = read.points;
  let body: string | null = JSON.stringify({
    coilId: coil.id,
    takenAt: new Date().toISOString().slice(0, 16),
    seriesResistanceOhm: "10k",
    sourceAmplitudeV: "10 V",
    amplitudeConvention: "peak_to_peak",
    frequenciesHz: points.map((p) => p.frequencyHz),
    amplitudesV: points.map((p) => p.amplitudeV),
  });
  points = null;
  step(`browser: points → JSON body (${mb(Buffer.byteLength(body))}), file dropped`);
  const parsed = sweepImportSchema.safeParse(JSON.parse(body));
  if (!parsed.success) throw new Error(parsed.error.message);
  body = null;
  step("route: JSON.parse + sweepImportSchema");
  const recorded = await recordSweep(benchScope(user.id), recordInputFromImport(parsed.data), "import");
  step("lib/db/sweeps recordSweep (analysis + insert)");

  const db = new Database(LARGE_DB_PATH);
  db.pragma("foreign_keys = ON");
  db.prepare(`DELETE FROM Sweep WHERE id = ?`).run(recorded.id); // points and resonances cascade
  db.close();
  console.log(`\nImporting a ${ROWS.toLocaleString("en")}-row sweep CSV (${mb(fileBytes)}) into the large fleet: memory relative to before the file was read`);
  for (const line of steps) console.log(line);
}
