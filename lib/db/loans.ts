/** Loans: reads and writes. */
import { prisma } from "./client";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma } from "./generated/client";

export async function listLoans(filter: { state?: "out" | "returned" | "all" } = {}, pageRequest: Partial<PageRequest> = {}) {
  const request = normalizePage(pageRequest);
  const where: Prisma.LoanWhereInput =
    filter.state === "out" ? { returnedAt: null } : filter.state === "returned" ? { returnedAt: { not: null } } : {};
  const [rows, total] = await Promise.all([
    prisma.loan.findMany({
      where,
      orderBy: [{ outAt: "desc" }],
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { coil: { select: { tag: true, name: true } }, lentBy: { select: { name: true } } },
    }),
    prisma.loan.count({ where }),
  ]);
  return toPage(rows, total, request);
}
