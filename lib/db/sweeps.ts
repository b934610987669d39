/** Resonance sweeps: reads and writes. */
import { prisma, provider, type Tx } from "./client";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { serializableTransaction } from "./serializable";
import { analyzeSweep, type SweepAnalysis } from "../calc/sweep";
import { CalcInputError } from "../calc/errors";
import { calibrateCoilFromSweeps } from "../analysis/sweep-calibration";
import type { SweepRecordInput } from "../validation/sweep";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma } from "./generated/client";
import { textContains } from "./text-search";
import { formatQuantity } from "../units/format";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";

/** The scope's site's sweeps, a page at a time; the coil filter and the search look only inside that site. */
export async function listSweeps(
  scope: SiteScope,
  filter: { coilTag?: string; q?: string; sort?: "newest" | "oldest" | "frequency" } = {},
  pageRequest: Partial<PageRequest> = {},
) {
  const request = normalizePage(pageRequest);
  const where: Prisma.SweepWhereInput = {
    coil: { ...coilOfSite(scope), ...(filter.coilTag ? { tag: filter.coilTag } : {}) },
    ...(filter.q ? { OR: sweepSearch(filter.q) } : {}),
  };
  const orderBy: Prisma.SweepOrderByWithRelationInput[] =
    filter.sort === "oldest" ? [{ takenAt: "asc" }] : filter.sort === "frequency" ? [{ firstSeriesResonanceHz: "asc" }] : [{ takenAt: "desc" }];
  const [rows, total] = await Promise.all([
    prisma.sweep.findMany({
      where,
      orderBy,
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { coil: { select: { tag: true, name: true } }, topLoad: { select: { name: true } }, takenBy: { select: { name: true } } },
    }),
    prisma.sweep.count({ where }),
  ]);
  return toPage(rows, total, request);
}

/** The sweeps list's search box: the coil's tag or name, the top load, the notes and the bench conditions. */
function sweepSearch(q: string): Prisma.SweepWhereInput[] {
  return [
    { coil: { tag: textContains(q) } },
    { coil: { name: textContains(q) } },
    { topLoad: { name: textContains(q) } },
    { notes: textContains(q) },
    { environmentNotes: textContains(q) },
  ];
}

/** A sweep of the scope's site with everything its page shows, or null. Points come sorted by frequency. */
export function getSweep(scope: SiteScope, id: string) {
  return prisma.sweep.findFirst({
    where: { id, ...recordOfSite(scope) },
    include: {
      coil: true,
      topLoad: true,
      takenBy: { select: { name: true } },
      points: { orderBy: { frequencyHz: "asc" }, select: { frequencyHz: true, amplitudeV: true } },
      resonances: { orderBy: [{ kind: "asc" }, { ordinal: "asc" }] },
    },
  });
}

/** A coil of the scope's site and its top loads, for the sweep forms, or null. */
export function getCoilForSweepEntry(scope: SiteScope, tag: string) {
  return prisma.coil.findUnique({
    where: { siteId_tag: { siteId: scope.siteId, tag } },
    select: { id: true, tag: true, name: true, topLoads: { orderBy: { createdAt: "asc" }, select: { id: true, name: true, shape: true, retiredAt: true } } },
  });
}

const CALIBRATION_TOP_LOAD = { select: { shape: true, diameterM: true, tubeDiameterM: true, heightM: true, measuredCapacitanceF: true } } as const;

/** Every sweep of a coil of the scope's site with what its calibration needs, oldest first (none for another site's coil). */
export function listCalibrationSweeps(scope: SiteScope, coilId: string, db: Pick<Tx, "sweep"> = prisma) {
  return db.sweep.findMany({
    where: { coilId, ...recordOfSite(scope) },
    orderBy: { takenAt: "asc" },
    select: { id: true, takenAt: true, firstSeriesResonanceHz: true, topLoad: CALIBRATION_TOP_LOAD },
  });
}

/** Refusals of a sweep that the form shows against a field ("points.3.amplitude", "topLoadId"…). */
export class SweepRefusedError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
  }
}

export interface RecordedSweep {
  id: string;
  firstSeriesResonanceHz: number | null;
  resonanceCount: number;
  /** Why the coil's calibration was not updated, when it was not. */
  calibrationNote: string | null;
}

/**
 * Points per INSERT. Each INSERT binds one JSON array of [frequency, amplitude] pairs that SQLite unpacks with
 * json_each: Prisma's createMany splits rows to its own parameter limit (~330 rows a statement) and built and
 * bound 100 000 points in ~9 s; one JSON parameter per 20 000 points stores them in well under a second
 * (`npm run bench -- --large`). JSON numbers round-trip doubles exactly (checked on SQLite 3.53, bench run).
 */
const POINTS_PER_INSERT = 20_000;

/** One INSERT of a JSON array of [frequency, amplitude] pairs, unpacked by the database's own JSON functions. */
async function insertPointPairs(tx: Tx, sweepId: string, pairs: string): Promise<void> {
  if (provider === "postgresql") {
    await tx.$executeRaw`INSERT INTO "SweepPoint" ("sweepId", "frequencyHz", "amplitudeV")
      SELECT ${sweepId}, (value ->> 0)::double precision, (value ->> 1)::double precision FROM json_array_elements(${pairs}::json)`;
  } else {
    await tx.$executeRaw`INSERT INTO "SweepPoint" ("sweepId", "frequencyHz", "amplitudeV") SELECT ${sweepId}, value ->> 0, value ->> 1 FROM json_each(${pairs})`;
  }
}

/**
 * Store a sweep: the sweep, all its points, the resonances lib/calc finds, its first series resonance,
 * the coil's environment capacitance recalibrated over all its sweeps, and the audit entry — in one
 * transaction, so a refusal anywhere leaves nothing behind. Serializable, because the calibration reads all the
 * coil's sweeps: two imports of the same coil at once under READ COMMITTED would each miss the other's sweep.
 * The coil must be the scope's site's: another site's coil is refused exactly as a coil that does not exist.
 */
export async function recordSweep(scope: SiteScope, input: SweepRecordInput, how: "hand" | "import" = "hand"): Promise<RecordedSweep> {
  const analysis = analyzeReadings(input);
  const firstSeries = analysis.seriesResonances[0]?.frequency ?? null;
  return serializableTransaction(
    async (tx) => {
      const coil = await tx.coil.findFirst({ where: { id: input.coilId, ...coilOfSite(scope) } });
      if (!coil) throw new SweepRefusedError("coilId", "Coil: that coil does not exist.");
      if (input.topLoadId !== null) {
        const topLoad = await tx.topLoad.findUnique({ where: { id: input.topLoadId }, select: { coilId: true } });
        if (!topLoad || topLoad.coilId !== coil.id) throw new SweepRefusedError("topLoadId", `Top load: choose one of ${coil.tag}'s top loads.`);
      }
      const { points, ...settings } = input;
      const sweep = await tx.sweep.create({
        data: { ...settings, takenById: scope.actorId, pointCount: points.length, firstSeriesResonanceHz: firstSeries },
      });
      for (let start = 0; start < points.length; start += POINTS_PER_INSERT) {
        const pairs = JSON.stringify(points.slice(start, start + POINTS_PER_INSERT).map((p) => [p.frequencyHz, p.amplitudeV]));
        await insertPointPairs(tx, sweep.id, pairs);
      }
      const resonances = [
        ...analysis.seriesResonances.map((r, i) => ({ kind: "series" as const, ordinal: i + 1, r })),
        ...analysis.parallelResonances.map((r, i) => ({ kind: "parallel" as const, ordinal: i + 1, r })),
      ];
      if (resonances.length > 0) {
        await tx.sweepResonance.createMany({
          data: resonances.map(({ kind, ordinal, r }) => ({
            sweepId: sweep.id,
            kind,
            ordinal,
            frequencyHz: r.frequency,
            impedanceOhm: r.impedance,
            q: r.q ?? null,
            frequencyStandardErrorHz: r.frequencyStandardError ?? null,
            qStandardError: r.qStandardError ?? null,
          })),
        });
      }
      const calibrationNote = await recalibrateCoil(tx, scope, coil);
      await markCoilChanged(tx, coil.id);
      await recordAudit(tx, {
        siteId: coil.siteId,
        actorId: scope.actorId,
        action: how === "import" ? "import" : "create",
        entity: "Sweep",
        entityId: sweep.id,
        summary: `${how === "import" ? "Imported" : "Recorded"} a ${points.length}-point sweep of ${coil.tag}${firstSeries === null ? " (no series resonance found)" : `, first series resonance ${formatQuantity(firstSeries, "Hz")}`}`,
        detail: { ...settings, pointCount: points.length, resonances: resonances.length, calibrationNote },
      });
      return { id: sweep.id, firstSeriesResonanceHz: firstSeries, resonanceCount: resonances.length, calibrationNote };
    },
    // A 100 000-point import takes a few seconds to write; the default 5 s would cut it off.
    { timeout: 120_000, maxWait: 20_000 },
  );
}

function analyzeReadings(input: SweepRecordInput): SweepAnalysis {
  try {
    return analyzeSweep({
      seriesResistance: input.seriesResistanceOhm,
      sourceAmplitude: input.sourceAmplitudeV,
      points: input.points.map((p) => ({ frequency: p.frequencyHz, amplitude: p.amplitudeV })),
    });
  } catch (error) {
    if (error instanceof CalcInputError) {
      // lib/calc names a reading "points[3].amplitude"; the forms key it "points.3.amplitude".
      const match = /^points\[(\d+)\]\.(frequency|amplitude)$/.exec(error.field);
      if (match) {
        const row = Number(match[1]) + 1;
        throw new SweepRefusedError(`points.${match[1]}.${match[2]}`, `Reading ${row}, ${match[2]}: expected ${error.expected}, got ${String(error.received)}.`);
      }
      throw new SweepRefusedError("points", `Readings: expected ${error.expected}.`);
    }
    throw error;
  }
}

/** Recalibrate the coil's environment capacitance over all its sweeps; returns why not when it cannot. */
async function recalibrateCoil(
  tx: Tx,
  scope: SiteScope,
  coil: { id: string; formDiameterM: number; windingLengthM: number; turns: number; wireDiameterM: number },
): Promise<string | null> {
  const sweeps = await listCalibrationSweeps(scope, coil.id, tx);
  try {
    const result = calibrateCoilFromSweeps(coil, sweeps);
    if (!result) return "No sweep of this coil shows a series resonance yet, so its environment capacitance is not calibrated.";
    await tx.coil.update({ where: { id: coil.id }, data: { environmentCapacitanceF: result.calibration.environmentCapacitance, environmentCalibratedAt: new Date() } });
    return null;
  } catch (error) {
    // The sweep itself is sound; a build lib/calc cannot model should not lose it.
    if (error instanceof CalcInputError) return `The environment capacitance was not recalibrated: ${error.message}.`;
    throw error;
  }
}
