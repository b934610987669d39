/** Top-load configurations: adding one and retiring it (retired ones stay, since sweeps point to them). */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";
import type { TopLoadInput } from "../validation/top-load";

export class TopLoadStateError extends Error {}

/** Adds a top load to a coil of the scope's site; a coil of another site is refused as one that does not exist. */
export async function addTopLoad(scope: SiteScope, input: TopLoadInput) {
  const { coilId, ...data } = input;
  return prisma.$transaction(async (tx) => {
    const coil = await tx.coil.findUnique({ where: { id: coilId, ...coilOfSite(scope) }, select: { tag: true } });
    if (!coil) throw new TopLoadStateError("That coil no longer exists.");
    const topLoad = await tx.topLoad.create({
      data: {
        coilId,
        name: data.name,
        shape: data.shape,
        diameterM: data.diameterM ?? null,
        tubeDiameterM: data.tubeDiameterM ?? null,
        heightM: data.heightM ?? null,
        measuredCapacitanceF: data.measuredCapacitanceF ?? null,
        notes: data.notes,
      },
    });
    await markCoilChanged(tx, coilId);
    await recordAudit(tx, { siteId: scope.siteId, actorId: scope.actorId, action: "create", entity: "TopLoad", entityId: topLoad.id, summary: `${coil.tag}: added top load “${topLoad.name}”`, detail: input });
    return { topLoad, coilTag: coil.tag };
  });
}

export async function retireTopLoad(scope: SiteScope, topLoadId: string, at = new Date()) {
  return prisma.$transaction(async (tx) => {
    const topLoad = await tx.topLoad.findFirst({ where: { id: topLoadId, ...recordOfSite(scope) }, include: { coil: { select: { tag: true } } } });
    if (!topLoad) throw new TopLoadStateError("That top load no longer exists.");
    if (topLoad.retiredAt) throw new TopLoadStateError(`“${topLoad.name}” is already retired.`);
    const updated = await tx.topLoad.update({ where: { id: topLoadId }, data: { retiredAt: at } });
    await markCoilChanged(tx, topLoad.coilId);
    await recordAudit(tx, { siteId: scope.siteId, actorId: scope.actorId, action: "update", entity: "TopLoad", entityId: topLoadId, summary: `${topLoad.coil.tag}: retired top load “${topLoad.name}”` });
    return { topLoad: updated, coilTag: topLoad.coil.tag };
  });
}
