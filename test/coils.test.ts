import { beforeEach, describe, expect, it } from "vitest";
import { makeUser, resetDatabase, testDb } from "./support/db";
import { createCoil, updateCoil } from "@/lib/db/coils";
import { addComponent, ComponentStateError, replaceComponent } from "@/lib/db/components";
import { addTopLoad, retireTopLoad, TopLoadStateError } from "@/lib/db/top-loads";
import { coilSchema, coilUpdateSchema } from "@/lib/validation/coil";
import { componentSchema, replaceComponentSchema } from "@/lib/validation/component";
import { topLoadSchema } from "@/lib/validation/top-load";

beforeEach(resetDatabase);

async function typedCoil(stewardId: string) {
  const input = coilSchema.parse({ tag: "ty-01", name: "Typed", builderName: "Ada", formDiameterM: "75 mm", windingLengthM: "8 in", wireDiameterM: "AWG 28", turns: "count from winding length" });
  return createCoil(stewardId, input);
}

describe("coils from typed quantities", () => {
  it("stores SI values, the gauge as typed and the counted turns, with an audit entry", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const coil = await typedCoil(steward.id);
    expect(coil.tag).toBe("TY-01");
    expect(coil.formDiameterM).toBeCloseTo(0.075, 9);
    expect(coil.windingLengthM).toBeCloseTo(0.2032, 9);
    expect(coil.wireGaugeAwg).toBe(28);
    expect(coil.wireDiameterM).toBeCloseTo(0.000321, 5);
    // 203.2 mm / (0.3211 mm × 1.08) = 585.9 → 585 whole turns.
    expect(coil.turns).toBe(585);
    expect(await testDb.auditEvent.count({ where: { entityId: coil.id, action: "create" } })).toBe(1);
  });

  it("refuses nonsense naming the field and what was understood, storing nothing", () => {
    const result = coilSchema.safeParse({ tag: "TY-02", name: "Bad", builderName: "Ada", formDiameterM: "75 m", windingLengthM: "banana", wireDiameterM: "AWG 99", turns: "lots" });
    expect(result.success).toBe(false);
    const messages = result.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(messages.some((m) => m.startsWith("formDiameterM: Form diameter must be between") && m.includes("“75 m” was read as 75 m"))).toBe(true);
    expect(messages.some((m) => m.startsWith("windingLengthM: Winding length: Could not read “banana”"))).toBe(true);
    expect(messages.some((m) => m.startsWith("wireDiameterM:") && m.includes("AWG 99"))).toBe(true);
    expect(messages.some((m) => m.startsWith("turns:"))).toBe(true);
  });

  it("refuses more turns than fit in the winding length", () => {
    const result = coilSchema.safeParse({ tag: "TY-03", name: "Tight", builderName: "Ada", formDiameterM: 0.05, windingLengthM: 0.1, wireDiameterM: 0.0005, turns: 900 });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.message).toMatch(/need at least 450 mm of winding/);
  });

  it("updates the build and records what changed; the tag stays", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const coil = await typedCoil(steward.id);
    const input = coilUpdateSchema.parse({ coilId: coil.id, version: coil.version, name: "Typed", builderName: "Ada", formDiameterM: "3 in", windingLengthM: "203.2 mm", wireDiameterM: "0.4 mm", turns: "450 turns", measuredInductanceH: "4.2 mH" });
    const updated = await updateCoil(steward.id, input);
    expect(updated.tag).toBe("TY-01");
    expect(updated.wireGaugeAwg).toBeNull();
    expect(updated.measuredInductanceH).toBeCloseTo(0.0042, 9);
    const event = await testDb.auditEvent.findFirstOrThrow({ where: { entityId: coil.id, action: "update" } });
    expect(event.summary).toContain("formDiameterM");
    expect(event.summary).not.toContain("name");
  });
});

describe("parts", () => {
  it("fits a switch with typed ratings and drops ratings of other kinds", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const coil = await typedCoil(steward.id);
    const input = componentSchema.parse({ coilId: coil.id, kind: "switch", partNumber: "IRFP460", switchType: "mosfet", voltageRatingV: "500 V", continuousCurrentA: "20 A", peakCurrentA: "80A", maxJunctionTempC: "150 °C", thermalResistanceJcKPerW: "0.45 K/W", sinkMassKg: "150 g", installedAt: "2025-01-10" });
    const { component } = await addComponent(steward.id, input);
    expect(component.voltageRatingV).toBe(500);
    expect(component.sinkMassKg).toBeNull();
    expect(component.installedAt.toISOString()).toBe("2025-01-10T00:00:00.000Z");
  });

  it("refuses a switch without its type", () => {
    const result = componentSchema.safeParse({ coilId: "x", kind: "switch", partNumber: "MJE13009" });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]).toMatchObject({ path: ["switchType"] });
  });

  it("replaces a part in one transaction: the old one keeps its dates, reason and successor", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const coil = await typedCoil(steward.id);
    const { component: old } = await addComponent(steward.id, componentSchema.parse({ coilId: coil.id, kind: "switch", partNumber: "IRFP260N", switchType: "mosfet", installedAt: "2025-01-10" }));
    const { fitted } = await replaceComponent(steward.id, replaceComponentSchema.parse({ oldComponentId: old.id, removalReason: "failed short after a long run", coilId: coil.id, kind: "switch", partNumber: "IRFP460", switchType: "mosfet", voltageRatingV: "500 V", installedAt: "2025-03-01" }));
    const after = await testDb.component.findUniqueOrThrow({ where: { id: old.id } });
    expect(after.removedAt?.toISOString()).toBe("2025-03-01T00:00:00.000Z");
    expect(after.removalReason).toBe("failed short after a long run");
    expect(after.replacedById).toBe(fitted.id);
    expect(await testDb.auditEvent.count({ where: { entity: "Component", entityId: old.id, action: "update" } })).toBe(1);

    // A second replacement of the removed part is refused and stores nothing.
    const count = await testDb.component.count();
    await expect(
      replaceComponent(steward.id, replaceComponentSchema.parse({ oldComponentId: old.id, removalReason: "again", coilId: coil.id, kind: "switch", partNumber: "X", switchType: "bjt", installedAt: "2025-04-01" })),
    ).rejects.toBeInstanceOf(ComponentStateError);
    expect(await testDb.component.count()).toBe(count);
  });

  it("refuses a replacement dated before the old part went in, storing nothing", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const coil = await typedCoil(steward.id);
    const { component: old } = await addComponent(steward.id, componentSchema.parse({ coilId: coil.id, kind: "heat_sink", partNumber: "SK-1", installedAt: "2025-02-01" }));
    await expect(
      replaceComponent(steward.id, replaceComponentSchema.parse({ oldComponentId: old.id, removalReason: "upgrade", coilId: coil.id, kind: "heat_sink", partNumber: "SK-2", installedAt: "2025-01-01" })),
    ).rejects.toThrow(/before the old one was fitted/);
    expect(await testDb.component.count()).toBe(1);
    expect((await testDb.component.findUniqueOrThrow({ where: { id: old.id } })).removedAt).toBeNull();
  });
});

describe("top loads", () => {
  it("adds a toroid from typed sizes, retires it once, refuses a second retirement", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const coil = await typedCoil(steward.id);
    const { topLoad } = await addTopLoad(steward.id, topLoadSchema.parse({ coilId: coil.id, name: "Spun toroid", shape: "toroid", diameterM: "6 in", tubeDiameterM: "40 mm" }));
    expect(topLoad.diameterM).toBeCloseTo(0.1524, 9);
    await retireTopLoad(steward.id, topLoad.id);
    await expect(retireTopLoad(steward.id, topLoad.id)).rejects.toBeInstanceOf(TopLoadStateError);
    expect(await testDb.auditEvent.count({ where: { entity: "TopLoad" } })).toBe(2);
  });

  it("refuses a toroid without its tube or with a tube too fat for a hole", () => {
    const missing = topLoadSchema.safeParse({ coilId: "c", name: "T", shape: "toroid", diameterM: "150 mm" });
    expect(missing.error!.issues.map((i) => i.path.join("."))).toContain("tubeDiameterM");
    const fat = topLoadSchema.safeParse({ coilId: "c", name: "T", shape: "toroid", diameterM: "100 mm", tubeDiameterM: "60 mm" });
    expect(fat.error!.issues[0]!.message).toMatch(/less than half the outer diameter/);
  });
});
