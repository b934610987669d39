/**
 * The audit trail: who created or changed what, and when. Mutations call recordAudit inside the
 * same transaction as the change, so the trail can never disagree with the data.
 */
import { prisma, type Tx } from "./client";

export interface AuditEntry {
  actorId: string | null;
  action: "create" | "update" | "delete" | "sign-in" | "lapse" | "import" | (string & {});
  entity: string;
  entityId: string;
  summary: string;
  detail?: unknown;
}

export async function recordAudit(tx: Tx, entry: AuditEntry): Promise<void> {
  await tx.auditEvent.create({
    data: {
      actorId: entry.actorId,
      action: entry.action,
      entity: entry.entity,
      entityId: entry.entityId,
      summary: entry.summary,
      detailJson: entry.detail === undefined ? null : JSON.stringify(entry.detail),
    },
  });
}

export async function listAuditEvents(options: { entity?: string; entityId?: string; take?: number; skip?: number } = {}) {
  return prisma.auditEvent.findMany({
    where: { entity: options.entity, entityId: options.entityId },
    orderBy: [{ at: "desc" }, { id: "desc" }],
    take: options.take ?? 50,
    skip: options.skip ?? 0,
    include: { actor: { select: { name: true, email: true } } },
  });
}
