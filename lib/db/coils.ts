/** Coils: reads and writes. */
import { prisma } from "./client";
import { readRows } from "./adapter-read";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { serializableTransaction } from "./serializable";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import { Prisma, type Coil, type Component, type TopLoad } from "./generated/client";
import { textContains } from "./text-search";
import { coilOfSite, type SiteScope } from "./site-scope";
import type { CoilInput, CoilUpdateInput } from "../validation/coil";

export interface CoilListFilter {
  q?: string;
  status?: "planned" | "active" | "repair" | "retired";
  sort?: "tag" | "name" | "updated";
}

export async function listCoils(scope: SiteScope, filter: CoilListFilter = {}, pageRequest: Partial<PageRequest> = {}) {
  const request = normalizePage(pageRequest);
  const where: Prisma.CoilWhereInput = {
    ...coilOfSite(scope),
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

/** Id, tag and name of every coil of the site, for pickers and filters. */
export function listCoilChoices(scope: SiteScope) {
  return prisma.coil.findMany({ where: coilOfSite(scope), select: { id: true, tag: true, name: true, status: true }, orderBy: { tag: "asc" } });
}

/**
 * A coil of the scope's site with its top loads, its parts (fitted ones first, then removed ones oldest removal first)
 * and who recorded it; null for no such tag at that site. Read raw: every coil page and form starts here
 * (lib/db/raw-read.ts says why).
 */
export async function getCoilByTag(scope: SiteScope, tag: string): Promise<CoilWithParts | null> {
  const [row] = await readRows<Coil & { createdByName: string | null }>(Prisma.sql`
    SELECT c.*, u.name AS "createdByName" FROM "Coil" c LEFT JOIN "User" u ON u.id = c."createdById"
    WHERE c."siteId" = ${scope.siteId} AND c.tag = ${tag}`);
  if (!row) return null;
  // By the id just read at the scope's site, so these can only be that coil's rows.
  const [topLoads, components] = await Promise.all([
    readRows<TopLoad>(Prisma.sql`SELECT * FROM "TopLoad" WHERE "coilId" = ${row.id} ORDER BY "createdAt", id`),
    // Written out rather than left to the database: SQLite sorts NULL first and PostgreSQL last.
    readRows<Component>(Prisma.sql`
      SELECT * FROM "Component" WHERE "coilId" = ${row.id} ORDER BY ("removedAt" IS NOT NULL), "removedAt", "installedAt" DESC, id`),
  ]);
  const { createdByName, ...coil } = row;
  return { ...coil, createdBy: createdByName === null ? null : { name: createdByName }, topLoads, components };
}

export type CoilWithParts = Coil & { createdBy: { name: string } | null; topLoads: TopLoad[]; components: Component[] };

export class DuplicateTagError extends Error {
  constructor(readonly tag: string) {
    super(`The tag ${tag} is already used by another coil`);
  }
}

/** Adds a coil to the scope's site. Tags are unique within a site: another site may use the same tag. */
export async function createCoil(scope: SiteScope, input: CoilInput) {
  try {
    return await prisma.$transaction(async (tx) => {
      if (await tx.coil.findUnique({ where: { siteId_tag: { siteId: scope.siteId, tag: input.tag } }, select: { id: true } })) throw new DuplicateTagError(input.tag);
      const coil = await tx.coil.create({ data: { ...input, siteId: scope.siteId, createdById: scope.actorId } });
      await markCoilChanged(tx, coil.id);
      await recordAudit(tx, { siteId: scope.siteId, actorId: scope.actorId, action: "create", entity: "Coil", entityId: coil.id, summary: `Added coil ${coil.tag} “${coil.name}”`, detail: input });
      return coil;
    });
  } catch (error) {
    // Two stewards adding the same tag to one site at once both pass the check above; the (siteId, tag) index refuses the second.
    if ((error as { code?: unknown }).code === "P2002") throw new DuplicateTagError(input.tag);
    throw error;
  }
}

/** Throws CoilNotFoundError for no such coil at the scope's site. */
export async function setCoilStatus(scope: SiteScope, coilId: string, status: "planned" | "active" | "repair" | "retired") {
  return prisma.$transaction(async (tx) => {
    const before = await tx.coil.findUnique({ where: { id: coilId, ...coilOfSite(scope) }, select: { status: true, tag: true } });
    if (!before) throw new CoilNotFoundError(coilId);
    // The status is on the edit form too: bumping the version makes a form opened before this change stale.
    const coil = await tx.coil.update({ where: { id: coilId, ...coilOfSite(scope) }, data: { status, version: { increment: 1 } } });
    await markCoilChanged(tx, coilId);
    if (before.status !== status) {
      await recordAudit(tx, { siteId: scope.siteId, actorId: scope.actorId, action: "update", entity: "Coil", entityId: coilId, summary: `${before.tag}: status ${before.status} → ${status}` });
    }
    return coil;
  });
}

export class CoilNotFoundError extends Error {
  constructor(readonly ref: string) {
    super(`No coil ${ref} at this site`);
  }
}

/** Refused save of an edit form opened before someone else changed the coil; says who and when. */
export class CoilEditConflictError extends Error {
  constructor(
    readonly tag: string,
    readonly changedBy: string | null,
    readonly changedAt: Date | null,
  ) {
    const who = changedBy ?? "Someone";
    const when = changedAt ? ` at ${changedAt.toISOString().slice(0, 16).replace("T", " ")} UTC` : "";
    super(`Nothing was saved: ${who} changed ${tag}${when}, after you opened this form. Reload the page to see their change, then make yours again.`);
  }
}

/**
 * Changes a coil's build record (not its tag: printed labels point to the tag). Audited with what changed.
 * Optimistic: input.version is the version the form was opened at, and the write only happens while the coil
 * is still at that version (a conditional update, so it holds under any isolation level). A stale save is
 * refused with who changed the coil last and when, and nothing is overwritten. A coil of another site is not found.
 */
export async function updateCoil(scope: SiteScope, input: CoilUpdateInput) {
  const { coilId, version, ...data } = input;
  return serializableTransaction(async (tx) => {
    const before = await tx.coil.findUnique({ where: { id: coilId, ...coilOfSite(scope) } });
    if (!before) throw new CoilNotFoundError(coilId);
    const next = { ...data, wireGaugeAwg: data.wireGaugeAwg ?? null, measuredDcResistanceOhm: data.measuredDcResistanceOhm ?? null, measuredInductanceH: data.measuredInductanceH ?? null, primaryTurns: data.primaryTurns ?? null, primaryDiameterM: data.primaryDiameterM ?? null };
    const written = await tx.coil.updateMany({ where: { id: coilId, ...coilOfSite(scope), version }, data: { ...next, version: { increment: 1 } } });
    if (written.count === 0) {
      const last = await tx.auditEvent.findFirst({
        where: { entity: "Coil", entityId: coilId, action: "update" },
        orderBy: [{ at: "desc" }, { id: "desc" }],
        select: { at: true, actor: { select: { name: true } } },
      });
      throw new CoilEditConflictError(before.tag, last?.actor?.name ?? null, last?.at ?? null);
    }
    // Compared with the row as it stood at `version` (a concurrent change would have failed the update above).
    const changed = Object.entries(next).filter(([key, value]) => before[key as keyof typeof before] !== value).map(([key]) => key);
    await markCoilChanged(tx, coilId);
    await recordAudit(tx, {
      siteId: scope.siteId,
      actorId: scope.actorId,
      action: "update",
      entity: "Coil",
      entityId: coilId,
      summary: changed.length > 0 ? `${before.tag}: changed ${changed.join(", ")}` : `${before.tag}: saved without changes`,
      detail: Object.fromEntries(changed.map((key) => [key, { from: before[key as keyof typeof before], to: next[key as keyof typeof next] }])),
    });
    return tx.coil.findUniqueOrThrow({ where: { id: coilId } });
  });
}
