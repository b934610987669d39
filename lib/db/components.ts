/** Parts fitted to coils: fitting a new one, and replacing one so the old row stays in the history. */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { recordLapseCausedByWrite } from "./clearances";
import { serializableTransaction } from "./serializable";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";
import type { ComponentInput, ReplaceComponentInput } from "../validation/component";

export class ComponentStateError extends Error {}

/** A part of a coil of the scope's site, or null. */
export function getComponent(scope: SiteScope, id: string) {
  return prisma.component.findFirst({ where: { id, ...recordOfSite(scope) }, include: { coil: { select: { id: true, tag: true, name: true } } } });
}

function componentData(input: Omit<ComponentInput, "coilId">) {
  return {
    kind: input.kind,
    partNumber: input.partNumber,
    manufacturer: input.manufacturer,
    description: input.description,
    serial: input.serial,
    switchType: input.switchType ?? null,
    voltageRatingV: input.voltageRatingV ?? null,
    continuousCurrentA: input.continuousCurrentA ?? null,
    peakCurrentA: input.peakCurrentA ?? null,
    powerRating25CW: input.powerRating25CW ?? null,
    maxJunctionTempC: input.maxJunctionTempC ?? null,
    thermalResistanceJcKPerW: input.thermalResistanceJcKPerW ?? null,
    caseToSinkKPerW: input.caseToSinkKPerW ?? null,
    sinkThermalResistanceKPerW: input.sinkThermalResistanceKPerW ?? null,
    sinkMassKg: input.sinkMassKg ?? null,
    resistanceOhm: input.resistanceOhm ?? null,
    capacitanceF: input.capacitanceF ?? null,
    clampVoltageV: input.clampVoltageV ?? null,
    installedAt: input.installedAt,
  };
}

/** Fits a part to a coil of the scope's site; a coil of another site is refused as one that does not exist. */
export async function addComponent(scope: SiteScope, input: ComponentInput) {
  return prisma.$transaction(async (tx) => {
    const coil = await tx.coil.findUnique({ where: { id: input.coilId, ...coilOfSite(scope) }, select: { tag: true } });
    if (!coil) throw new ComponentStateError("That coil no longer exists.");
    const component = await tx.component.create({ data: { coilId: input.coilId, ...componentData(input) } });
    await markCoilChanged(tx, input.coilId);
    await recordLapseCausedByWrite(scope, tx, input.coilId);
    await recordAudit(tx, { siteId: scope.siteId, actorId: scope.actorId, action: "create", entity: "Component", entityId: component.id, summary: `${coil.tag}: fitted ${component.partNumber} (${component.kind})`, detail: input });
    return { component, coilTag: coil.tag };
  });
}

/**
 * Takes a part out and fits its successor in one transaction: the old row gets removedAt, the
 * reason and replacedBy, the new one is installed at the same moment, so no day has two or none.
 * A part of another site's coil is refused as one that is not on the coil.
 */
export async function replaceComponent(scope: SiteScope, input: ReplaceComponentInput) {
  const { oldComponentId, removalReason, ...next } = input;
  return serializableTransaction(async (tx) => {
    const old = await tx.component.findFirst({ where: { id: oldComponentId, ...recordOfSite(scope) }, include: { coil: { select: { tag: true } } } });
    if (!old || old.coilId !== next.coilId) throw new ComponentStateError("That part is not on this coil.");
    if (old.removedAt) throw new ComponentStateError(`${old.partNumber} was already removed on ${old.removedAt.toISOString().slice(0, 10)}.`);
    if (next.installedAt.getTime() < old.installedAt.getTime()) {
      throw new ComponentStateError(`The new part cannot go in before the old one was fitted (${old.installedAt.toISOString().slice(0, 10)}).`);
    }
    const fitted = await tx.component.create({ data: { coilId: next.coilId, ...componentData(next) } });
    // Only while still fitted: two stewards replacing the same part at once must not both fit a successor.
    const removed = await tx.component.updateMany({ where: { id: old.id, removedAt: null }, data: { removedAt: next.installedAt, removalReason, replacedById: fitted.id } });
    if (removed.count === 0) throw new ComponentStateError(`${old.partNumber} was replaced by someone else just now.`);
    await markCoilChanged(tx, old.coilId);
    await recordLapseCausedByWrite(scope, tx, old.coilId);
    await recordAudit(tx, {
      siteId: scope.siteId,
      actorId: scope.actorId,
      action: "update",
      entity: "Component",
      entityId: old.id,
      summary: `${old.coil.tag}: replaced ${old.partNumber} with ${fitted.partNumber} — ${removalReason}`,
      detail: { removed: old.id, fitted: fitted.id, reason: removalReason },
    });
    return { removed: old.id, fitted, coilTag: old.coil.tag };
  });
}
