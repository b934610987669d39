/**
 * Reads coils with everything that hangs off them and writes them as the logbook file
 * (lib/validation/export.ts). Orders are fixed (by time, then a stable key) so two exports of the
 * same records are identical. Only the scope's site's coils are read; the file does not name a site, so an import
 * puts the coils in the importing site (lib/db/import.ts).
 */
import { prisma } from "./client";
import type { Prisma } from "./generated/client";
import { coilOfSite, type SiteScope } from "./site-scope";
import { LOGBOOK_FORMAT, LOGBOOK_VERSION, type CoilDocument, type LogbookDocument } from "../validation/export";

const email = { select: { email: true } } as const;

const coilInclude = {
  createdBy: email,
  topLoads: { orderBy: [{ createdAt: "asc" }, { id: "asc" }] },
  components: { orderBy: [{ installedAt: "asc" }, { id: "asc" }] },
  sweeps: {
    orderBy: [{ takenAt: "asc" }, { id: "asc" }],
    include: { takenBy: email, points: { orderBy: [{ frequencyHz: "asc" }, { id: "asc" }] }, resonances: { orderBy: [{ kind: "asc" }, { ordinal: "asc" }, { id: "asc" }] } },
  },
  sessions: { orderBy: [{ startedAt: "asc" }, { id: "asc" }], include: { loggedBy: email, samples: { orderBy: [{ elapsedS: "asc" }, { id: "asc" }] } } },
  failures: { orderBy: [{ occurredAt: "asc" }, { id: "asc" }], include: { reportedBy: email, closedBy: email } },
  clearances: { orderBy: [{ decidedAt: "asc" }, { id: "asc" }], include: { decidedBy: email, policy: { select: { version: true, rulesJson: true } } } },
  loans: { orderBy: [{ outAt: "asc" }, { id: "asc" }], include: { lentBy: email, receivedBy: email } },
} satisfies Prisma.CoilInclude;

type CoilWithEverything = Prisma.CoilGetPayload<{ include: typeof coilInclude }>;

const iso = (d: Date) => d.toISOString();
const isoOrNull = (d: Date | null) => (d ? d.toISOString() : null);

function toCoilDocument(coil: CoilWithEverything): CoilDocument {
  return {
    id: coil.id,
    tag: coil.tag,
    name: coil.name,
    builderName: coil.builderName,
    status: coil.status,
    topology: coil.topology,
    formDiameterM: coil.formDiameterM,
    windingLengthM: coil.windingLengthM,
    turns: coil.turns,
    wireDiameterM: coil.wireDiameterM,
    wireGaugeAwg: coil.wireGaugeAwg,
    wireMaterial: coil.wireMaterial,
    measuredDcResistanceOhm: coil.measuredDcResistanceOhm,
    measuredInductanceH: coil.measuredInductanceH,
    primaryTurns: coil.primaryTurns,
    primaryDiameterM: coil.primaryDiameterM,
    environmentCapacitanceF: coil.environmentCapacitanceF,
    environmentCalibratedAt: isoOrNull(coil.environmentCalibratedAt),
    planJson: coil.planJson,
    notes: coil.notes,
    createdAt: iso(coil.createdAt),
    createdBy: coil.createdBy?.email ?? null,
    topLoads: coil.topLoads.map(({ coilId: _c, createdAt, retiredAt, ...t }) => ({ ...t, createdAt: iso(createdAt), retiredAt: isoOrNull(retiredAt) })),
    components: coil.components.map(({ coilId: _c, installedAt, removedAt, ...c }) => ({ ...c, installedAt: iso(installedAt), removedAt: isoOrNull(removedAt) })),
    sweeps: coil.sweeps.map(({ coilId: _c, takenById: _t, takenBy, takenAt, createdAt, points, resonances, ...s }) => ({
      ...s,
      takenAt: iso(takenAt),
      takenBy: takenBy?.email ?? null,
      createdAt: iso(createdAt),
      points: points.map((p) => ({ frequencyHz: p.frequencyHz, amplitudeV: p.amplitudeV })),
      resonances: resonances.map(({ sweepId: _s, ...r }) => r),
    })),
    // The stored warm-up fit is derived from the samples and refitted on import, so it is not part of the format.
    sessions: coil.sessions.map(({ coilId: _c, loggedById: _l, loggedBy, startedAt, createdAt, samples, sinkFitSampleCount: _n, sinkSteadyStateC: _ss, sinkSteadyStateSeK: _se, sinkTimeConstantS: _tau, sinkFitExtrapolation: _x, sinkFitJson: _j, ...s }) => ({
      ...s,
      startedAt: iso(startedAt),
      loggedBy: loggedBy?.email ?? null,
      createdAt: iso(createdAt),
      samples: samples.map((p) => ({ elapsedS: p.elapsedS, temperatureC: p.temperatureC })),
    })),
    failures: coil.failures.map(({ coilId: _c, reportedById: _r, closedById: _d, reportedBy, closedBy, occurredAt, closedAt, createdAt, ...f }) => ({
      ...f,
      occurredAt: iso(occurredAt),
      closedAt: isoOrNull(closedAt),
      createdAt: iso(createdAt),
      reportedBy: reportedBy?.email ?? null,
      closedBy: closedBy?.email ?? null,
    })),
    clearances: coil.clearances.map(({ coilId: _c, policyId: _p, decidedById: _d, decidedBy, policy, decidedAt, validUntil, lapsedAt, createdAt, ...c }) => ({
      ...c,
      policyVersion: policy.version,
      policyRulesJson: policy.rulesJson,
      decidedBy: decidedBy?.email ?? null,
      decidedAt: iso(decidedAt),
      validUntil: iso(validUntil),
      lapsedAt: isoOrNull(lapsedAt),
      createdAt: iso(createdAt),
    })),
    // The borrowing site is this server's own reference and means nothing in another install or site.
    loans: coil.loans.map(({ coilId: _c, lentById: _l, receivedById: _r, borrowerSiteId: _b, lentBy, receivedBy, outAt, expectedBackAt, returnedAt, createdAt, ...l }) => ({
      ...l,
      outAt: iso(outAt),
      expectedBackAt: iso(expectedBackAt),
      returnedAt: isoOrNull(returnedAt),
      createdAt: iso(createdAt),
      lentBy: lentBy?.email ?? null,
      receivedBy: receivedBy?.email ?? null,
    })),
  };
}

function wrap(coils: CoilDocument[], now: Date): LogbookDocument {
  return { format: LOGBOOK_FORMAT, version: LOGBOOK_VERSION, exportedAt: now.toISOString(), coils };
}

/** One coil's logbook file, or null when the scope's site has no coil with that tag. */
export async function exportCoil(scope: SiteScope, tag: string, now = new Date()): Promise<LogbookDocument | null> {
  const coil = await prisma.coil.findUnique({ where: { siteId_tag: { siteId: scope.siteId, tag } }, include: coilInclude });
  return coil ? wrap([toCoilDocument(coil)], now) : null;
}

/** Every coil of the scope's site, its logbook in one file. */
export async function exportFleet(scope: SiteScope, now = new Date()): Promise<LogbookDocument> {
  const coils = await prisma.coil.findMany({ where: coilOfSite(scope), orderBy: { tag: "asc" }, include: coilInclude });
  return wrap(coils.map(toCoilDocument), now);
}
