/**
 * The one table `npm run bench` ends with: every figure issue 13 ("fast paths") names, next to its floor, the ratio and
 * the goal, in a fixed order. Each benchmark section records what it measured; a figure whose section did not run says
 * which flag runs it.
 */

export interface Figure {
  /** Key of a row in ROWS. */
  key: RowKey;
  value: number;
  floor: number;
  /** Ratio as measured (a median of per-round ratios), which may differ from value / floor. */
  ratio?: number;
  /** Anything the reader needs beside the numbers (5xx count, writes found, rows). */
  note?: string;
}

interface Row {
  figure: string;
  unit: string;
  floor: string;
  /** Goal on the ratio (at most), when issue 13 sets one. */
  goal: number | null;
  /** The `npm run bench -- <flag>` that measures it. */
  flag: string;
}

const ROWS = {
  postSessionsCpu: {
    figure: "POST /api/sessions, server CPU per request (8 in flight)",
    unit: "ms",
    floor: "trivial route (GET /api/bench-floor), same load",
    goal: 3,
    flag: "--load",
  },
  postSessionsLatency: {
    figure: "POST /api/sessions, p50 latency (8 in flight)",
    unit: "ms",
    floor: "trivial route p50, same load",
    goal: null,
    flag: "--load",
  },
  sessionWrite: {
    figure: "session write: lib/db createSession (one transaction)",
    unit: "ms",
    floor: "raw better-sqlite3, the same statements",
    goal: 4,
    flag: "--write",
  },
  emptyPageCpu: {
    figure: "empty signed-in page, server CPU per request (8 in flight)",
    unit: "ms",
    floor: "trivial route, same load",
    goal: null,
    flag: "--load",
  },
  plainPageCpu: {
    figure: "signed-in page of the dashboard's element count, plain spans (8 in flight)",
    unit: "ms",
    floor: "trivial route, same load",
    goal: null,
    flag: "--load",
  },
  dashboardCpu: {
    figure: "dashboard page, server CPU per request (8 in flight, demo club)",
    unit: "ms",
    floor: "trivial route, same load",
    goal: 4,
    flag: "--load",
  },
  coilPageCpu: {
    figure: "coil page, server CPU per request (8 in flight, demo club)",
    unit: "ms",
    floor: "trivial route, same load",
    goal: 4,
    flag: "--load",
  },
  dashboardCold: {
    figure: "dashboard cold (no summaries), 500 coils",
    unit: "ms",
    floor: "raw better-sqlite3 reads of the same figures",
    goal: 2,
    flag: "--large",
  },
  dashboardWarm: {
    figure: "dashboard warm (summaries current), 500 coils",
    unit: "ms",
    floor: "raw better-sqlite3 reads of the same figures",
    goal: null,
    flag: "--large",
  },
  coilPageLarge: {
    figure: "coil page server work, 500-session coil",
    unit: "ms",
    floor: "raw reads + the page's lib/ arithmetic",
    goal: null,
    flag: "--large",
  },
  sessionExportPeak: {
    figure: "sessions-table CSV export of a 500-session coil, peak memory",
    unit: "MB",
    floor: "raw better-sqlite3 rows streamed to CSV",
    goal: null,
    flag: "--large",
  },
  fleetSessionsExportPeak: {
    figure: "sessions CSV of the whole large fleet (250 000 rows), peak memory",
    unit: "MB",
    floor: "raw better-sqlite3 rows streamed to CSV",
    goal: null,
    flag: "--large",
  },
  fleetCsvRead: {
    figure: "GET /api/export/fleet.csv at 500 coils, server work",
    unit: "ms",
    floor: "raw aggregate SQL of the same counts",
    goal: null,
    flag: "--large",
  },
  signInChecks: {
    figure: "sign-in checks per page request (dashboard, coil page)",
    unit: "count",
    floor: "1 check",
    goal: 1,
    flag: "--load",
  },
} satisfies Record<string, Row>;

export type RowKey = keyof typeof ROWS;

const measured = new Map<RowKey, Figure>();

export function recordFigure(figure: Figure): void {
  measured.set(figure.key, figure);
}

const CHILD_PREFIX = "BENCH_FIGURE ";

/** Records a figure; in a section run as a child process (runSectionInChild), hands it to the parent on stdout. */
export function emitFigure(figure: Figure): void {
  if (process.env.BENCH_CHILD === "1") console.log(CHILD_PREFIX + JSON.stringify(figure));
  else recordFigure(figure);
}

/**
 * Runs a benchmark file in its own process (for sections that open lib/db's client on their own database: the client
 * is made once per process) with the same arguments, echoing its output and recording the figures it emits.
 */
export async function runSectionInChild(file: string): Promise<void> {
  const { spawn } = await import("node:child_process");
  const child = spawn(process.execPath, ["--import", "tsx", file, ...process.argv.slice(2)], { env: { ...process.env, BENCH_CHILD: "1" }, stdio: ["ignore", "pipe", "inherit"] });
  let pending = "";
  child.stdout.setEncoding("utf8");
  child.stdout.on("data", (chunk: string) => {
    pending += chunk;
    const lines = pending.split("\n");
    pending = lines.pop()!;
    for (const line of lines) {
      if (line.startsWith(CHILD_PREFIX)) recordFigure(JSON.parse(line.slice(CHILD_PREFIX.length)) as Figure);
      else console.log(line);
    }
  });
  const code = await new Promise<number | null>((resolve) => child.on("close", resolve));
  if (pending) console.log(pending);
  if (code !== 0) {
    console.error(`${file} exited with ${code}`);
    process.exitCode = 1;
  }
}

const fmt = (x: number, unit: string) => (unit === "count" ? String(x) : x >= 100 ? x.toFixed(0) : x >= 10 ? x.toFixed(1) : x.toFixed(2));

/** The table, one row per figure, measured or not. */
export function printFigureTable(): void {
  const lines: string[][] = [["figure", "value", "floor", "ratio", "goal", "", "floor measured against"]];
  for (const [key, row] of Object.entries(ROWS) as [RowKey, Row][]) {
    const figure = measured.get(key);
    const goal = row.goal === null ? "—" : `≤ ${row.goal}×`;
    if (figure) {
      const ratio = figure.ratio ?? figure.value / figure.floor;
      const verdict = row.goal === null ? "" : ratio <= row.goal ? "met" : "NOT MET";
      lines.push([row.figure, `${fmt(figure.value, row.unit)} ${row.unit}`, `${fmt(figure.floor, row.unit)} ${row.unit}`, `×${ratio.toFixed(1)}`, goal, verdict, row.floor + (figure.note ? `; ${figure.note}` : "")]);
    } else {
      lines.push([row.figure, "not run", "—", "—", goal, "", `${row.floor}; run with ${row.flag}`]);
    }
  }
  const widths = lines[0]!.map((_, column) => (column === lines[0]!.length - 1 ? 0 : Math.max(...lines.map((line) => line[column]!.length))));
  console.log("\nIssue 13 figures (value, its floor, ratio = value / floor measured in alternation, goal):");
  for (const line of lines) console.log("  " + line.map((cell, column) => (column >= 1 && column <= 3 ? cell.padStart(widths[column]!) : cell.padEnd(widths[column]!))).join("  ").trimEnd());
}
