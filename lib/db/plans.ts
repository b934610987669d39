/**
 * Saving a plan: the coil in "planned" status with its planned top load and parts (switch, heat sink, clamp) and the
 * plan itself (inputs and predicted figures, Coil.planJson), all in one transaction with one audit event.
 */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { DuplicateTagError } from "./coils";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";
import { storedPlanSchema, type PlanSaveInput, type PlanVariant, type StoredPlan } from "../validation/plan";

/** Parts saved from a plan say so, since the coil's status alone is lost once it goes into service. */
export const PLANNED_PART_DESCRIPTION = "Planned in the planner (not yet fitted when saved)";

function describeTopLoad(topLoad: NonNullable<PlanVariant["input"]["topLoad"]>): { name: string; diameterM: number; tubeDiameterM: number | null; heightM: number | null } {
  const mm = (m: number) => `${Math.round(m * 1000)} mm`;
  switch (topLoad.kind) {
    case "toroid":
      return { name: `Planned toroid ${mm(topLoad.outerDiameter)} × ${mm(topLoad.tubeDiameter)}`, diameterM: topLoad.outerDiameter, tubeDiameterM: topLoad.tubeDiameter, heightM: null };
    case "cylinder":
      return { name: `Planned can ${mm(topLoad.diameter)} × ${mm(topLoad.height)}`, diameterM: topLoad.diameter, tubeDiameterM: null, heightM: topLoad.height };
    default:
      return { name: `Planned ${topLoad.kind} ${mm(topLoad.diameter)}`, diameterM: topLoad.diameter, tubeDiameterM: null, heightM: null };
  }
}

/**
 * Creates the planned coil at the scope's site from the chosen variant (its tag unique within the site). `plan` is
 * validated again here, so nothing that the coil page could not read back is ever stored.
 */
export async function savePlannedCoil(scope: SiteScope, save: PlanSaveInput, chosen: PlanVariant, plan: StoredPlan, now: Date = new Date()) {
  const stored = storedPlanSchema.parse(plan);
  const figures = stored.variants[stored.chosenVariant]!.predicted;
  const input = chosen.input;
  try {
    return await prisma.$transaction(async (tx) => {
      if (await tx.coil.findUnique({ where: { siteId_tag: { siteId: scope.siteId, tag: save.tag } }, select: { id: true } })) throw new DuplicateTagError(save.tag);
      const coil = await tx.coil.create({
        data: {
          siteId: scope.siteId,
          tag: save.tag,
          name: save.name,
          builderName: save.builderName,
          status: "planned",
          topology: input.topology,
          formDiameterM: input.formDiameterM,
          windingLengthM: figures.windingLengthM,
          turns: figures.turns,
          wireDiameterM: input.wireDiameterM,
          wireGaugeAwg: chosen.wireGaugeAwg ?? null,
          wireMaterial: input.wireMaterial,
          notes: "Saved from the planner.",
          planJson: JSON.stringify(stored),
          createdById: scope.actorId,
        },
      });
      if (input.topLoad) {
        const topLoad = describeTopLoad(input.topLoad);
        await tx.topLoad.create({ data: { coilId: coil.id, shape: input.topLoad.kind, ...topLoad, notes: PLANNED_PART_DESCRIPTION, createdAt: now } });
      }
      const t = input.transistor;
      await tx.component.create({
        data: {
          coilId: coil.id,
          kind: "switch",
          partNumber: chosen.parts.switchPartNumber || "Planned transistor",
          description: PLANNED_PART_DESCRIPTION,
          switchType: chosen.parts.switchType,
          voltageRatingV: t.voltageRatingV,
          continuousCurrentA: t.continuousCurrentA,
          peakCurrentA: t.peakCurrentA,
          powerRating25CW: t.powerRating25CW,
          maxJunctionTempC: t.maxJunctionTempC,
          thermalResistanceJcKPerW: t.thermalResistanceJcKPerW,
          caseToSinkKPerW: t.caseToSinkKPerW,
          installedAt: now,
        },
      });
      await tx.component.create({
        data: {
          coilId: coil.id,
          kind: "heat_sink",
          partNumber: chosen.parts.sinkPartNumber || "Planned heat sink",
          description: PLANNED_PART_DESCRIPTION,
          sinkThermalResistanceKPerW: input.heatSink.sinkThermalResistanceKPerW,
          sinkMassKg: input.heatSink.sinkMassKg,
          installedAt: now,
        },
      });
      if (input.clampVoltageV !== null) {
        await tx.component.create({
          data: { coilId: coil.id, kind: "clamp", partNumber: `Planned clamp ${input.clampVoltageV} V`, description: PLANNED_PART_DESCRIPTION, clampVoltageV: input.clampVoltageV, installedAt: now },
        });
      }
      await markCoilChanged(tx, coil.id);
      await recordAudit(tx, {
        siteId: scope.siteId,
        actorId: scope.actorId,
        action: "create",
        entity: "Coil",
        entityId: coil.id,
        summary: `Planned coil ${coil.tag} “${coil.name}” saved from the planner`,
        detail: { chosenVariant: stored.chosenVariant, variants: stored.variants.length },
      });
      return coil;
    });
  } catch (error) {
    // Two stewards saving the same tag to one site at once both pass the check above; the (siteId, tag) index refuses the second.
    if ((error as { code?: unknown }).code === "P2002") throw new DuplicateTagError(save.tag);
    throw error;
  }
}

/** Coils and fitted parts members may start a plan from (a build, a transistor or heat sink already in the site's fleet). */
export async function listPlanStartingPoints(scope: SiteScope) {
  const [coils, parts] = await Promise.all([
    prisma.coil.findMany({
      where: coilOfSite(scope),
      orderBy: { tag: "asc" },
      select: { tag: true, name: true, topology: true, formDiameterM: true, windingLengthM: true, turns: true, wireDiameterM: true, wireGaugeAwg: true, wireMaterial: true },
    }),
    prisma.component.findMany({
      where: { kind: { in: ["switch", "heat_sink"] }, ...recordOfSite(scope) },
      orderBy: [{ partNumber: "asc" }, { installedAt: "desc" }],
      select: {
        kind: true,
        partNumber: true,
        switchType: true,
        voltageRatingV: true,
        continuousCurrentA: true,
        peakCurrentA: true,
        powerRating25CW: true,
        maxJunctionTempC: true,
        thermalResistanceJcKPerW: true,
        caseToSinkKPerW: true,
        sinkThermalResistanceKPerW: true,
        sinkMassKg: true,
      },
    }),
  ]);
  // One entry per part number and kind: the newest row's ratings.
  const seen = new Set<string>();
  const distinct = parts.filter((p) => {
    const key = `${p.kind}:${p.partNumber}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
  return { coils, switches: distinct.filter((p) => p.kind === "switch"), heatSinks: distinct.filter((p) => p.kind === "heat_sink") };
}
export type PlanStartingPoints = Awaited<ReturnType<typeof listPlanStartingPoints>>;
