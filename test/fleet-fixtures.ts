/** A small coil with a clean logbook that passes the default lending policy, built straight in the test database. */
import { testDb } from "./support/db";
import { TEST_SWITCH } from "./support/bench-fixtures";
import { DEFAULT_LENDING_CHECKLIST } from "@/lib/calc/lending-checklist";
import { fitSessionSamples } from "@/lib/analysis/session-fit";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";

const DAY = 86_400_000;

/**
 * A warm-up that levels off at 35 °C: 22 °C + 13 K·(1 − e^(−t/120 s)) every 30 s for 10 min, read to 0.1 K, so a clean
 * session has a usable fit (a session without samples is judged at its worst case).
 */
export const CLEAN_WARM_UP = Array.from({ length: 21 }, (_, i) => ({ elapsedS: 30 * i, temperatureC: Math.round(10 * (22 + 13 * (1 - Math.exp((-30 * i) / 120)))) / 10 }));

export const ALL_YES: Record<string, boolean> = Object.fromEntries(DEFAULT_LENDING_CHECKLIST.map((i) => [i.id, true]));

export async function makeCleanCoil(tag: string, now: Date, createdById?: string, siteId: string = DEFAULT_SITE_ID) {
  const coil = await testDb.coil.create({
    data: { siteId, tag, name: `Coil ${tag}`, builderName: "Test", formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002, createdById },
  });
  const topLoad = await testDb.topLoad.create({ data: { coilId: coil.id, name: "Small toroid", shape: "toroid", diameterM: 0.1, tubeDiameterM: 0.025 } });
  const built = new Date(now.getTime() - 30 * DAY);
  await testDb.component.create({
    data: { coilId: coil.id, ...TEST_SWITCH, installedAt: built },
  });
  await testDb.component.create({ data: { coilId: coil.id, kind: "heat_sink", partNumber: "HS-1", sinkThermalResistanceKPerW: 1.5, installedAt: built } });
  await testDb.component.create({ data: { coilId: coil.id, kind: "clamp", partNumber: "TVS-1", clampVoltageV: 150, installedAt: built } });
  for (let i = 0; i < 5; i++) {
    await testDb.runSession.create({
      data: {
        coilId: coil.id,
        topLoadId: topLoad.id,
        startedAt: new Date(now.getTime() - (10 - i) * DAY),
        supplyVoltageV: 24,
        supplyCurrentA: 2,
        durationS: 600,
        ambientTempC: 22,
        heatSinkStartC: 22,
        heatSinkEndC: 35,
        runningFrequencyHz: 300_000,
        peakSwitchVoltageV: 100,
        dutyCycle: 0.5,
        samples: { create: CLEAN_WARM_UP },
        ...fitSessionSamples(CLEAN_WARM_UP),
      },
    });
  }
  await testDb.sweep.create({
    data: { coilId: coil.id, topLoadId: topLoad.id, takenAt: new Date(now.getTime() - 7 * DAY), seriesResistanceOhm: 10_000, sourceAmplitudeV: 10, firstSeriesResonanceHz: 305_000 },
  });
  return coil;
}
