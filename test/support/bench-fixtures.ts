/** A small coil with a switch, a heat sink and a top load, for the session and failure tests. */
import { testDb } from "./db";
import { DEFAULT_SITE_ID } from "../../lib/db/site-scope";

/** The switch every test coil is fitted with: an MJE13009-like BJT's ratings (test data, not a datasheet check). */
export const TEST_SWITCH = {
  kind: "switch",
  partNumber: "MJE13009",
  switchType: "bjt",
  voltageRatingV: 400,
  continuousCurrentA: 12,
  peakCurrentA: 24,
  powerRating25CW: 100,
  maxJunctionTempC: 150,
  thermalResistanceJcKPerW: 1.25,
  caseToSinkKPerW: 0.5,
} as const;

export async function makeBenchCoil(actorId: string, tag = "T-01", siteId: string = DEFAULT_SITE_ID) {
  const coil = await testDb.coil.create({
    data: { siteId, tag, name: "Test coil", builderName: "Tester", formDiameterM: 0.075, windingLengthM: 0.3, turns: 900, wireDiameterM: 0.00032, createdById: actorId },
  });
  const installedAt = new Date("2025-06-01T12:00:00Z");
  const sw = await testDb.component.create({
    data: { coilId: coil.id, ...TEST_SWITCH, installedAt },
  });
  const sink = await testDb.component.create({ data: { coilId: coil.id, kind: "heat_sink", partNumber: "Fin block", sinkThermalResistanceKPerW: 1.2, installedAt } });
  const topLoad = await testDb.topLoad.create({ data: { coilId: coil.id, name: "Small toroid", shape: "toroid", diameterM: 0.15, tubeDiameterM: 0.04 } });
  return { coil, sw, sink, topLoad };
}
