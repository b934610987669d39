/** Failures and post-mortems: reads and writes. */
import { prisma } from "./client";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma } from "./generated/client";
import type { FailureMode } from "./generated/enums";

export async function listFailures(
  filter: { q?: string; status?: "open" | "closed"; mode?: FailureMode } = {},
  pageRequest: Partial<PageRequest> = {},
) {
  const request = normalizePage(pageRequest);
  const where: Prisma.FailureWhereInput = {
    status: filter.status,
    mode: filter.mode,
    ...(filter.q ? { OR: [{ symptoms: { contains: filter.q } }, { rootCause: { contains: filter.q } }, { coil: { tag: { contains: filter.q } } }] } : {}),
  };
  const [rows, total] = await Promise.all([
    prisma.failure.findMany({
      where,
      orderBy: [{ occurredAt: "desc" }],
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { coil: { select: { tag: true, name: true } }, component: { select: { partNumber: true, kind: true } } },
    }),
    prisma.failure.count({ where }),
  ]);
  return toPage(rows, total, request);
}
