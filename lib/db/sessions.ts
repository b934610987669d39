/** Run sessions: reads and writes. */
import { prisma } from "./client";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma } from "./generated/client";

export interface SessionListFilter {
  coilTag?: string;
  q?: string;
  outcome?: "normal" | "stopped" | "anomaly" | "failed";
  sort?: "newest" | "oldest" | "voltage" | "current" | "duration";
}

const ORDER: Record<NonNullable<SessionListFilter["sort"]>, Prisma.RunSessionOrderByWithRelationInput[]> = {
  newest: [{ startedAt: "desc" }, { id: "desc" }],
  oldest: [{ startedAt: "asc" }, { id: "asc" }],
  voltage: [{ supplyVoltageV: "desc" }, { startedAt: "desc" }],
  current: [{ supplyCurrentA: "desc" }, { startedAt: "desc" }],
  duration: [{ durationS: "desc" }, { startedAt: "desc" }],
};

export async function listSessions(filter: SessionListFilter = {}, pageRequest: Partial<PageRequest> = {}) {
  const request = normalizePage(pageRequest);
  const where: Prisma.RunSessionWhereInput = {
    outcome: filter.outcome,
    ...(filter.coilTag ? { coil: { tag: filter.coilTag } } : {}),
    ...(filter.q ? { notes: { contains: filter.q } } : {}),
  };
  const [rows, total] = await Promise.all([
    prisma.runSession.findMany({
      where,
      orderBy: ORDER[filter.sort ?? "newest"],
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { coil: { select: { tag: true, name: true } }, loggedBy: { select: { name: true } }, topLoad: { select: { name: true } } },
    }),
    prisma.runSession.count({ where }),
  ]);
  return toPage(rows, total, request);
}
