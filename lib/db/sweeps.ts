/** Resonance sweeps: reads and writes. */
import { prisma } from "./client";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma } from "./generated/client";

export async function listSweeps(
  filter: { coilTag?: string; sort?: "newest" | "oldest" | "frequency" } = {},
  pageRequest: Partial<PageRequest> = {},
) {
  const request = normalizePage(pageRequest);
  const where: Prisma.SweepWhereInput = filter.coilTag ? { coil: { tag: filter.coilTag } } : {};
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
