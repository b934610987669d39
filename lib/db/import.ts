/**
 * Rebuilds coils from a logbook file (lib/validation/export.ts) in one transaction: every record,
 * with its links, or nothing. The coils go into the importing scope's site, whichever site they were
 * exported from (the file names none).
 *
 * Tags: a coil whose tag is already used at the importing site is refused (ImportConflictError), unless a
 * one-coil file is imported under a new tag, which makes a copy; other sites' tags do not matter. Ids: the
 * file's ids are kept, so a coil exported, removed and imported again is the same coil; for a copy, or when
 * the ids are already taken (here or at another site: ids are the server's), every id is re-keyed with one
 * prefix shared by the whole import (order and links are kept).
 * People are matched by e-mail among the importing site's members (and the organisation admins, who act at
 * every site); anyone else is left blank and reported, so an import says nothing about other sites' people.
 * Clearances keep their policy version where that version is the organisation's or the site's own; a version
 * the server holds for another site (or none) is recreated here under the next free version number, marked record-only
 * so an import never changes the site's current lending policy.
 */
import { randomBytes } from "node:crypto";
import { prisma, type Tx } from "./client";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import type { SiteScope } from "./site-scope";
import type { ParsedCoilDocument, ParsedLogbook } from "../validation/export";
import { fitSessionSamples } from "../analysis/session-fit";

export class ImportConflictError extends Error {}

export interface ImportSummary {
  coils: { tag: string; rekeyed: boolean; records: number }[];
  unknownPeople: string[];
}

function collectPeople(coil: ParsedCoilDocument): string[] {
  return [
    coil.createdBy,
    ...coil.sweeps.map((s) => s.takenBy),
    ...coil.sessions.map((s) => s.loggedBy),
    ...coil.failures.flatMap((f) => [f.reportedBy, f.closedBy]),
    ...coil.clearances.map((c) => c.decidedBy),
    ...coil.loans.flatMap((l) => [l.lentBy, l.receivedBy]),
  ].filter((e): e is string => e !== null);
}

/**
 * The policy a clearance of the file links to: the version itself when the organisation or the importing site holds
 * it, else a copy of the file's rules made the site's own (under that version when free, else the next free one).
 */
async function policyIdFor(tx: Tx, scope: SiteScope, version: number, rulesJson: string, cache: Map<number, string>): Promise<string> {
  const known = cache.get(version);
  if (known) return known;
  const existing = await tx.clearancePolicy.findUnique({ where: { version }, select: { id: true, siteId: true } });
  let id: string;
  if (existing && (existing.siteId === null || existing.siteId === scope.siteId)) id = existing.id;
  else {
    const free = existing ? ((await tx.clearancePolicy.aggregate({ _max: { version: true } }))._max.version ?? 0) + 1 : version;
    const note = free === version ? "Recreated from an imported logbook file." : `Recreated from an imported logbook file (version ${version} there).`;
    id = (await tx.clearancePolicy.create({ data: { siteId: scope.siteId, version: free, rulesJson, note, recordOnly: true } })).id;
  }
  cache.set(version, id);
  return id;
}

async function importCoil(tx: Tx, scope: SiteScope, doc: ParsedCoilDocument, options: { asTag?: string; people: Map<string, string>; policies: Map<number, string> }) {
  const tag = options.asTag ?? doc.tag;
  if (await tx.coil.findUnique({ where: { siteId_tag: { siteId: scope.siteId, tag } }, select: { id: true } })) {
    throw new ImportConflictError(
      options.asTag ? `The tag ${tag} is already used; choose another.` : `A coil tagged ${tag} already exists. Import it under a new tag to make a copy, or remove the existing coil first.`,
    );
  }
  const rekey = options.asTag !== undefined || (await tx.coil.findUnique({ where: { id: doc.id }, select: { id: true } })) !== null;
  const prefix = rekey ? `i${randomBytes(4).toString("hex")}-` : "";
  const key = (old: string) => prefix + old;
  const keyOrNull = (old: string | null) => (old === null ? null : key(old));
  const who = (email: string | null) => (email === null ? null : (options.people.get(email) ?? null));

  const { topLoads, components, sweeps, sessions, failures, clearances, loans, createdBy, ...coilFields } = doc;
  await tx.coil.create({ data: { ...coilFields, id: key(doc.id), siteId: scope.siteId, tag, createdById: who(createdBy) } });
  const coilId = key(doc.id);
  await tx.topLoad.createMany({ data: topLoads.map((t) => ({ ...t, id: key(t.id), coilId })) });
  await tx.component.createMany({ data: components.map(({ replacedById: _r, ...c }) => ({ ...c, id: key(c.id), coilId })) });
  // replacedById is unique and points forward, so it is linked once every part exists.
  for (const c of components) if (c.replacedById) await tx.component.update({ where: { id: key(c.id) }, data: { replacedById: key(c.replacedById) } });

  const clearanceRows = [];
  for (const { policyVersion, policyRulesJson, decidedBy, ...c } of clearances) {
    clearanceRows.push({ ...c, id: key(c.id), coilId, policyId: await policyIdFor(tx, scope, policyVersion, policyRulesJson, options.policies), decidedById: who(decidedBy) });
  }
  await tx.clearance.createMany({ data: clearanceRows });
  await tx.loan.createMany({ data: loans.map(({ lentBy, receivedBy, ...l }) => ({ ...l, id: key(l.id), coilId, clearanceId: key(l.clearanceId), lentById: who(lentBy), receivedById: who(receivedBy) })) });

  await tx.runSession.createMany({
    data: sessions.map(({ samples: sessionSamples, loggedBy, ...s }) => ({
      ...s,
      id: key(s.id),
      coilId,
      topLoadId: keyOrNull(s.topLoadId),
      loanId: keyOrNull(s.loanId),
      loggedById: who(loggedBy),
      ...fitSessionSamples(sessionSamples), // stored with the samples, as every session's is (lib/analysis/session-fit.ts)
    })),
  });
  const samples = sessions.flatMap((s) => s.samples.map((p) => ({ ...p, sessionId: key(s.id) })));
  if (samples.length > 0) await tx.heatSinkSample.createMany({ data: samples });

  await tx.sweep.createMany({ data: sweeps.map(({ points: _p, resonances: _r, takenBy, ...s }) => ({ ...s, id: key(s.id), coilId, topLoadId: keyOrNull(s.topLoadId), takenById: who(takenBy) })) });
  const points = sweeps.flatMap((s) => s.points.map((p) => ({ ...p, sweepId: key(s.id) })));
  if (points.length > 0) await tx.sweepPoint.createMany({ data: points });
  const resonances = sweeps.flatMap((s) => s.resonances.map((r) => ({ ...r, id: key(r.id), sweepId: key(s.id) })));
  if (resonances.length > 0) await tx.sweepResonance.createMany({ data: resonances });

  await tx.failure.createMany({
    data: failures.map(({ reportedBy, closedBy, ...f }) => ({
      ...f,
      id: key(f.id),
      coilId,
      sessionId: keyOrNull(f.sessionId),
      componentId: keyOrNull(f.componentId),
      replacementComponentId: keyOrNull(f.replacementComponentId),
      reportedById: who(reportedBy),
      closedById: who(closedBy),
    })),
  });

  await markCoilChanged(tx, coilId);

  const records = 1 + topLoads.length + components.length + clearances.length + loans.length + sessions.length + samples.length + sweeps.length + points.length + resonances.length + failures.length;
  await recordAudit(tx, {
    siteId: scope.siteId,
    actorId: scope.actorId,
    action: "import",
    entity: "Coil",
    entityId: coilId,
    summary: `Imported coil ${tag}${tag !== doc.tag ? ` (a copy of ${doc.tag})` : ""}: ${records} records`,
    detail: { sourceTag: doc.tag, rekeyed: rekey, records },
  });
  return { tag, rekeyed: rekey, records };
}

export async function importLogbook(scope: SiteScope, logbook: ParsedLogbook, options: { asTag?: string } = {}): Promise<ImportSummary> {
  if (options.asTag !== undefined && logbook.coils.length !== 1) {
    throw new ImportConflictError("A new tag can only be given when the file holds one coil.");
  }
  const emails = [...new Set(logbook.coils.flatMap(collectPeople))];
  return prisma.$transaction(
    async (tx) => {
      const users = await tx.user.findMany({
        where: { email: { in: emails }, OR: [{ memberships: { some: { siteId: scope.siteId } } }, { organisationAdmin: true }] },
        select: { id: true, email: true },
      });
      const people = new Map(users.map((u) => [u.email, u.id]));
      const policies = new Map<number, string>();
      const coils = [];
      for (const coil of logbook.coils) coils.push(await importCoil(tx, scope, coil, { asTag: options.asTag, people, policies }));
      return { coils, unknownPeople: emails.filter((e) => !people.has(e)) };
    },
    { timeout: 60_000 },
  );
}
