/**
 * The dashboard's per-coil summaries (lib/db/coil-summary.ts) against the from-scratch computation: after every kind
 * of write, a policy change, the clock passing a summary's validUntil, and a write racing a recomputation.
 * "From scratch" is the same dashboard with every stored summary discarded first.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import ts from "typescript";
import { beforeEach, describe, expect, it } from "vitest";
import { mainScope, makeOrganisationAdmin, makeUser, resetDatabase, testDb } from "./support/db";
import { ALL_YES, CLEAN_WARM_UP, makeCleanCoil } from "./fleet-fixtures";
import { fitSessionSamples } from "@/lib/analysis/session-fit";
import { getFleetOverview } from "@/lib/db/fleet";
import { computeFiguresFor, storeCoilFigures } from "@/lib/db/coil-summary";
import { getCurrentPolicy, saveDefaultPolicyVersion } from "@/lib/db/policy";
import { createSession } from "@/lib/db/sessions";
import { createCoil, setCoilStatus, updateCoil } from "@/lib/db/coils";
import { addComponent, replaceComponent } from "@/lib/db/components";
import { addTopLoad, retireTopLoad } from "@/lib/db/top-loads";
import { completePostMortem, createFailure } from "@/lib/db/failures";
import { recordSweep } from "@/lib/db/sweeps";
import { exportCoil } from "@/lib/db/export";
import { importLogbook } from "@/lib/db/import";
import { signClearance } from "@/lib/db/clearances";
import { returnLoan } from "@/lib/db/loans";
import { sessionSchema, toLocalDateTimeValue } from "@/lib/validation/session";
import { coilSchema, coilUpdateSchema } from "@/lib/validation/coil";
import { componentSchema, replaceComponentSchema } from "@/lib/validation/component";
import { topLoadSchema } from "@/lib/validation/top-load";
import { failureSchema, postMortemSchema } from "@/lib/validation/failure";
import { logbookDocumentSchema } from "@/lib/validation/export";
import { clearanceDecisionSchema } from "@/lib/validation/clearance";
import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import { readCoilPage } from "@/lib/db/coil-page";
import { judgeCoil } from "@/lib/analysis/coil-health-input";
import { HEADROOM_TREND_SESSIONS } from "@/lib/analysis/headroom-trend";

const DAY = 86_400_000;

beforeEach(resetDatabase);

/** Reads at the default site, as a single-club install makes them. */
const MAIN = mainScope(null);

async function fromScratch(now: Date) {
  await testDb.coilSummary.deleteMany();
  return getFleetOverview(MAIN, now);
}

const revisionOf = async (coilId: string) => (await testDb.coilSummary.findUnique({ where: { coilId } }))?.revision ?? 0;

describe("every lib/db write to a coil's logbook marks the coil changed", () => {
  // The tables whose rows the summary is computed from.
  const LOGBOOK_WRITE = /\b(?:tx|prisma|db)\.(?:coil|topLoad|component|sweep|sweepPoint|sweepResonance|runSession|heatSinkSample|failure)\.(?:create|createMany|createManyAndReturn|update|updateMany|upsert|delete|deleteMany)\(|INSERT INTO "(?:Coil|TopLoad|Component|Sweep|SweepPoint|SweepResonance|RunSession|HeatSinkSample|Failure)"/;
  // Writers that need not mark, and why.
  const EXEMPT: Record<string, string> = {
    emptyDatabase: "empties every table, the summaries with them",
    recalibrateCoil: "a step of recordSweep, which marks the coil",
    insertPointPairs: "a step of recordSweep (its bulk point insert), which marks the coil",
  };

  /** Every top-level function in lib/db (declarations and const arrow functions) with its source text. */
  function libDbFunctions(): { name: string; file: string; text: string }[] {
    const dir = path.resolve("lib/db");
    const found: { name: string; file: string; text: string }[] = [];
    for (const file of readdirSync(dir).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts"))) {
      const source = ts.createSourceFile(file, readFileSync(path.join(dir, file), "utf8"), ts.ScriptTarget.Latest, true);
      for (const statement of source.statements) {
        if (ts.isFunctionDeclaration(statement) && statement.name) found.push({ name: statement.name.text, file, text: statement.getText(source) });
        if (ts.isVariableStatement(statement)) {
          for (const d of statement.declarationList.declarations) {
            if (ts.isIdentifier(d.name) && d.initializer && (ts.isArrowFunction(d.initializer) || ts.isFunctionExpression(d.initializer))) found.push({ name: d.name.text, file, text: d.getText(source) });
          }
        }
      }
    }
    return found;
  }

  it("finds the writers it should (so the scan itself is not blind)", () => {
    const writers = libDbFunctions().filter((f) => LOGBOOK_WRITE.test(f.text)).map((f) => f.name);
    // insertSession is createSession's write (createSession first looks for a replayed client key).
    expect(writers).toEqual(expect.arrayContaining(["insertSession", "recordSweep", "replaceComponent", "completePostMortem", "importCoil", "loadDemoDataset", "updateCoil"]));
  });

  it("each writer calls markCoilChanged in its own code, or is exempt with a reason", () => {
    const forgetful = libDbFunctions()
      .filter((f) => LOGBOOK_WRITE.test(f.text) && !f.text.includes("markCoilChanged(") && !(f.name in EXEMPT))
      .map((f) => `${f.file}#${f.name}`);
    expect(forgetful).toEqual([]);
  });
});

describe("the dashboard from summaries equals the from-scratch computation", () => {
  it("after each kind of write, with the written coil's revision moved and only its summary recomputed", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("SU-01", now, steward.id);
    const other = await makeCleanCoil("SU-02", now, steward.id);
    const topLoad = await testDb.topLoad.findFirstOrThrow({ where: { coilId: coil.id } });
    const sw = await testDb.component.findFirstOrThrow({ where: { coilId: coil.id, kind: "switch" } });
    const at = (daysAgo: number) => toLocalDateTimeValue(new Date(now.getTime() - daysAgo * DAY));
    let lastSessionId = "";

    const writes: [string, () => Promise<unknown>][] = [
      [
        "log a session",
        async () => {
          const s = await createSession(mainScope(steward.id), sessionSchema.parse({ coilId: coil.id, topLoadId: topLoad.id, startedAt: at(2), supplyVoltageV: "30 V", supplyCurrentA: "4 A", durationS: "12 min", ambientTempC: "22", heatSinkEndC: "48", runningFrequencyHz: "298 kHz", peakSwitchVoltageV: "160 V", dutyCycle: "0.5" }));
          lastSessionId = s.id;
        },
      ],
      ["record a failure", () => createFailure(mainScope(steward.id), failureSchema.parse({ coilId: coil.id, sessionId: lastSessionId, componentId: sw.id, mode: "over_current", occurredAt: at(1.9), symptoms: "Switch ran hot and went short." }))],
      [
        "complete its post-mortem with a replacement part",
        async () => {
          const failure = await testDb.failure.findFirstOrThrow({ where: { coilId: coil.id } });
          await completePostMortem(mainScope(steward.id), postMortemSchema.parse({ failureId: failure.id, rootCause: "Current ran past the rating.", correctiveAction: "Fit a bigger switch.", replacement: { partNumber: "MJE13009G", installedAt: at(1.5), voltageRatingV: "700 V", peakCurrentA: "30", maxJunctionTempC: "150" } }));
        },
      ],
      ["fit a part", () => addComponent(mainScope(steward.id), componentSchema.parse({ coilId: coil.id, kind: "fan", partNumber: "FAN-80", installedAt: at(1.2) }))],
      [
        "replace a part",
        async () => {
          const sink = await testDb.component.findFirstOrThrow({ where: { coilId: coil.id, kind: "heat_sink", removedAt: null } });
          await replaceComponent(mainScope(steward.id), replaceComponentSchema.parse({ oldComponentId: sink.id, removalReason: "bigger sink", coilId: coil.id, kind: "heat_sink", partNumber: "HS-2", sinkThermalResistanceKPerW: "0.8", installedAt: at(1) }));
        },
      ],
      ["add a top load", () => addTopLoad(mainScope(steward.id), topLoadSchema.parse({ coilId: coil.id, name: "Bigger toroid", shape: "toroid", diameterM: "15 cm", tubeDiameterM: "4 cm" }))],
      ["retire a top load", async () => retireTopLoad(mainScope(steward.id), (await testDb.topLoad.findFirstOrThrow({ where: { coilId: coil.id, name: "Bigger toroid" } })).id)],
      ["edit the build", async () => updateCoil(mainScope(steward.id), coilUpdateSchema.parse({ coilId: coil.id, version: (await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).version, name: "Coil SU-01", builderName: "Test", formDiameterM: "5 cm", windingLengthM: "20 cm", wireDiameterM: "0.2 mm", turns: "900 turns", measuredInductanceH: "4 mH" }))],
      ["set its status", () => setCoilStatus(mainScope(steward.id), coil.id, "repair")],
      [
        "record a sweep",
        () =>
          recordSweep(mainScope(steward.id), {
            coilId: coil.id,
            topLoadId: topLoad.id,
            takenAt: new Date(now.getTime() - 0.5 * DAY),
            seriesResistanceOhm: 10_000,
            sourceAmplitudeV: 10,
            amplitudeConvention: "peak_to_peak",
            environmentNotes: "",
            notes: "",
            points: Array.from({ length: 200 }, (_, i) => {
              const f = 150_000 + i * 1_500;
              return { frequencyHz: f, amplitudeV: 10 - 9 / (1 + ((f - 300_000) / 3_000) ** 2) };
            }),
          }),
      ],
      [
        "return a loan with the sessions run while away",
        async () => {
          await signClearance(mainScope(steward.id), clearanceDecisionSchema.parse({ coilId: coil.id, verdict: "refused", checklist: ALL_YES }), now);
          const clearance = await testDb.clearance.findFirstOrThrow({ where: { coilId: coil.id } });
          // A loan straight in the table: lending needs a passing clearance, which this coil's logbook no longer gives.
          const loan = await testDb.loan.create({ data: { coilId: coil.id, clearanceId: clearance.id, borrower: "Library", event: "Open day", outAt: new Date(now.getTime() - 3 * DAY), expectedBackAt: now } });
          await returnLoan(mainScope(steward.id), { loanId: loan.id, returnedAt: new Date(now.getTime() - 0.1 * DAY), returnCondition: "Good", returnNotes: "", sessionIds: [lastSessionId] }, now);
        },
      ],
    ];

    await getFleetOverview(MAIN, now);
    for (const [what, write] of writes) {
      const before = await revisionOf(coil.id);
      const otherRow = await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: other.id } });
      await write();
      expect(await revisionOf(coil.id), what).toBeGreaterThan(before);
      const warm = await getFleetOverview(MAIN, now);
      // The untouched coil was read, not recomputed.
      expect(await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: other.id } }), what).toEqual(otherRow);
      expect(warm, what).toEqual(await fromScratch(now));
    }
    // The writes did change what the dashboard shows, so a forgotten mark would have shown up above.
    const [row] = await getFleetOverview(MAIN, now);
    expect(row).toMatchObject({ tag: "SU-01", sessionCount: 6, openFailures: 0, status: "repair" });
  });

  it("for coils created, imported or loaded, which get their summary row in the same transaction", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    await makeCleanCoil("SU-10", now, steward.id);
    const created = await createCoil(mainScope(steward.id), coilSchema.parse({ tag: "SU-11", name: "New", builderName: "Ada", formDiameterM: "75 mm", windingLengthM: "8 in", wireDiameterM: "AWG 28", turns: "600 turns" }));
    expect(await revisionOf(created.id)).toBeGreaterThan(0);
    await getFleetOverview(MAIN, now);
    const doc = logbookDocumentSchema.parse(JSON.parse(JSON.stringify(await exportCoil(MAIN, "SU-10"))));
    const { coils } = await importLogbook(mainScope(steward.id), doc, { asTag: "SU-12" });
    const copy = await testDb.coil.findFirstOrThrow({ where: { tag: coils[0]!.tag } });
    expect(await revisionOf(copy.id)).toBeGreaterThan(0);
    const warm = await getFleetOverview(MAIN, now);
    expect(warm.map((r) => r.tag)).toEqual(["SU-10", "SU-11", "SU-12"]);
    expect(warm).toEqual(await fromScratch(now));
  });

  it("after a policy change, judging every coil by the new thresholds", async () => {
    const admin = await makeOrganisationAdmin("a@club.test");
    const now = new Date();
    await makeCleanCoil("SU-20", now);
    await getCurrentPolicy(MAIN);
    const before = await getFleetOverview(MAIN, now);
    expect(before[0]!.health).not.toBe("hold");
    // Demand more voltage headroom than the coil has (its latest is 1 − 100 V / 400 V = 75 %).
    await saveDefaultPolicyVersion(mainScope(admin.id), { ...DEFAULT_CLEARANCE_POLICY, minVoltageHeadroom: 0.8 }, "stricter");
    const warm = await getFleetOverview(MAIN, now);
    expect(warm[0]!.health).toBe("hold");
    expect(warm).toEqual(await fromScratch(now));
  });

  it("stores each coil's recent headrooms per margin with the policy's thresholds, and recomputes a row stored without them", async () => {
    const admin = await makeOrganisationAdmin("a@club.test");
    const now = new Date();
    const coil = await makeCleanCoil("SU-30", now);
    const page = (await readCoilPage(MAIN, "SU-30"))!;
    const judged = judgeCoil(page.history, page.policy.rules, now);
    const [row] = await getFleetOverview(MAIN, now);
    // The trend is the judgement's own sessions, oldest first (the same figures the health verdict read).
    expect(judged.analyzed.length).toBeGreaterThan(1);
    expect(row!.headroomTrend.voltage.headrooms).toEqual(judged.analyzed.slice(-HEADROOM_TREND_SESSIONS).map((a) => a.analysis.margins.voltage.headroom));
    expect(row!.headroomTrend.thermal.headrooms).toEqual(judged.analyzed.slice(-HEADROOM_TREND_SESSIONS).map((a) => a.analysis.margins.thermal.headroom));
    expect(row!.headroomTrend.current.threshold).toBe(DEFAULT_CLEARANCE_POLICY.minCurrentHeadroom);
    // A row written before the column existed (the migration leaves it NULL) is not trusted: it is recomputed and stored.
    await testDb.coilSummary.update({ where: { coilId: coil.id }, data: { headroomTrendJson: null } });
    expect((await getFleetOverview(MAIN, now))[0]!.headroomTrend).toEqual(row!.headroomTrend);
    expect((await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: coil.id } })).headroomTrendJson).not.toBeNull();
    // A new policy version redraws the limit line.
    await saveDefaultPolicyVersion(mainScope(admin.id), { ...DEFAULT_CLEARANCE_POLICY, minVoltageHeadroom: 0.5 }, "stricter");
    expect((await getFleetOverview(MAIN, now))[0]!.headroomTrend.voltage.threshold).toBe(0.5);
  });

  it("after the clock passes a summary's validUntil, and not before", async () => {
    const now = new Date();
    const coil = await makeCleanCoil("SU-30", now);
    // Current headroom falling steadily over 20 daily sessions: a projection that counts down with the clock. Each run
    // logs the clean warm-up, so the thermal verdict rests on a fit rather than the no-samples worst case.
    for (let i = 0; i < 20; i++) {
      await testDb.runSession.create({
        data: {
          coilId: coil.id,
          startedAt: new Date(now.getTime() - (25 - i) * DAY + 3_600_000),
          supplyVoltageV: 24,
          supplyCurrentA: 1 + i * 0.05 + (i % 3) * 0.015,
          durationS: 600,
          ambientTempC: 22,
          heatSinkStartC: 22,
          heatSinkEndC: 35,
          peakSwitchVoltageV: 100,
          dutyCycle: 0.5,
          samples: { create: CLEAN_WARM_UP },
          ...fitSessionSamples(CLEAN_WARM_UP),
        },
      });
    }
    const first = await getFleetOverview(MAIN, now);
    const stored = await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: coil.id } });
    expect(stored.validUntil).not.toBeNull();
    const validUntil = stored.validUntil!;
    expect(validUntil.getTime()).toBeGreaterThan(now.getTime());

    const justBefore = new Date(validUntil.getTime() - 1);
    const warmBefore = await getFleetOverview(MAIN, justBefore);
    expect((await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: coil.id } })).computedAt).toEqual(stored.computedAt); // read, not recomputed
    expect(warmBefore.map((r) => r.reasons)).toEqual(first.map((r) => r.reasons));

    const after = new Date(validUntil.getTime() + 60_000);
    const warmAfter = await getFleetOverview(MAIN, after);
    const scratchAfter = await fromScratch(after);
    expect(warmAfter).toEqual(scratchAfter);
    // Time alone changed the verdict's words, so a summary trusted past validUntil would have been wrong.
    expect(scratchAfter[0]!.reasons).not.toEqual(first[0]!.reasons);
  });

  it("under a write racing the recomputation: the stale result is not stored as fresh", async () => {
    const member = await makeUser("m@club.test", "member");
    const now = new Date();
    const coil = await makeCleanCoil("SU-40", now);
    const topLoad = await testDb.topLoad.findFirstOrThrow({ where: { coilId: coil.id } });
    await getFleetOverview(MAIN, now);
    const policy = await getCurrentPolicy(MAIN);

    // The dashboard's order: revision read, then the logbook, then the computation…
    const revision = await revisionOf(coil.id);
    await testDb.coilSummary.update({ where: { coilId: coil.id }, data: { computedRevision: null } });
    const computed = await computeFiguresFor(MAIN, [coil.id], new Map([[coil.id, revision]]), policy, now);
    // …while a session is logged before the result is stored.
    await createSession(mainScope(member.id), sessionSchema.parse({ coilId: coil.id, topLoadId: topLoad.id, startedAt: toLocalDateTimeValue(new Date(now.getTime() - DAY)), supplyVoltageV: "24 V", supplyCurrentA: "2 A", durationS: "10 min", ambientTempC: "22", heatSinkEndC: "35" }));
    expect(await storeCoilFigures(MAIN, computed, policy.version, now)).toEqual([]);
    const row = await testDb.coilSummary.findUniqueOrThrow({ where: { coilId: coil.id } });
    expect(row.computedRevision).not.toBe(row.revision);

    const warm = await getFleetOverview(MAIN, now);
    expect(warm[0]!.sessionCount).toBe(6);
    expect(warm).toEqual(await fromScratch(now));
    // Without a racing write the same store goes through (so the refusal above was the race, not the store).
    const again = await computeFiguresFor(MAIN, [coil.id], new Map([[coil.id, await revisionOf(coil.id)]]), policy, now);
    expect(await storeCoilFigures(MAIN, again, policy.version, now)).toEqual([coil.id]);
  });
});
