/**
 * Builds the demo network's sites, people and whole logbook (the club's, and the school's few coils) from the scenario (scenario.ts) with lib/calc's models and a
 * seeded random stream, so every install gets the same readings. Dates count from `anchor` (the day
 * the demo is loaded) so clearances and loans are current whenever it is loaded.
 * Pure: returns rows for lib/db/demo-loader.ts to write.
 */
import { analyzeSweep } from "../../lib/calc/sweep";
import { awgDiameter, wireDcResistance } from "../../lib/calc/wire";
import { predictBuild, calibrateEnvironmentCapacitance, type TopLoadSpec } from "../../lib/calc/build-prediction";
import { createSeededRandom, type SeededRandom } from "../../lib/calc/seeded-random";
import { sessionMargins } from "../../lib/calc/session-margins";
import { computeClearanceExpiry, DEFAULT_CLEARANCE_POLICY, evaluateClearance } from "../../lib/calc/clearance-policy";
import type { DemoDataset } from "../../lib/db/demo-loader";
import { DEMO_PEOPLE, DEMO_SITES, type DemoPersonKey, type DemoSiteKey } from "./people";
import { DEMO_COILS, DEMO_FAILURES, DEMO_LOANS, DEMO_SCHOOL_CLEARANCE, DEMO_SCHOOL_COILS, DEMO_STANDING_CLEARANCE, type DemoCoil, type DemoTopLoad } from "./scenario";
import { pick, round, synthesizeSweep, synthesizeWarmUp } from "./readings";

const DAY_MS = 86_400_000;
const DEMO_SEED = 20_260_601;

const SESSION_NOTES = [
  "Steady streamers, no arcing to the strike rail.",
  "Ran for the open evening; a queue of visitors.",
  "Lit a fluorescent tube at half a metre.",
  "Checked the primary spacing before the run.",
  "Short run to check the new supply leads.",
  "Quiet run, nothing to note.",
  "Breakout point moved after re-seating the top load.",
];

/**
 * Where and how a sweep or a run happened, and what that does to the secondary's environment capacitance, as a
 * share of the coil's total capacitance (common practice: another bench, a person nearby or the strike rail moved
 * shift a small secondary's first resonance by a percent or more; docs/references.md). Invented for the demo.
 */
const BENCH_SETTINGS = [
  { notes: "Workshop bench, coil 1 m from the wall, strike rail removed, humidity 45 %.", capacitanceShare: 0 },
  { notes: "Club-room table by the window, strike rail 40 cm away, humidity 60 %.", capacitanceShare: 0.025 },
  { notes: "Workshop bench, two members standing close to watch, humidity 50 %.", capacitanceShare: 0.04 },
  { notes: "Garage floor on a plywood board, nothing within 2 m, humidity 70 %.", capacitanceShare: -0.02 },
  { notes: "Open-evening bench, metal shelving 60 cm behind, humidity 55 %.", capacitanceShare: 0.05 },
  { notes: "Workshop bench after the winter re-arrangement, scope cart beside it, humidity 35 %.", capacitanceShare: 0.015 },
] as const;

const SITE_ID = Object.fromEntries(DEMO_SITES.map((site) => [site.key, site.id])) as Record<DemoSiteKey, string>;
/** Who logs each site's sweeps and runs, and the steward who adds its coils and decides its clearances. */
const LOGGERS: Record<DemoSiteKey, DemoPersonKey[]> = { club: ["member", "member2", "member3", "steward"], school: ["schoolMember", "member2", "schoolSteward"] };
const STEWARD: Record<DemoSiteKey, DemoPersonKey> = { club: "steward", school: "schoolSteward" };

interface SessionRecord {
  id: string;
  day: number;
  startedAt: Date;
  supplyVoltageV: number;
  supplyCurrentA: number;
  durationS: number;
  ambientTempC: number;
  heatSinkEndC: number;
  runningFrequencyHz: number;
  peakSwitchVoltageV: number | null;
  outcome: "normal" | "stopped" | "anomaly" | "failed";
}

export interface GenerateOptions {
  anchor: Date;
  passwordHashes: Record<DemoPersonKey, string>;
}

export function generateDemoDataset({ anchor, passwordHashes }: GenerateOptions): DemoDataset {
  const at = (day: number, hourUtc = 17, minute = 0) => new Date(anchor.getTime() + day * DAY_MS + hourUtc * 3_600_000 + minute * 60_000);
  const userId = (key: DemoPersonKey) => `user-${key}`;

  const data: DemoDataset = {
    sites: DEMO_SITES.map((site) => ({ id: site.id, slug: site.slug, name: site.name, createdAt: at(-180, 8) })),
    users: DEMO_PEOPLE.map((p) => ({
      id: userId(p.key),
      email: p.email,
      name: p.name,
      organisationAdmin: "organisationAdmin" in p && p.organisationAdmin,
      passwordHash: passwordHashes[p.key],
      createdAt: at(-180, 9),
    })),
    memberships: DEMO_PEOPLE.flatMap((p) =>
      Object.entries(p.sites).map(([site, role]) => ({ userId: userId(p.key), siteId: SITE_ID[site as DemoSiteKey], role, createdAt: at(-180, 9) })),
    ),
    coils: [],
    topLoads: [],
    components: [],
    componentReplacements: [],
    sweeps: [],
    sweepPoints: [],
    sweepResonances: [],
    sessions: [],
    samples: [],
    failures: [],
    policies: [
      { id: "policy-1", version: 1, rulesJson: JSON.stringify(DEFAULT_CLEARANCE_POLICY), note: "First policy, agreed at the spring meeting.", createdAt: at(-170, 10), createdById: userId("admin") },
    ],
    clearances: [],
    loans: [],
    sessionLoans: [],
    audit: [],
  };
  const sessionsByCoil = new Map<string, SessionRecord[]>();
  const sweepsByCoil = new Map<string, { takenAt: Date; firstHz: number }[]>();

  for (const coil of [...DEMO_COILS, ...DEMO_SCHOOL_COILS]) {
    const site = coil.site ?? "club";
    const loggers = LOGGERS[site];
    const coilRng = createSeededRandom(DEMO_SEED + hashTag(coil.tag));
    const wireDiameterM = awgDiameter(coil.wireGaugeAwg);
    const coilId = `coil-${coil.tag}`;
    const truthIn = (tl: DemoTopLoad, environmentCapacitanceF: number) =>
      predictBuild({ formDiameter: coil.formDiameterM, windingLength: coil.windingLengthM, turns: coil.turns, wireDiameter: wireDiameterM, topLoad: topLoadSpec(tl), environmentCapacitance: environmentCapacitanceF });
    const truth = (tl: DemoTopLoad) => truthIn(tl, coil.trueEnvironmentCapacitanceF);
    // A stream of its own for the bench each sweep and run happens on, and the coil's driver offset.
    const benchRng = createSeededRandom(DEMO_SEED + hashTag(coil.tag) + 7_919);
    const onBench = (tl: DemoTopLoad) => {
      const setting = pick(BENCH_SETTINGS, benchRng);
      const share = setting.capacitanceShare + 0.005 * benchRng.normal();
      return { notes: setting.notes, prediction: truthIn(tl, coil.trueEnvironmentCapacitanceF + share * truth(tl).totalCapacitance) };
    };
    // f_run / f_sweep of this coil's driver: the primary and the feedback path pull it 1–4 % above the swept resonance.
    const runningOffset = 1.01 + 0.03 * benchRng.uniform();
    const topLoadOn = (day: number) => [...coil.topLoads].reverse().find((t) => t.fromDay <= day) ?? coil.topLoads[0]!;
    const base = truth(coil.topLoads[0]!);

    data.coils.push({
      id: coilId,
      siteId: SITE_ID[site],
      tag: coil.tag,
      name: coil.name,
      builderName: coil.builderName,
      status: coil.status,
      topology: coil.topology,
      formDiameterM: coil.formDiameterM,
      windingLengthM: coil.windingLengthM,
      turns: coil.turns,
      wireDiameterM,
      wireGaugeAwg: coil.wireGaugeAwg,
      measuredDcResistanceOhm: round(wireDcResistance({ length: base.wireLength, diameter: wireDiameterM }) * (1.02 + 0.01 * coilRng.normal()), 1),
      measuredInductanceH: coil.tag === "KM-02" || coil.tag === "KM-05" ? round(base.inductance * (1 + 0.015 * coilRng.normal()), 6) : null,
      primaryTurns: coil.primaryTurns,
      primaryDiameterM: coil.primaryDiameterM,
      notes: coil.notes,
      createdAt: at(coil.createdDay, 10),
      createdById: userId(STEWARD[site]),
    });
    coil.topLoads.forEach((tl, i) => {
      const next = coil.topLoads[i + 1];
      data.topLoads.push({
        id: topLoadId(coil, tl),
        coilId,
        name: tl.name,
        shape: tl.shape,
        diameterM: tl.diameterM ?? null,
        tubeDiameterM: tl.tubeDiameterM ?? null,
        heightM: tl.heightM ?? null,
        createdAt: at(tl.fromDay, 10),
        retiredAt: next ? at(next.fromDay, 10) : null,
      });
    });

    // Parts fitted from the start; failures below swap some of them.
    const switchIds = Array.from({ length: coil.switchCount }, (_, i) => `part-${coil.tag}-sw${i + 1}`);
    for (const id of switchIds) {
      data.components.push({ id, coilId, kind: "switch", ...coil.switch, installedAt: at(coil.createdDay, 11) });
    }
    data.components.push({ id: `part-${coil.tag}-sink`, coilId, kind: "heat_sink", partNumber: coil.sink.partNumber, manufacturer: "generic", description: "Extruded aluminium", sinkThermalResistanceKPerW: coil.sink.thermalResistanceKPerW, sinkMassKg: coil.sink.massKg, installedAt: at(coil.createdDay, 11) });
    data.components.push({ id: `part-${coil.tag}-snub`, coilId, kind: "snubber", partNumber: "RC-100R-2N2", description: "RC snubber across the switch", resistanceOhm: 100, capacitanceF: 2.2e-9, installedAt: at(coil.createdDay, 11) });
    // The readings are generated with the sink's resistance as it runs (fan on), so the fan records that as its with-fan Rθsa.
    if (coil.hasFan) data.components.push({ id: `part-${coil.tag}-fan`, coilId, kind: "fan", partNumber: "FAN-60-12V", description: "60 mm, 12 V", sinkThermalResistanceKPerW: coil.sink.thermalResistanceKPerW, installedAt: at(coil.createdDay, 11) });
    if (coil.clampFromDay !== undefined) {
      data.components.push({ id: `part-${coil.tag}-clamp`, coilId, kind: "clamp", partNumber: "CLAMP-UF-1U", description: "Fast diode into 1 µF, bled by 1 kΩ to the supply", capacitanceF: 1e-6, resistanceOhm: 1000, installedAt: at(coil.clampFromDay, 12) });
    }

    // Sweeps: one for each top load when fitted, then every six weeks or so.
    const sweepDays = new Set<number>();
    for (const tl of coil.topLoads) sweepDays.add(Math.max(tl.fromDay, coil.createdDay) + 1);
    for (let day = coil.createdDay + 45; day < Math.min(-2, coil.sessions.toDay + 30); day += 45) sweepDays.add(day);
    const sweepList: { takenAt: Date; firstHz: number; topLoad: DemoTopLoad }[] = [];
    [...sweepDays].sort((a, b) => a - b).forEach((day, n) => {
      const tl = topLoadOn(day);
      const bench = onBench(tl);
      const prediction = bench.prediction;
      const sweepId = `sweep-${coil.tag}-${n + 1}`;
      const seriesResistanceOhm = 22_000;
      const sourceAmplitudeV = 20;
      const points = synthesizeSweep(
        { firstSeriesResonanceHz: prediction.firstResonance, inductanceH: prediction.inductance, selfCapacitanceF: prediction.selfCapacitance, topCapacitanceF: prediction.topLoadCapacitance + prediction.environmentCapacitance, seriesResistanceOhm, sourceAmplitudeV },
        coilRng,
      );
      const analysis = analyzeSweep({ seriesResistance: seriesResistanceOhm, sourceAmplitude: sourceAmplitudeV, points });
      const first = analysis.seriesResonances[0];
      if (!first) throw new Error(`Demo sweep ${sweepId} shows no series resonance`);
      const takenAt = at(day, 15, 30);
      data.sweeps.push({ id: sweepId, coilId, topLoadId: topLoadId(coil, tl), takenAt, takenById: userId(pick(loggers, coilRng)), seriesResistanceOhm, sourceAmplitudeV, amplitudeConvention: "peak_to_peak", environmentNotes: bench.notes, pointCount: points.length, firstSeriesResonanceHz: first.frequency, createdAt: takenAt });
      for (const p of points) data.sweepPoints.push({ sweepId, frequencyHz: p.frequency, amplitudeV: round(p.amplitude, 4) });
      analysis.seriesResonances.forEach((r, i) => data.sweepResonances.push({ id: `${sweepId}-s${i + 1}`, sweepId, kind: "series", ordinal: i + 1, frequencyHz: r.frequency, impedanceOhm: r.impedance, q: r.q ?? null, frequencyStandardErrorHz: r.frequencyStandardError ?? null, qStandardError: r.qStandardError ?? null }));
      analysis.parallelResonances.forEach((r, i) => data.sweepResonances.push({ id: `${sweepId}-p${i + 1}`, sweepId, kind: "parallel", ordinal: i + 1, frequencyHz: r.frequency, impedanceOhm: r.impedance, q: r.q ?? null, frequencyStandardErrorHz: r.frequencyStandardError ?? null, qStandardError: r.qStandardError ?? null }));
      sweepList.push({ takenAt, firstHz: first.frequency, topLoad: tl });
    });
    sweepsByCoil.set(coilId, sweepList);
    const calibration = calibrateEnvironmentCapacitance(
      { formDiameter: coil.formDiameterM, windingLength: coil.windingLengthM, turns: coil.turns, wireDiameter: wireDiameterM },
      sweepList.map((s) => ({ firstSeriesResonance: s.firstHz, topLoad: topLoadSpec(s.topLoad) })),
    );
    const coilRow = data.coils[data.coils.length - 1]!;
    coilRow.environmentCapacitanceF = calibration.environmentCapacitance;
    coilRow.environmentCalibratedAt = sweepList[sweepList.length - 1]!.takenAt;

    const runningOn = (tl: DemoTopLoad) => onBench(tl).prediction.firstResonance * runningOffset;
    sessionsByCoil.set(coilId, generateSessions(coil, coilId, coilRng, at, runningOn, topLoadOn, data, loggers.map(userId)));
  }

  addFailures(data, sessionsByCoil, at, userId);
  addClearancesAndLoans(data, sessionsByCoil, sweepsByCoil, at, userId);
  for (const site of DEMO_SITES) {
    const coilIds = new Set(data.coils.filter((c) => c.siteId === site.id).map((c) => c.id));
    data.audit.push({
      at: at(0, 0),
      siteId: site.id,
      actorId: null,
      action: "import",
      entity: "Demo",
      entityId: site.slug,
      summary: `Demo loaded for ${site.name}: ${coilIds.size} coils, ${data.sessions.filter((s) => coilIds.has(s.coilId)).length} sessions, ${data.sweeps.filter((s) => coilIds.has(s.coilId)).length} sweeps`,
    });
  }
  return data;
}

function generateSessions(
  coil: DemoCoil,
  coilId: string,
  rng: SeededRandom,
  at: (day: number, hour?: number, minute?: number) => Date,
  /** The running frequency this top load would give on the bench of the day, before reading noise, Hz. */
  runningOn: (tl: DemoTopLoad) => number,
  topLoadOn: (day: number) => DemoTopLoad,
  data: DemoDataset,
  loggerIds: string[],
): SessionRecord[] {
  const failure = DEMO_FAILURES.find((f) => f.coilTag === coil.tag);
  const { count, fromDay, toDay } = coil.sessions;
  const days: number[] = [];
  for (let i = 0; i < count; i++) days.push(Math.round(fromDay + ((toDay - fromDay) * i) / Math.max(1, count - 1) + (i > 0 && i < count - 1 ? (rng.uniform() - 0.5) * 3 : 0)));
  if (failure) days.push(failure.day);
  days.sort((a, b) => a - b);
  const records: SessionRecord[] = [];
  days.forEach((day, n) => {
    const isFailure = failure !== undefined && day === failure.day && !records.some((r) => r.outcome === "failed");
    const clamped = coil.clampFromDay !== undefined && day >= coil.clampFromDay;
    const driftFraction = coil.drift ? Math.min(1, Math.max(0, (day - coil.drift.fromDay) / -coil.drift.fromDay)) : 0;
    let sinkFactor = 1 + (coil.drift ? (coil.drift.sinkResistanceFactor - 1) * driftFraction : 0);
    const currentFactor = 1 + (coil.drift ? (coil.drift.currentFactor - 1) * driftFraction : 0);
    // A fan bearing seizing over the weeks before the over-temperature failure.
    if (failure?.mode === "over_temperature" && day <= failure.day && day > failure.day - 25) sinkFactor *= isFailure ? 4.5 : 1.5 + (25 - (failure.day - day)) / 10;
    const supplyVoltageV = isFailure && failure?.mode === "over_voltage" ? 24 : pick(coil.supplyVoltages, rng);
    const supplyCurrentA = round(supplyVoltageV * coil.currentPerVolt * currentFactor * (1 + 0.025 * rng.normal()), 2);
    const ambientTempC = round(21 + 2.5 * Math.cos((2 * Math.PI * (day + 120)) / 365) + rng.normal() * 0.8, 1);
    const durationS = isFailure ? (failure?.mode === "over_voltage" ? 90 : 720) : 60 * Math.round(5 + rng.uniform() * 15);
    const dissipationW = coil.switchLossFraction * supplyVoltageV * supplyCurrentA * (1 + 0.05 * rng.normal());
    const samples = synthesizeWarmUp({ ambientC: ambientTempC, dissipationW, sinkResistanceKPerW: coil.sink.thermalResistanceKPerW * sinkFactor, sinkMassKg: coil.sink.massKg, durationS }, rng);
    const tl = topLoadOn(day);
    const runningFrequencyHz = Math.round((runningOn(tl) * (1 + 0.004 * rng.normal())) / 100) * 100;
    const peakFactor =
      coil.topology === "single_switch" ? (clamped ? 2.7 + 0.08 * rng.normal() : 5.55 + 0.1 * rng.normal()) : coil.topology === "push_pull" ? 2.3 + 0.08 * rng.normal() : 1.15 + 0.04 * rng.normal();
    const nearOverVoltage = failure?.mode === "over_voltage" && !clamped && day >= failure.day - 40;
    const measured = isFailure || nearOverVoltage || rng.uniform() < 0.35;
    const peakSwitchVoltageV = measured ? round(supplyVoltageV * (isFailure && failure?.mode === "over_voltage" ? 5.75 : peakFactor), 0) : null;
    const hotLate = coil.drift !== undefined && driftFraction > 0.7 && rng.uniform() < 0.3;
    const outcome: SessionRecord["outcome"] = isFailure ? "failed" : hotLate ? "anomaly" : rng.uniform() < 0.05 ? "stopped" : "normal";
    const id = `session-${coil.tag}-${String(n + 1).padStart(3, "0")}`;
    const startedAt = at(day, 16 + Math.floor(rng.uniform() * 4), Math.floor(rng.uniform() * 60));
    const last = samples[samples.length - 1]!;
    data.sessions.push({
      id,
      coilId,
      topLoadId: topLoadId(coil, tl),
      startedAt,
      loggedById: pick(loggerIds, rng),
      supplyVoltageV,
      supplyCurrentA,
      durationS,
      ambientTempC,
      heatSinkStartC: samples[0]!.temperatureC,
      heatSinkEndC: last.temperatureC,
      runningFrequencyHz,
      peakSwitchVoltageV,
      outcome,
      notes: isFailure ? "Ended in a failure: see the post-mortem." : hotLate ? "Heat sink noticeably hotter than it used to get." : pick(SESSION_NOTES, rng),
      createdAt: startedAt,
    });
    for (const s of samples) data.samples.push({ sessionId: id, elapsedS: s.elapsedS, temperatureC: s.temperatureC });
    records.push({ id, day, startedAt, supplyVoltageV, supplyCurrentA, durationS, ambientTempC, heatSinkEndC: last.temperatureC, runningFrequencyHz, peakSwitchVoltageV, outcome });
  });
  return records;
}

function addFailures(data: DemoDataset, sessionsByCoil: Map<string, SessionRecord[]>, at: (day: number, hour?: number) => Date, userId: (k: DemoPersonKey) => string) {
  DEMO_FAILURES.forEach((failure, i) => {
    const coil = DEMO_COILS.find((c) => c.tag === failure.coilTag)!;
    const coilId = `coil-${coil.tag}`;
    const session = sessionsByCoil.get(coilId)!.find((s) => s.outcome === "failed")!;
    const replacedAt = at(failure.day + 1, 12);
    const swapped = failure.mode === "over_temperature" ? Array.from({ length: coil.switchCount }, (_, n) => `part-${coil.tag}-sw${n + 1}`) : [`part-${coil.tag}-sw1`];
    if (failure.mode === "over_temperature" && coil.hasFan) swapped.push(`part-${coil.tag}-fan`);
    const replacements = swapped.map((oldId) => {
      const old = data.components.find((c) => c.id === oldId)!;
      old.removedAt = replacedAt;
      old.removalReason = `Replaced after the ${failure.mode.replace("_", "-")} failure`;
      const newId = `${oldId}-r${i + 1}`;
      data.components.push({ ...old, id: newId, installedAt: replacedAt, removedAt: null, removalReason: null, replacedById: null });
      data.componentReplacements.push({ id: oldId, replacedById: newId });
      return newId;
    });
    data.failures.push({
      id: `failure-${i + 1}`,
      coilId,
      sessionId: session.id,
      componentId: swapped[0]!,
      occurredAt: new Date(session.startedAt.getTime() + session.durationS * 1000),
      mode: failure.mode,
      symptoms: failure.symptoms,
      rootCause: failure.rootCause,
      correctiveAction: failure.correctiveAction,
      status: "closed",
      replacementComponentId: replacements[0]!,
      reportedById: userId(failure.reportedBy),
      closedById: userId(failure.closedBy),
      closedAt: at(failure.day + 3, 18),
      createdAt: at(failure.day, 20),
    });
  });
}

function addClearancesAndLoans(
  data: DemoDataset,
  sessionsByCoil: Map<string, SessionRecord[]>,
  sweepsByCoil: Map<string, { takenAt: Date; firstHz: number }[]>,
  at: (day: number, hour?: number) => Date,
  userId: (k: DemoPersonKey) => string,
) {
  const clear = (coilTag: string, day: number, id: string) => {
    const coil = [...DEMO_COILS, ...DEMO_SCHOOL_COILS].find((c) => c.tag === coilTag)!;
    const coilId = `coil-${coil.tag}`;
    const decidedAt = at(day, 11);
    const before = sessionsByCoil.get(coilId)!.filter((s) => s.startedAt < decidedAt);
    const latest = before[before.length - 1]!;
    const lastFailure = data.failures.filter((f) => f.coilId === coilId && new Date(f.occurredAt) < decidedAt).pop();
    const sweeps = sweepsByCoil.get(coilId)!.filter((s) => s.takenAt < decidedAt);
    const margins = sessionMargins(
      { topology: coil.topology, voltageClamp: coil.clampFromDay !== undefined && day >= coil.clampFromDay, supplyVoltageV: latest.supplyVoltageV, supplyCurrentA: latest.supplyCurrentA, ambientTempC: latest.ambientTempC, heatSinkEndC: latest.heatSinkEndC, peakSwitchVoltageV: latest.peakSwitchVoltageV },
      coil.switch,
      { sinkThermalResistanceKPerW: coil.sink.thermalResistanceKPerW, caseToSinkKPerW: coil.switch.caseToSinkKPerW, switchesOnSink: coil.switchCount },
    );
    const checklist = Object.fromEntries(DEFAULT_CLEARANCE_POLICY.requiredChecklist.map((item) => [item.id, true]));
    const evaluation = evaluateClearance({
      policy: DEFAULT_CLEARANCE_POLICY,
      facts: {
        margins,
        firstSeriesResonanceHz: sweeps[sweeps.length - 1]?.firstHz ?? null,
        runningFrequencyHz: latest.runningFrequencyHz,
        openFailures: 0,
        lastSweepAt: sweeps[sweeps.length - 1]?.takenAt ?? null,
        failureFreeSessions: before.filter((s) => !lastFailure || s.startedAt > new Date(lastFailure.occurredAt)).length,
        checklist,
      },
      now: decidedAt,
    });
    if (evaluation.verdict !== "pass") {
      throw new Error(`Demo clearance of ${coilTag} on day ${day} fails its own rules: ${evaluation.rules.filter((r) => !r.pass).map((r) => `${r.id} (${r.detail})`).join("; ")}`);
    }
    data.clearances.push({
      id,
      coilId,
      policyId: "policy-1",
      decidedById: userId(STEWARD[coil.site ?? "club"]),
      decidedAt,
      validUntil: computeClearanceExpiry(decidedAt, DEFAULT_CLEARANCE_POLICY),
      verdict: "cleared",
      ruleResultsJson: JSON.stringify(evaluation.rules),
      checklistJson: JSON.stringify(DEFAULT_CLEARANCE_POLICY.requiredChecklist.map((item) => ({ ...item, answer: true }))),
      maxSupplyVoltageV: Math.max(...coil.supplyVoltages),
      maxRunS: 20 * 60,
      conditions: `Supply at most ${Math.max(...coil.supplyVoltages)} V; runs of at most 20 minutes with a 10-minute cool-down.`,
      createdAt: decidedAt,
    });
  };

  DEMO_LOANS.forEach((loan, i) => {
    const clearanceId = `clearance-loan-${i + 1}`;
    clear(loan.coilTag, loan.clearedDay, clearanceId);
    const loanId = `loan-${i + 1}`;
    data.loans.push({
      id: loanId,
      coilId: `coil-${loan.coilTag}`,
      clearanceId,
      borrower: loan.borrower,
      borrowerContact: loan.contact,
      event: loan.event,
      outAt: at(loan.outDay, 9),
      expectedBackAt: at(loan.expectedBackDay, 17),
      returnedAt: loan.backDay === null ? null : at(loan.backDay, 16),
      returnCondition: loan.condition,
      lentById: userId("steward"),
      receivedById: loan.backDay === null ? null : userId("steward"),
      createdAt: at(loan.outDay, 9),
    });
    if (loan.backDay !== null) {
      const away = sessionsByCoil.get(`coil-${loan.coilTag}`)!.filter((s) => s.day >= loan.outDay && s.day <= loan.backDay!);
      for (const s of away) data.sessionLoans.push({ sessionId: s.id, loanId });
    }
  });
  clear(DEMO_STANDING_CLEARANCE.coilTag, DEMO_STANDING_CLEARANCE.clearedDay, "clearance-standing");
  clear(DEMO_SCHOOL_CLEARANCE.coilTag, DEMO_SCHOOL_CLEARANCE.clearedDay, "clearance-school-standing");
}

function topLoadSpec(tl: DemoTopLoad): TopLoadSpec | null {
  switch (tl.shape) {
    case "none":
      return null;
    case "sphere":
      return { kind: "sphere", diameter: tl.diameterM! };
    case "disc":
      return { kind: "disc", diameter: tl.diameterM! };
    case "toroid":
      return { kind: "toroid", outerDiameter: tl.diameterM!, tubeDiameter: tl.tubeDiameterM! };
    case "cylinder":
      return { kind: "cylinder", diameter: tl.diameterM!, height: tl.heightM! };
  }
}

function topLoadId(coil: DemoCoil, tl: DemoTopLoad): string {
  return `topload-${coil.tag}-${tl.key}`;
}

function hashTag(tag: string): number {
  let h = 0;
  for (const ch of tag) h = (h * 31 + ch.charCodeAt(0)) >>> 0;
  return h % 1_000_000;
}
