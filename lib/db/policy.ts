/**
 * The lending policy's versions. Saving never edits a version: it adds the next one, so every clearance
 * keeps pointing at the rules it was judged by. With no version stored, the default policy becomes
 * version 1 the first time it is needed.
 */
import { prisma } from "./client";
import type { ClearancePolicy } from "./generated/client";
import { recordAudit } from "./audit";
import { serializableTransaction } from "./serializable";
import { DEFAULT_CLEARANCE_POLICY, type ClearancePolicyRules } from "../calc/clearance-policy";
import { clearancePolicyRulesSchema, parseStoredPolicyRules } from "../validation/policy";

export interface PolicyVersion {
  id: string;
  version: number;
  rules: ClearancePolicyRules;
  note: string;
  createdAt: Date;
}

export async function getCurrentPolicy(): Promise<PolicyVersion> {
  // Raw: nearly every page asks (lib/db/raw-read.ts says why).
  const [latest] = await prisma.$queryRaw<ClearancePolicy[]>`SELECT * FROM "ClearancePolicy" ORDER BY version DESC LIMIT 1`;
  if (latest) return { ...latest, rules: parseStoredPolicyRules(latest.rulesJson) };
  const created = await serializableTransaction(async (tx) => {
    // Checked again inside the transaction so two first requests cannot both create version 1.
    const again = await tx.clearancePolicy.findFirst({ orderBy: { version: "desc" } });
    if (again) return again;
    const row = await tx.clearancePolicy.create({
      data: { version: 1, rulesJson: JSON.stringify(DEFAULT_CLEARANCE_POLICY), note: "Default policy, created on first use." },
    });
    await recordAudit(tx, { actorId: null, action: "create", entity: "ClearancePolicy", entityId: row.id, summary: "Lending policy version 1 created from the defaults" });
    return row;
  });
  return { ...created, rules: parseStoredPolicyRules(created.rulesJson) };
}

export async function listPolicyVersions() {
  const rows = await prisma.clearancePolicy.findMany({
    orderBy: { version: "desc" },
    include: { createdBy: { select: { name: true } }, _count: { select: { clearances: true } } },
  });
  return rows.map((row) => ({ ...row, rules: parseStoredPolicyRules(row.rulesJson) }));
}

export async function savePolicyVersion(actorId: string, rules: ClearancePolicyRules, note: string): Promise<PolicyVersion> {
  const checked = clearancePolicyRulesSchema.parse(rules);
  // Serializable: two admins saving at once must get versions n+1 and n+2, not both n+1.
  return serializableTransaction(async (tx) => {
    const latest = await tx.clearancePolicy.findFirst({ orderBy: { version: "desc" }, select: { version: true } });
    const version = (latest?.version ?? 0) + 1;
    const row = await tx.clearancePolicy.create({ data: { version, rulesJson: JSON.stringify(checked), note, createdById: actorId } });
    await recordAudit(tx, { actorId, action: "create", entity: "ClearancePolicy", entityId: row.id, summary: `Lending policy version ${version} saved`, detail: { note } });
    return { ...row, rules: checked };
  });
}
