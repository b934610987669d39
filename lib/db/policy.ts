/**
 * The lending policy's versions: the organisation's default (rows without a site) and each site's own tightening
 * of it (rows of that site). Saving never edits a version: it adds the next one, so every clearance keeps pointing
 * at the rules it was judged by. With no default stored, the shipped defaults become version 1 the first time
 * they are needed.
 *
 * A site lends by its effective policy: the stricter of each threshold of the latest default and the site's latest
 * own version (lib/calc/policy-tightening.ts), so a later change of the default can never leave a site below it.
 * Version numbers count up across the whole server (one sequence for every row), so the effective policy of a site
 * is identified by one number, max(site's latest version, default's latest version):
 *  - it changes whenever either side saves (the new row takes the largest number yet), and only then; a save at
 *    another site leaves it alone, so CoilSummary.policyVersion goes stale exactly for the coils it concerns;
 *  - the pair behind it can always be recovered: the latest default and the latest row of the site at or below it;
 *  - a clearance references the row carrying that number (`EffectivePolicy.id`: the newer of the two rows), so
 *    `clearance.policy.version` is the effective version the coil was judged under; the rule results stored with
 *    the decision hold the thresholds themselves.
 */
import { prisma, type Tx } from "./client";
import { readRows } from "./adapter-read";
import { Prisma, type ClearancePolicy } from "./generated/client";
import { recordAudit } from "./audit";
import { serializableTransaction } from "./serializable";
import type { SiteScope } from "./site-scope";
import { DEFAULT_CLEARANCE_POLICY, type ClearancePolicyRules } from "../calc/clearance-policy";
import { effectivePolicyRules, findLoosenings, type PolicyFieldComparison } from "../calc/policy-tightening";
import { clearancePolicyRulesSchema, parseStoredPolicyRules } from "../validation/policy";

export interface PolicyVersion {
  id: string;
  /** Null: the organisation's default. */
  siteId: string | null;
  version: number;
  rules: ClearancePolicyRules;
  note: string;
  createdAt: Date;
}

/** What a site lends by; `id`, `version`, `note` and `createdAt` are those of the newer of the two rows behind it. */
export interface EffectivePolicy extends PolicyVersion {
  organisationDefault: PolicyVersion;
  /** The site's own latest version, as saved (it may be looser than a default raised since: `rules` never is). */
  siteOwn: PolicyVersion | null;
}

/** A site's save asked less than the organisation's default: every looser field, with its message. */
export class PolicyRefusedError extends Error {
  constructor(
    message: string,
    readonly findings: PolicyFieldComparison[] = [],
  ) {
    super(message);
  }
}

/**
 * Stored rules parsed once per distinct text: a version is never edited, and nearly every page reads the current
 * policy, whose zod parse was a measurable part of a page's work. Frozen, because one parse is shared by every request.
 */
const parsedRules = new Map<string, Readonly<ClearancePolicyRules>>();
const PARSED_RULES_KEPT = 64;

function parseRulesOnce(rulesJson: string): ClearancePolicyRules {
  const known = parsedRules.get(rulesJson);
  if (known) return known;
  const rules = parseStoredPolicyRules(rulesJson);
  for (const item of rules.requiredChecklist) Object.freeze(item);
  Object.freeze(rules.requiredChecklist);
  Object.freeze(rules);
  if (parsedRules.size >= PARSED_RULES_KEPT) parsedRules.clear();
  parsedRules.set(rulesJson, rules);
  return rules;
}

function toVersion(row: ClearancePolicy): PolicyVersion {
  return { id: row.id, siteId: row.siteId, version: row.version, rules: parseRulesOnce(row.rulesJson), note: row.note, createdAt: row.createdAt };
}

/** Combines the default and the site's own version into the effective policy. */
export function combinePolicies(organisationDefault: PolicyVersion, siteOwn: PolicyVersion | null): EffectivePolicy {
  const newer = siteOwn && siteOwn.version > organisationDefault.version ? siteOwn : organisationDefault;
  return { ...newer, rules: effectivePolicyRules(organisationDefault.rules, siteOwn?.rules ?? null), organisationDefault, siteOwn };
}

/** The default's latest version, created from the shipped defaults (version 1) when there is none. */
async function latestDefaultIn(tx: Tx): Promise<ClearancePolicy> {
  const latest = await tx.clearancePolicy.findFirst({ where: { siteId: null, recordOnly: false }, orderBy: { version: "desc" } });
  if (latest) return latest;
  const highest = await tx.clearancePolicy.findFirst({ orderBy: { version: "desc" }, select: { version: true } });
  const version = (highest?.version ?? 0) + 1;
  const row = await tx.clearancePolicy.create({
    data: { siteId: null, version, rulesJson: JSON.stringify(DEFAULT_CLEARANCE_POLICY), note: "Default policy, created on first use." },
  });
  await recordAudit(tx, { siteId: null, actorId: null, action: "create", entity: "ClearancePolicy", entityId: row.id, summary: `Organisation lending policy version ${version} created from the defaults` });
  return row;
}

/** The organisation's default policy (no site's record: every site lends by it or stricter). */
export async function getDefaultPolicy(): Promise<PolicyVersion> {
  const [latest] = await readRows<ClearancePolicy>(Prisma.sql`SELECT * FROM "ClearancePolicy" WHERE "siteId" IS NULL AND "recordOnly" = false ORDER BY version DESC LIMIT 1`);
  if (latest) return toVersion(latest);
  // Serializable and checked again inside, so two first requests cannot both create it.
  return toVersion(await serializableTransaction(latestDefaultIn));
}

/** The policy the scope's site lends by now. */
export async function getCurrentPolicy(scope: SiteScope): Promise<EffectivePolicy> {
  // Raw and one statement: nearly every page asks (lib/db/raw-read.ts says why).
  const rows = await readRows<ClearancePolicy>(Prisma.sql`
    SELECT * FROM (SELECT * FROM "ClearancePolicy" WHERE "siteId" IS NULL AND "recordOnly" = false ORDER BY version DESC LIMIT 1) AS organisation_default
    UNION ALL
    SELECT * FROM (SELECT * FROM "ClearancePolicy" WHERE "siteId" = ${scope.siteId} AND "recordOnly" = false ORDER BY version DESC LIMIT 1) AS site_own`);
  const defaultRow = rows.find((row) => row.siteId === null);
  const siteRow = rows.find((row) => row.siteId === scope.siteId) ?? null;
  const organisationDefault = defaultRow ? toVersion(defaultRow) : await getDefaultPolicy();
  return combinePolicies(organisationDefault, siteRow ? toVersion(siteRow) : null);
}

/**
 * The default's versions and the scope's site's own, newest first. The clearance counts are of the site's coils
 * only: another site's decisions under a default version are not this site's to see.
 */
export async function listPolicyVersions(scope: SiteScope) {
  const rows = await prisma.clearancePolicy.findMany({
    where: { OR: [{ siteId: null }, { siteId: scope.siteId }] },
    orderBy: { version: "desc" },
    include: { createdBy: { select: { name: true } }, _count: { select: { clearances: { where: { coil: { siteId: scope.siteId } } } } } },
  });
  return rows.map((row) => ({ ...row, rules: parseStoredPolicyRules(row.rulesJson) }));
}

/**
 * Saves the organisation's default as its next version (an organisation admin's act: checked here too, since every
 * site lends by it). Sites' own versions are not touched; each site's effective policy stays the stricter of both.
 */
export async function saveDefaultPolicyVersion(scope: SiteScope, rules: ClearancePolicyRules, note: string): Promise<PolicyVersion> {
  const checked = clearancePolicyRulesSchema.parse(rules);
  // Serializable: two saves at once must get versions n+1 and n+2, not both n+1.
  return serializableTransaction(async (tx) => {
    const actor = scope.actorId ? await tx.user.findUnique({ where: { id: scope.actorId }, select: { organisationAdmin: true, active: true } }) : null;
    if (!actor?.organisationAdmin || !actor.active) throw new PolicyRefusedError("Only an organisation admin can change the organisation's lending policy.");
    const version = await nextVersion(tx);
    const row = await tx.clearancePolicy.create({ data: { siteId: null, version, rulesJson: JSON.stringify(checked), note, createdById: scope.actorId } });
    await recordAudit(tx, { siteId: null, actorId: scope.actorId, action: "create", entity: "ClearancePolicy", entityId: row.id, summary: `Organisation lending policy version ${version} saved`, detail: { note } });
    return toVersion(row);
  });
}

/**
 * Saves the scope's site's own rules as the next version. Refused, naming every field, where they are looser than
 * the organisation's default as it stands inside the same transaction (so a default saved meanwhile is the one
 * compared with).
 */
export async function saveSitePolicyVersion(scope: SiteScope, rules: ClearancePolicyRules, note: string): Promise<PolicyVersion> {
  const checked = clearancePolicyRulesSchema.parse(rules);
  return serializableTransaction(async (tx) => {
    const organisationDefault = parseStoredPolicyRules((await latestDefaultIn(tx)).rulesJson);
    const looser = findLoosenings(organisationDefault, checked);
    if (looser.length > 0) {
      throw new PolicyRefusedError(
        `Not saved: a site may only tighten the organisation's policy, and ${looser.length === 1 ? "one field is" : `${looser.length} fields are`} looser.`,
        looser,
      );
    }
    const version = await nextVersion(tx);
    const row = await tx.clearancePolicy.create({ data: { siteId: scope.siteId, version, rulesJson: JSON.stringify(checked), note, createdById: scope.actorId } });
    await recordAudit(tx, { siteId: scope.siteId, actorId: scope.actorId, action: "create", entity: "ClearancePolicy", entityId: row.id, summary: `Site lending policy version ${version} saved`, detail: { note } });
    return toVersion(row);
  });
}

/** One sequence for every row, default and sites alike (the header says why). */
async function nextVersion(tx: Tx): Promise<number> {
  const highest = await tx.clearancePolicy.findFirst({ orderBy: { version: "desc" }, select: { version: true } });
  return (highest?.version ?? 0) + 1;
}
