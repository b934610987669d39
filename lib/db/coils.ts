/** Coils: reads and writes. */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma } from "./generated/client";
import { textContains } from "./text-search";
import type { CoilInput, CoilUpdateInput } from "../validation/coil";

export interface CoilListFilter {
  q?: string;
  status?: "active" | "repair" | "retired";
  sort?: "tag" | "name" | "updated";
}

export async function listCoils(filter: CoilListFilter = {}, pageRequest: Partial<PageRequest> = {}) {
  const request = normalizePage(pageRequest);
  const where: Prisma.CoilWhereInput = {
    status: filter.status,
    ...(filter.q ? { OR: [{ tag: textContains(filter.q) }, { name: textContains(filter.q) }, { builderName: textContains(filter.q) }] } : {}),
  };
  const orderBy: Prisma.CoilOrderByWithRelationInput =
    filter.sort === "name" ? { name: "asc" } : filter.sort === "updated" ? { updatedAt: "desc" } : { tag: "asc" };
  const [rows, total] = await Promise.all([
    prisma.coil.findMany({
      where,
      orderBy,
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { _count: { select: { sessions: true, sweeps: true, failures: true } } },
    }),
    prisma.coil.count({ where }),
  ]);
  return toPage(rows, total, request);
}

/** Id, tag and name of every coil, for pickers and filters. */
export function listCoilChoices() {
  return prisma.coil.findMany({ select: { id: true, tag: true, name: true, status: true }, orderBy: { tag: "asc" } });
}

export function getCoilByTag(tag: string) {
  return prisma.coil.findUnique({
    where: { tag },
    include: {
      topLoads: { orderBy: { createdAt: "asc" } },
      components: { orderBy: [{ removedAt: "asc" }, { installedAt: "desc" }] },
      createdBy: { select: { name: true } },
    },
  });
}

export class DuplicateTagError extends Error {
  constructor(readonly tag: string) {
    super(`The tag ${tag} is already used by another coil`);
  }
}

export async function createCoil(actorId: string, input: CoilInput) {
  return prisma.$transaction(async (tx) => {
    if (await tx.coil.findUnique({ where: { tag: input.tag }, select: { id: true } })) throw new DuplicateTagError(input.tag);
    const coil = await tx.coil.create({ data: { ...input, createdById: actorId } });
    await markCoilChanged(tx, coil.id);
    await recordAudit(tx, { actorId, action: "create", entity: "Coil", entityId: coil.id, summary: `Added coil ${coil.tag} “${coil.name}”`, detail: input });
    return coil;
  });
}

export async function setCoilStatus(actorId: string, coilId: string, status: "active" | "repair" | "retired") {
  return prisma.$transaction(async (tx) => {
    const before = await tx.coil.findUniqueOrThrow({ where: { id: coilId }, select: { status: true, tag: true } });
    const coil = await tx.coil.update({ where: { id: coilId }, data: { status } });
    await markCoilChanged(tx, coilId);
    if (before.status !== status) {
      await recordAudit(tx, { actorId, action: "update", entity: "Coil", entityId: coilId, summary: `${before.tag}: status ${before.status} → ${status}` });
    }
    return coil;
  });
}

export class CoilNotFoundError extends Error {
  constructor(readonly ref: string) {
    super(`No coil ${ref} on this install`);
  }
}

/** Changes a coil's build record (not its tag: printed labels point to the tag). Audited with what changed. */
export async function updateCoil(actorId: string, input: CoilUpdateInput) {
  const { coilId, ...data } = input;
  return prisma.$transaction(async (tx) => {
    const before = await tx.coil.findUnique({ where: { id: coilId } });
    if (!before) throw new CoilNotFoundError(coilId);
    const next = { ...data, wireGaugeAwg: data.wireGaugeAwg ?? null, measuredDcResistanceOhm: data.measuredDcResistanceOhm ?? null, measuredInductanceH: data.measuredInductanceH ?? null, primaryTurns: data.primaryTurns ?? null, primaryDiameterM: data.primaryDiameterM ?? null };
    const changed = Object.entries(next).filter(([key, value]) => before[key as keyof typeof before] !== value).map(([key]) => key);
    const coil = await tx.coil.update({ where: { id: coilId }, data: next });
    await markCoilChanged(tx, coilId);
    await recordAudit(tx, {
      actorId,
      action: "update",
      entity: "Coil",
      entityId: coilId,
      summary: changed.length > 0 ? `${before.tag}: changed ${changed.join(", ")}` : `${before.tag}: saved without changes`,
      detail: Object.fromEntries(changed.map((key) => [key, { from: before[key as keyof typeof before], to: next[key as keyof typeof next] }])),
    });
    return coil;
  });
}
