import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { CalcInputError } from "./errors";
import { rankLikelyCauses, type SessionHistoryEntry } from "./failure-analysis";
import { assessMargin, type Margin, type MarginKind } from "./margin";

// Synthetic margins built with the real margin constructor, so status and headroom follow the project's rules.
const FORMULA: Record<MarginKind, string> = { voltage: "V_peak / V_rating", current: "I_peak / I_peak,rating", thermal: "P / P_derated(T_case)" };
function margin(kind: MarginKind, value: number, limit: number, estimated = false): Margin {
  return assessMargin({ kind, value, limit, formula: FORMULA[kind], inputs: [{ name: "x", value, unit: "", estimated, source: "test" }], thinBelow: 0.2 });
}
const calm = () => [margin("voltage", 60, 140), margin("current", 5, 20), margin("thermal", 10, 60)];

const day = (n: number) => new Date(Date.UTC(2025, 2, 1 + n, 18, 30));
function history(count: number, tweak: (i: number) => Partial<SessionHistoryEntry> = () => ({})): SessionHistoryEntry[] {
  return Array.from({ length: count }, (_, i) => ({
    startedAt: day(i),
    margins: calm(),
    supplyVoltage: 24,
    supplyCurrent: 2,
    runningFrequency: 310e3,
    heatSinkEnd: 40,
    ambientTemp: 22,
    durationS: 300,
    outcome: "normal" as const,
    ...tweak(i),
  }));
}
const failureAt = { occurredAt: day(4.5) };
const top = (r: ReturnType<typeof rankLikelyCauses>) => r[0]!.cause;
const find = (r: ReturnType<typeof rankLikelyCauses>, cause: string) => r.find((c) => c.cause === cause);

describe("rankLikelyCauses", () => {
  it("puts over-voltage first when the peak sat at 93 % of the rating two sessions running", () => {
    const sessions = history(5, (i) => (i >= 3 ? { margins: [margin("voltage", 130, 140), margin("current", 5, 20), margin("thermal", 10, 60)] } : {}));
    const ranked = rankLikelyCauses({ failure: failureAt, recentSessions: sessions });
    expect(top(ranked)).toBe("over_voltage");
    // 130/140 = 92.9 %, rounded: the figure must appear in the evidence.
    expect(find(ranked, "over_voltage")!.evidence.join(" ")).toMatch(/peak voltage at 93 % of rating two sessions running/);
  });

  it("puts over-current first when the supply current climbed 18 % at the same supply", () => {
    const amps = [2.2, 2.3, 2.4, 2.5, 2.6];
    const ranked = rankLikelyCauses({ failure: failureAt, recentSessions: history(5, (i) => ({ supplyCurrent: amps[i]! })) });
    expect(top(ranked)).toBe("over_current");
    // (2.6 − 2.2)/2.2 = 18.2 % by hand; a straight line, so the Theil–Sen fit reproduces the end points exactly.
    const text = find(ranked, "over_current")!.evidence.join(" ");
    expect(text).toMatch(/supply current up 18 % at comparable supply voltage \(24 V\)/);
    expect(text).toMatch(/2\.2 A → 2\.6 A/);
  });

  it("puts over-temperature first when the heat sink ran 12 K hotter over five sessions at the same supply", () => {
    const ranked = rankLikelyCauses({ failure: failureAt, recentSessions: history(5, (i) => ({ heatSinkEnd: 40 + 3 * i })) });
    expect(top(ranked)).toBe("over_temperature");
    expect(find(ranked, "over_temperature")!.evidence.join(" ")).toMatch(/rose 12 K over the last 5 sessions at comparable supply voltage/);
  });

  it("is not fooled by one odd sink reading (robust trend)", () => {
    // First-to-last would read a 15 K rise; the median of pairwise slopes (Theil–Sen) is 0 with one outlier in five.
    const sinks = [25, 40, 40, 40, 40];
    const ranked = rankLikelyCauses({ failure: failureAt, recentSessions: history(5, (i) => ({ heatSinkEnd: sinks[i]! })) });
    expect(find(ranked, "over_temperature")).toBeUndefined();
  });

  it("puts reverse base breakdown first when recorded on a single-switch BJT driver", () => {
    const ranked = rankLikelyCauses({
      failure: { ...failureAt, mode: "reverse_base_breakdown", componentKind: "switch" },
      recentSessions: history(5),
      switchType: "bjt",
      topology: "single_switch",
    });
    expect(top(ranked)).toBe("reverse_base_breakdown");
    const evidence = find(ranked, "reverse_base_breakdown")!.evidence.join(" ");
    expect(evidence).toMatch(/recorded as reverse base breakdown/);
    expect(evidence).toMatch(/base–emitter/);
  });

  it("puts mechanical first for a failed fan, and still lists the heat it lets build up", () => {
    const ranked = rankLikelyCauses({ failure: { ...failureAt, mode: "mechanical", componentKind: "fan" }, recentSessions: history(5) });
    expect(top(ranked)).toBe("mechanical");
    expect(find(ranked, "over_temperature")!.score).toBeGreaterThan(0);
  });

  it("falls back to unknown, saying why, when nothing points anywhere", () => {
    const ranked = rankLikelyCauses({ failure: failureAt, recentSessions: history(5) });
    expect(ranked.map((r) => r.cause)).toEqual(["unknown"]);
    expect(ranked[0]!.evidence.join(" ")).toMatch(/no recorded mode, margin or trend/);
  });

  it("keeps other causes when a mode is recorded", () => {
    const sessions = history(5, (i) => (i >= 3 ? { margins: [margin("voltage", 150, 140), margin("current", 5, 20), margin("thermal", 10, 60)] } : {}));
    const ranked = rankLikelyCauses({ failure: { ...failureAt, mode: "over_temperature" }, recentSessions: sessions });
    const overVoltage = find(ranked, "over_voltage")!;
    expect(find(ranked, "over_temperature")!.score).toBeGreaterThan(0.5);
    expect(overVoltage.score).toBeGreaterThan(0.5);
    // 150/140 = 107 % by hand.
    expect(overVoltage.evidence.join(" ")).toMatch(/107 % of rating \(over the limit\) two sessions running/);
  });

  it("ranks by score, with more evidence scoring higher", () => {
    const sessions = history(5, (i) => ({
      heatSinkEnd: 40 + 3 * i,
      margins: i === 4 ? [margin("voltage", 60, 140), margin("current", 5, 20), margin("thermal", 55, 60)] : calm(),
    }));
    const ranked = rankLikelyCauses({ failure: failureAt, recentSessions: sessions });
    for (let i = 1; i < ranked.length; i++) expect(ranked[i - 1]!.score).toBeGreaterThanOrEqual(ranked[i]!.score);
    const trendOnly = rankLikelyCauses({ failure: failureAt, recentSessions: history(5, (i) => ({ heatSinkEnd: 40 + 3 * i })) });
    expect(find(ranked, "over_temperature")!.score).toBeGreaterThan(find(trendOnly, "over_temperature")!.score);
  });

  it("weighs an estimated margin less than a measured one with the same figures", () => {
    const run = (estimated: boolean) =>
      rankLikelyCauses({
        failure: failureAt,
        recentSessions: history(5, (i) => (i === 4 ? { margins: [margin("voltage", 130, 140, estimated)] } : {})),
      });
    expect(find(run(true), "over_voltage")!.score).toBeLessThan(find(run(false), "over_voltage")!.score);
    expect(find(run(true), "over_voltage")!.evidence.join(" ")).toMatch(/\(estimated\)/);
  });

  it("ignores sessions after the failure and sessions at a different supply for trends", () => {
    const after = { ...history(1)[0]!, startedAt: day(6), margins: [margin("voltage", 200, 140)] };
    const ranked = rankLikelyCauses({ failure: failureAt, recentSessions: [...history(5), after] });
    expect(find(ranked, "over_voltage")).toBeUndefined();
    // 1 A at 12 V then 2.6 A at 24 V is a different operating point, not a rising current.
    const mixed = history(5, (i) => (i < 3 ? { supplyVoltage: 12, supplyCurrent: 1 } : { supplyCurrent: 2.6 }));
    expect(find(rankLikelyCauses({ failure: failureAt, recentSessions: mixed }), "over_current")).toBeUndefined();
  });

  it("accepts margins keyed by kind, as sessionMargins returns them", () => {
    const sessions = history(5, (i) => (i === 4 ? { margins: { voltage: margin("voltage", 145, 140), current: margin("current", 5, 20) } } : {}));
    expect(top(rankLikelyCauses({ failure: failureAt, recentSessions: sessions }))).toBe("over_voltage");
  });

  it("always returns scores in [0, 1], sorted, with unknown present", () => {
    const kinds = ["voltage", "current", "thermal"] as const;
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            use: fc.tuple(fc.double({ min: 0, max: 2, noNaN: true }), fc.double({ min: 0, max: 2, noNaN: true }), fc.double({ min: 0, max: 2, noNaN: true })),
            volts: fc.double({ min: 5, max: 300, noNaN: true }),
            amps: fc.double({ min: 0, max: 20, noNaN: true }),
            sink: fc.double({ min: 0, max: 120, noNaN: true }),
          }),
          { maxLength: 8 },
        ),
        fc.constantFrom("over_voltage", "mechanical", "unknown", undefined),
        (rows, mode) => {
          const sessions = rows.map((r, i) => ({
            startedAt: day(i),
            margins: kinds.map((k, j) => margin(k, r.use[j]!, 1)),
            supplyVoltage: r.volts,
            supplyCurrent: r.amps,
            heatSinkEnd: r.sink,
          }));
          const ranked = rankLikelyCauses({ failure: { occurredAt: day(20), mode }, recentSessions: sessions });
          expect(ranked.some((c) => c.cause === "unknown")).toBe(true);
          for (const [i, c] of ranked.entries()) {
            expect(c.score).toBeGreaterThanOrEqual(0);
            expect(c.score).toBeLessThanOrEqual(1);
            if (i > 0) expect(ranked[i - 1]!.score).toBeGreaterThanOrEqual(c.score);
          }
          expect(JSON.stringify(ranked)).not.toMatch(/NaN|Infinity/);
        },
      ),
    );
  });

  it("reads no current trend from a baseline below a bench meter's resolution (regression: 5e-324 A → 8.9e-18 A read as +1.8e308 %)", () => {
    const sessions = [5e-324, 8.88e-18].map((amps, i) => ({
      startedAt: day(i),
      margins: [margin("voltage", 0, 1), margin("current", 0, 1), margin("thermal", 0, 1)],
      supplyVoltage: 5,
      supplyCurrent: amps,
      heatSinkEnd: 0,
    }));
    const ranked = rankLikelyCauses({ failure: { occurredAt: day(20), mode: "over_voltage" }, recentSessions: sessions });
    expect(ranked.find((c) => c.cause === "over_current")?.evidence ?? []).toEqual([]);
    expect(JSON.stringify(ranked)).not.toMatch(/e\+\d{3}/);
  });

  it("names the bad field", () => {
    const bad = history(2);
    bad[1] = { ...bad[1]!, startedAt: new Date(Number.NaN) };
    expect(() => rankLikelyCauses({ failure: failureAt, recentSessions: bad })).toThrow(CalcInputError);
    expect(() => rankLikelyCauses({ failure: failureAt, recentSessions: bad })).toThrow(/^recentSessions\[1\]\.startedAt/);
    expect(() => rankLikelyCauses({ failure: { occurredAt: new Date("nope") }, recentSessions: [] })).toThrow(/^failure\.occurredAt/);
  });
});
