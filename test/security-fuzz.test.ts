/**
 * Integration fuzzing of three mutations through their schemas, as the server actions call them:
 * random mixes of good and bad values and of ids that exist, belong to another coil, or do not
 * exist. Whatever the schema lets through, the mutation either stores it or refuses it with its
 * RecordRefusedError/SweepRefusedError — and a refusal leaves every table's row count unchanged.
 */
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { countAllRows, mainScope, makeUser, resetDatabase } from "./support/db";
import { makeBenchCoil } from "./support/bench-fixtures";
import { createSession } from "@/lib/db/sessions";
import { createFailure } from "@/lib/db/failures";
import { recordSweep, SweepRefusedError } from "@/lib/db/sweeps";
import { RecordRefusedError } from "@/lib/db/record-refused";
import { sessionSchema } from "@/lib/validation/session";
import { failureSchema } from "@/lib/validation/failure";
import { recordInputFromEntry, sweepEntrySchema } from "@/lib/validation/sweep";


let actorId = "";
let ids: { coil: string; topLoad: string; part: string; otherCoil: string; otherTopLoad: string; otherPart: string; session: string; otherSession: string };

beforeAll(async () => {
  await resetDatabase();
  actorId = (await makeUser("fuzz@lab.test", "member")).id;
  const mine = await makeBenchCoil(actorId, "FZ-01");
  const other = await makeBenchCoil(actorId, "FZ-02");
  const sessionFor = (coilId: string) =>
    createSession(mainScope(actorId), sessionSchema.parse({ coilId, startedAt: "2026-01-10T14:05", supplyVoltageV: "48 V", supplyCurrentA: "2.5 A", durationS: "12 min", ambientTempC: "21", heatSinkStartC: "21", heatSinkEndC: "46", runningFrequencyHz: "334k", samples: "" }));
  ids = {
    coil: mine.coil.id, topLoad: mine.topLoad.id, part: mine.sw.id,
    otherCoil: other.coil.id, otherTopLoad: other.topLoad.id, otherPart: other.sw.id,
    session: (await sessionFor(mine.coil.id)).id, otherSession: (await sessionFor(other.coil.id)).id,
  };
});

/** Runs the mutation and checks the contract: stored, or refused with the domain error and nothing written. */
const tally = { stored: 0, refused: 0 };
async function storesOrRefusesCleanly(write: () => Promise<unknown>) {
  const before = await countAllRows();
  try {
    await write();
    tally.stored += 1;
  } catch (error) {
    expect(error instanceof RecordRefusedError || error instanceof SweepRefusedError, String(error)).toBe(true);
    expect((error as Error).message.length).toBeGreaterThan(0);
    expect(await countAllRows()).toEqual(before);
    tally.refused += 1;
  }
}

const pick = <T,>(...values: T[]) => fc.constantFrom(...values);
const anyId = () => fc.oneof(pick(ids.coil, ids.otherCoil, ids.topLoad, ids.otherTopLoad, ids.part, ids.otherPart, ids.session, ids.otherSession, "", "missing-id"), fc.string({ maxLength: 8 }));
/** Mostly the right id (or none), sometimes any id: so inputs reach both the write and the refusal. */
const mostly = (...right: string[]) => fc.oneof({ arbitrary: pick(...right), weight: 3 }, { arbitrary: anyId(), weight: 1 });
const when = () => pick("2026-01-10T14:30", "2026-01-10T13:00", "2020-01-01T00:00", "2030-06-01T12:00", "yesterday", "");

describe("mutations under fuzzing never leave partial writes", () => {
  afterAll(() => {
    // The generators reach the database both ways: some inputs are stored, some refused there.
    expect(tally.stored, JSON.stringify(tally)).toBeGreaterThan(0);
    expect(tally.refused).toBeGreaterThan(0);
  });

  it("createSession", async () => {
    await fc.assert(
      fc.asyncProperty(mostly(ids.coil), mostly("", ids.topLoad), when(), pick("48 V", "0", "1e9 V", "-5", "x"), pick("", "0:00,21\n2:00,30\n4:00,35", "0:00,21\n0:00,22", "0:00,hot", "1:00,20\n0:30,21"), async (coilId, topLoadId, startedAt, supplyVoltageV, samples) => {
        const parsed = sessionSchema.safeParse({ coilId, topLoadId, startedAt, supplyVoltageV, supplyCurrentA: "2 A", durationS: "5 min", ambientTempC: "21", heatSinkStartC: "21", heatSinkEndC: "40", runningFrequencyHz: "300k", samples });
        if (parsed.success) await storesOrRefusesCleanly(() => createSession(mainScope(actorId), parsed.data));
      }),
      {
        numRuns: 40,
        // Always reach the database both ways, whatever the seed: one valid log, one with another coil's top load.
        examples: [
          [ids.coil, "", "2026-01-10T14:30", "48 V", "0:00,21\n2:00,30\n4:00,35"],
          [ids.coil, ids.otherTopLoad, "2026-01-10T14:30", "48 V", ""],
        ],
      },
    );
  });

  it("createFailure", async () => {
    await fc.assert(
      fc.asyncProperty(mostly(ids.coil), mostly("", ids.session), mostly("", ids.part), when(), pick("over_voltage", "thermal", "gremlins", ""), async (coilId, sessionId, componentId, occurredAt, mode) => {
        const parsed = failureSchema.safeParse({ coilId, sessionId, componentId, occurredAt, mode, symptoms: "Fuzzed: a crack and a trip." });
        if (parsed.success) await storesOrRefusesCleanly(() => createFailure(mainScope(actorId), parsed.data));
      }),
      { numRuns: 40 },
    );
  });

  it("recordSweep", async () => {
    const reading = fc.record({ frequency: pick("100k", "200k", "300k", "0", "-1", "1e12", "x"), amplitude: pick("1 V", "2", "0.5", "0", "-3", "lots") });
    await fc.assert(
      fc.asyncProperty(mostly(ids.coil), mostly("", ids.topLoad), when(), fc.array(reading, { minLength: 2, maxLength: 6 }), async (coilId, topLoadId, takenAt, points) => {
        const parsed = sweepEntrySchema.safeParse({ coilId, topLoadId, takenAt, seriesResistanceOhm: "22k", sourceAmplitudeV: "20", amplitudeConvention: "peak", points });
        if (parsed.success) await storesOrRefusesCleanly(() => recordSweep(mainScope(actorId), recordInputFromEntry(parsed.data), "hand"));
      }),
      { numRuns: 40 },
    );
  });
});
