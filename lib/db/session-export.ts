/**
 * The sessions table as CSV rows, read in keyset pages so an export of a whole site never holds more than a page:
 * GET /api/export/sessions.csv (every coil of the site) and GET /api/export/coils/<tag>/sessions.csv (one coil) stream
 * these pages out as they are read (lib/export/csv-stream.ts). The rows and their order are the logbook file's
 * (lib/db/export.ts, lib/export/logbook-csv.ts `sessionsCsv`): coils by tag, each coil's sessions by startedAt then id.
 *
 * Query API, not raw SQL: a page costs one compiled query for a thousand rows, so the compile is noise here. Each page
 * starts after the last (startedAt, id) of the previous one on the (coilId, startedAt, …) index, never with OFFSET,
 * so a page costs the same at the end of a 250 000-row site as at its start. Every query is narrowed by the site.
 */
import { prisma } from "./client";
import type { Prisma } from "./generated/client";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";
import { sessionCsvRow, type SessionCsvRow } from "../export/logbook-csv";

export const SESSION_EXPORT_PAGE_SIZE = 1000;

const sessionSelect = {
  id: true,
  startedAt: true,
  topLoadId: true,
  topLoad: { select: { name: true } },
  supplyVoltageV: true,
  supplyCurrentA: true,
  durationS: true,
  ambientTempC: true,
  heatSinkStartC: true,
  heatSinkEndC: true,
  runningFrequencyHz: true,
  peakSwitchVoltageV: true,
  dutyCycle: true,
  outcome: true,
  loggedBy: { select: { email: true } },
  notes: true,
} as const satisfies Prisma.RunSessionSelect;

type ExportedSession = Prisma.RunSessionGetPayload<{ select: typeof sessionSelect }>;

export interface SessionExport {
  /** How many coils the export covers: 0 when a tag was asked for and the site has no such coil. */
  coilCount: number;
  /** The rows, a page at a time, read only as the consumer asks for the next page. */
  pages: AsyncGenerator<SessionCsvRow[], void, undefined>;
}

/**
 * Opens a sessions export of the scope's site: the coils are read now (so a caller can answer 404 for an unknown
 * tag before it starts a response), the sessions page by page as `pages` is iterated.
 */
export async function openSessionExport(scope: SiteScope, options: { tag?: string; pageSize?: number } = {}): Promise<SessionExport> {
  const coils = await prisma.coil.findMany({
    where: { ...coilOfSite(scope), ...(options.tag === undefined ? {} : { tag: options.tag }) },
    select: { id: true, tag: true },
    orderBy: { tag: "asc" },
  });
  return { coilCount: coils.length, pages: readSessionPages(scope, coils, options.pageSize ?? SESSION_EXPORT_PAGE_SIZE) };
}

async function* readSessionPages(scope: SiteScope, coils: { id: string; tag: string }[], pageSize: number): AsyncGenerator<SessionCsvRow[], void, undefined> {
  for (const coil of coils) {
    let after: { startedAt: Date; id: string } | null = null;
    for (;;) {
      const sessions: ExportedSession[] = await prisma.runSession.findMany({
        where: {
          coilId: coil.id,
          ...recordOfSite(scope),
          ...(after ? { OR: [{ startedAt: { gt: after.startedAt } }, { startedAt: after.startedAt, id: { gt: after.id } }] } : {}),
        },
        select: sessionSelect,
        orderBy: [{ startedAt: "asc" }, { id: "asc" }],
        take: pageSize,
      });
      if (sessions.length > 0) yield sessions.map((s) => toSessionCsvRow(coil.tag, s));
      const last = sessions.at(-1);
      if (!last || sessions.length < pageSize) break;
      after = { startedAt: last.startedAt, id: last.id };
    }
  }
}

/** The same cells `sessionsCsv` writes from a logbook file. */
function toSessionCsvRow(tag: string, s: ExportedSession): SessionCsvRow {
  return sessionCsvRow(tag, s, { startedAt: s.startedAt.toISOString(), topLoadName: s.topLoad?.name, loggedBy: s.loggedBy?.email ?? null });
}
