import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { chooseAxisTicks, chooseTickUnit, niceStep } from "./axis-ticks";

const labels = (min: number, max: number, quantity: Parameters<typeof chooseAxisTicks>[2], maxTicks?: number) => chooseAxisTicks(min, max, quantity, maxTicks).ticks.map((t) => t.label);

describe("chooseAxisTicks", () => {
  it("labels a twelve-minute warm-up in whole minutes, not a mix of seconds and minutes", () => {
    expect(labels(0, 720, "duration")).toEqual(["0 min", "2 min", "4 min", "6 min", "8 min", "10 min", "12 min"]);
  });

  it("keeps short runs in seconds and long ones in hours", () => {
    expect(labels(0, 90, "duration")).toEqual(["0 s", "20 s", "40 s", "60 s", "80 s"]);
    expect(labels(0, 4 * 3600, "duration")).toEqual(["0 h", "1 h", "2 h", "3 h", "4 h"]);
  });

  it("labels a frequency axis in one prefix", () => {
    expect(labels(280e3, 380e3, "frequency")).toEqual(["280 kHz", "300 kHz", "320 kHz", "340 kHz", "360 kHz", "380 kHz"]);
    // Not "500 kHz, 1 MHz": the whole axis takes the prefix of its largest value.
    expect(labels(0.5e6, 1.5e6, "frequency")).toEqual(["0.6 MHz", "0.8 MHz", "1 MHz", "1.2 MHz", "1.4 MHz"]);
  });

  it("writes fractions as percent and temperatures in °C", () => {
    expect(labels(0, 0.5, "percent")).toEqual(["0 %", "10 %", "20 %", "30 %", "40 %", "50 %"]);
    expect(labels(21.3, 44.8, "celsius")).toEqual(["25 °C", "30 °C", "35 °C", "40 °C"]);
  });

  it("gives one tick for a one-value range and refuses a reversed one", () => {
    expect(labels(300, 300, "duration")).toEqual(["5 min"]);
    expect(() => chooseAxisTicks(5, 1, "plain")).toThrow(RangeError);
    expect(() => chooseAxisTicks(0, 1, "plain", 1)).toThrow(RangeError);
  });

  it("always gives 1-2-5 steps inside the range, within the limit, in one unit (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e7, max: 1e7, noNaN: true }),
        fc.double({ min: 1e-3, max: 1e7, noNaN: true }),
        fc.constantFrom("duration" as const, "frequency" as const, "plain" as const),
        fc.integer({ min: 2, max: 12 }),
        (min, span, quantity, maxTicks) => {
          // Chart axes span at least a millionth of their magnitude; narrower, float spacing itself is not round.
          fc.pre(span > Math.abs(min) * 1e-6);
          const max = min + span;
          const { unit, ticks } = chooseAxisTicks(min, max, quantity, maxTicks);
          expect(ticks.length).toBeGreaterThanOrEqual(1);
          expect(ticks.length).toBeLessThanOrEqual(maxTicks);
          for (const tick of ticks) {
            expect(tick.value).toBeGreaterThanOrEqual(min - span * 1e-6);
            expect(tick.value).toBeLessThanOrEqual(max + span * 1e-6);
            expect(unit.symbol === "" ? true : tick.label.endsWith(` ${unit.symbol}`)).toBe(true);
          }
          expect(new Set(ticks.map((t) => t.label)).size).toBe(ticks.length);
          if (ticks.length >= 2) {
            const step = (ticks[1]!.value - ticks[0]!.value) / unit.factor;
            const mantissa = step / 10 ** Math.floor(Math.log10(step) + 1e-9);
            expect([1, 2, 5, 10].some((m) => Math.abs(mantissa - m) < 1e-4)).toBe(true);
          }
        },
      ),
    );
  });
});

describe("niceStep and chooseTickUnit", () => {
  it("rounds a raw step up to 1, 2 or 5 × 10^k", () => {
    expect(niceStep(1.71)).toBe(2);
    expect(niceStep(0.3)).toBeCloseTo(0.5, 12);
    expect(niceStep(7)).toBe(10);
    expect(niceStep(20)).toBe(20);
    expect(() => niceStep(0)).toThrow(RangeError);
  });

  it("chooses seconds below two minutes and minutes below two hours", () => {
    expect(chooseTickUnit(100, "duration").symbol).toBe("s");
    expect(chooseTickUnit(200, "duration").symbol).toBe("min");
    expect(chooseTickUnit(7200, "duration").symbol).toBe("h");
    expect(chooseTickUnit(330e3, "frequency").symbol).toBe("kHz");
  });
});
