/**
 * The audit trail: who created or changed what, and when. Mutations call recordAudit inside the
 * same transaction as the change, so the trail can never disagree with the data. Each event names the site whose
 * record changed; the log is read one site at a time (organisation-wide events, siteId null, are not a site's).
 */
import { prisma, type Tx } from "./client";
import { Prisma } from "./generated/client";
import { textContains } from "./text-search";
import type { SiteScope } from "./site-scope";

export interface AuditEntry {
  /** The site whose record changed; null for organisation-wide events (sign-in, sites, the default policy). */
  siteId: string | null;
  actorId: string | null;
  action: "create" | "update" | "delete" | "sign-in" | "lapse" | "import" | (string & {});
  entity: string;
  entityId: string;
  summary: string;
  detail?: unknown;
}

/** Records the event inside the write's transaction: a Prisma one, or the statement runner of a write that runs its own SQL (session-write.ts). */
export async function recordAudit(tx: Tx | { execute(statement: Prisma.Sql): Promise<number> }, entry: AuditEntry): Promise<void> {
  if ("execute" in tx) {
    // "at" is written here: SQLite's column default (CURRENT_TIMESTAMP) is not the format the client stores dates in.
    await tx.execute(Prisma.sql`
      INSERT INTO "AuditEvent" ("siteId", at, "actorId", action, entity, "entityId", summary, "detailJson")
      VALUES (${entry.siteId}, ${new Date()}, ${entry.actorId}, ${entry.action}, ${entry.entity}, ${entry.entityId}, ${entry.summary}, ${entry.detail === undefined ? null : JSON.stringify(entry.detail)})`);
    return;
  }
  await tx.auditEvent.create({
    data: {
      siteId: entry.siteId,
      actorId: entry.actorId,
      action: entry.action,
      entity: entry.entity,
      entityId: entry.entityId,
      summary: entry.summary,
      detailJson: entry.detail === undefined ? null : JSON.stringify(entry.detail),
    },
  });
}

export interface AuditFilter {
  entity?: string;
  entityId?: string;
  /** The acting user's id; "system" for entries no user made (a lapse detected, an import script). */
  actorId?: string;
  /** Words of the summary, matched case-insensitively on both databases. */
  q?: string;
  /** Inclusive instants. */
  from?: Date;
  to?: Date;
  take?: number;
  skip?: number;
}

/** The scope's site's events, newest first. */
export async function listAuditEvents(scope: SiteScope, options: AuditFilter = {}) {
  const where: Prisma.AuditEventWhereInput = {
    siteId: scope.siteId,
    entity: options.entity,
    entityId: options.entityId,
    ...(options.actorId ? { actorId: options.actorId === "system" ? null : options.actorId } : {}),
    ...(options.q ? { summary: textContains(options.q) } : {}),
    ...(options.from || options.to ? { at: { gte: options.from, lte: options.to } } : {}),
  };
  return prisma.auditEvent.findMany({
    where,
    orderBy: [{ at: "desc" }, { id: "desc" }],
    take: options.take ?? 50,
    skip: options.skip ?? 0,
    include: { actor: { select: { name: true, email: true } } },
  });
}

/** The kinds of record the scope's site's log holds, for the "what" filter. */
export async function listAuditEntities(scope: SiteScope): Promise<string[]> {
  const rows = await prisma.auditEvent.findMany({ where: { siteId: scope.siteId }, distinct: ["entity"], select: { entity: true }, orderBy: { entity: "asc" } });
  return rows.map((r) => r.entity);
}
