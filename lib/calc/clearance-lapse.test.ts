import { describe, expect, it } from "vitest";
import { clearanceLapse, type ClearanceLapseInput } from "./clearance-lapse";
import { CalcInputError } from "./errors";

// 1 March 2025 12:00 UTC plus n days; 9 March is the daylight-saving change in St John's (tests run there).
const day = (n: number) => new Date(Date.UTC(2025, 2, 1, 12, 0) + n * 86_400_000);
const cleared = { decidedAt: day(0), validUntil: day(60), verdict: "cleared" as const };
const run = (over: Partial<ClearanceLapseInput>) => clearanceLapse({ clearance: cleared, failuresSince: [], partReplacementsSince: [], now: day(30), ...over });

describe("clearanceLapse", () => {
  it("stands while nothing has happened and it has not expired", () => {
    const r = run({});
    expect(r).toMatchObject({ lapsed: false, reason: null, at: null });
    expect(r.explanation).toMatch(/Stands until 2025-04-30 12:00 UTC \(30 full days left\)/);
  });

  it("expires at validUntil, the instant itself included", () => {
    const r = run({ now: day(60) });
    expect(r).toMatchObject({ lapsed: true, reason: "expired" });
    expect(r.at!.getTime()).toBe(day(60).getTime());
    expect(run({ now: new Date(day(60).getTime() - 1) }).lapsed).toBe(false);
  });

  it("lapses on a failure, at the failure's instant", () => {
    const r = run({ failuresSince: [{ occurredAt: day(8), mode: "over_voltage" }] });
    expect(r).toMatchObject({ lapsed: true, reason: "failure" });
    expect(r.at!.toISOString()).toBe("2025-03-09T12:00:00.000Z");
    expect(r.explanation).toMatch(/^Lapsed on 2025-03-09 12:00 UTC: failure recorded \(over voltage\)/);
    expect(r.cause).toBe("failure recorded (over voltage) on 2025-03-09 12:00 UTC");
  });

  it("lapses on a part replacement", () => {
    const r = run({ partReplacementsSince: [{ at: day(12), partDescription: "switch MJE13009 → MJE13009" }] });
    expect(r).toMatchObject({ lapsed: true, reason: "part-replaced" });
    expect(r.explanation).toMatch(/part replaced \(switch MJE13009 → MJE13009\)/);
  });

  it("reports whichever happened first and lists the rest", () => {
    const r = run({ failuresSince: [{ occurredAt: day(10), mode: "over_temperature" }], partReplacementsSince: [{ at: day(5), partDescription: "fan" }] });
    expect(r.reason).toBe("part-replaced");
    expect(r.at!.getTime()).toBe(day(5).getTime());
    expect(r.explanation).toMatch(/Since then: failure recorded \(over temperature\) on 2025-03-11 12:00 UTC/);
    expect(r.cause).toBe("part replaced (fan) on 2025-03-06 12:00 UTC");
    const afterExpiry = run({ now: day(70), failuresSince: [{ occurredAt: day(65), mode: "mechanical" }] });
    expect(afterExpiry.reason).toBe("expired");
  });

  it("breaks ties failure, then part replacement, then expiry", () => {
    const tie = { failuresSince: [{ occurredAt: day(7), mode: "over_current" }], partReplacementsSince: [{ at: day(7), partDescription: "switch" }] };
    expect(run(tie).reason).toBe("failure");
    expect(run({ now: day(61), partReplacementsSince: [{ at: day(60), partDescription: "sink" }] }).reason).toBe("part-replaced");
    expect(run({ now: day(61), failuresSince: [{ occurredAt: day(60), mode: "unknown" }] }).reason).toBe("failure");
  });

  it("ignores events before the decision or after now, but counts one at the decision instant", () => {
    expect(run({ failuresSince: [{ occurredAt: day(-1), mode: "over_voltage" }] }).lapsed).toBe(false);
    expect(run({ partReplacementsSince: [{ at: day(31), partDescription: "switch" }] }).lapsed).toBe(false);
    expect(run({ failuresSince: [{ occurredAt: day(0), mode: "over_voltage" }] }).reason).toBe("failure");
  });

  it("never treats a refused clearance as valid", () => {
    const r = run({ clearance: { ...cleared, verdict: "refused" }, now: day(1) });
    expect(r).toMatchObject({ lapsed: true, reason: null });
    expect(r.at!.getTime()).toBe(day(0).getTime());
    expect(r.explanation).toMatch(/never valid/);
  });

  it("refuses impossible input, naming the field", () => {
    expect(() => run({ clearance: { ...cleared, validUntil: day(0) } })).toThrow(/^clearance\.validUntil/);
    expect(() => run({ now: new Date(Number.NaN) })).toThrow(CalcInputError);
    expect(() => run({ failuresSince: [{ occurredAt: day(3), mode: "x" }, { occurredAt: new Date("bad"), mode: "x" }] })).toThrow(/^failuresSince\[1\]\.occurredAt/);
  });
});
