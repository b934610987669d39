import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { describeChart, trendDirection } from "./chart-summary";

const day = (iso: string) => Date.parse(`${iso}T00:00:00Z`);

describe("trendDirection", () => {
  it("reads a steady climb as rising and a steady fall as falling", () => {
    expect(trendDirection([{ x: 0, y: 1 }, { x: 1, y: 2 }, { x: 2, y: 3 }])).toBe("rising");
    expect(trendDirection([{ x: 0, y: 3 }, { x: 1, y: 2 }, { x: 2, y: 1 }])).toBe("falling");
  });

  it("reads a zig-zag with no net drift as roughly flat", () => {
    // Least-squares slope of (0,1),(1,3),(2,1),(3,3),(4,1),(5,3),(6,1) is 0: symmetric about x = 3 except the ends,
    // so the fitted change is far below a tenth of the spread (2).
    expect(trendDirection([1, 3, 1, 3, 1, 3, 1].map((y, x) => ({ x, y })))).toBe("roughly flat");
    expect(trendDirection([{ x: 0, y: 5 }, { x: 1, y: 5 }])).toBe("roughly flat");
  });

  it("has no trend for one point or points all at one x", () => {
    expect(trendDirection([{ x: 4, y: 2 }])).toBeNull();
    expect(trendDirection([{ x: 4, y: 2 }, { x: 4, y: 7 }])).toBeNull();
  });

  it("flips with the data: mirroring y turns rising into falling", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 3, maxLength: 30 }), (ys) => {
        const up = trendDirection(ys.map((y, x) => ({ x, y })));
        const down = trendDirection(ys.map((y, x) => ({ x, y: -y })));
        const mirror = { rising: "falling", falling: "rising", "roughly flat": "roughly flat" } as const;
        expect(down).toBe(up === null ? null : mirror[up]);
      }),
    );
  });
});

describe("describeChart", () => {
  it("names what is plotted, the range, the latest value and the trend", () => {
    const text = describeChart(
      "Thermal headroom",
      [
        { label: "Headroom per session", points: [{ x: day("2026-03-01"), y: 0.4 }, { x: day("2026-05-01"), y: 0.3 }, { x: day("2026-07-01"), y: 0.2 }] },
        { label: "Policy threshold (15 %)", points: [{ x: day("2026-03-01"), y: 0.15 }, { x: day("2026-07-01"), y: 0.15 }], style: "line" },
      ],
      { label: "Date", format: "date" },
      { label: "Headroom", format: "percent" },
    );
    expect(text).toBe(
      "Thermal headroom: Headroom against Date, 3 points of Headroom per session from 2026-03-01 to 2026-07-01. " +
        "Values range from 20 % to 40 %. Latest: 20 % at 2026-07-01. Trend: falling. Also shown: Policy threshold (15 %).",
    );
  });

  it("takes the latest value by x, not by the order the points were given in", () => {
    const text = describeChart(
      "Sink temperature",
      [{ label: "Sink", points: [{ x: 90, y: 60 }, { x: 0, y: 25 }, { x: 30, y: 45 }] }],
      { label: "Time", format: "duration" },
      { label: "Temperature", format: "celsius" },
    );
    expect(text).toContain("Latest: 60 °C at 90 s.");
    expect(text).toContain("Trend: rising.");
  });

  it("summarises the measured series rather than a marker series listed first", () => {
    const text = describeChart(
      "Impedance",
      [
        { label: "Series resonances", points: [{ x: 250_000, y: 12 }], style: "marker" },
        { label: "|Z|", points: [{ x: 100_000, y: 900 }, { x: 250_000, y: 12 }, { x: 400_000, y: 700 }] },
      ],
      { label: "Frequency", format: "frequency" },
      { label: "|Z|", format: "ohms" },
    );
    expect(text).toContain("3 points of |Z| from 100 kHz to 400 kHz");
    expect(text).toContain("Values range from 12 Ω to 900 Ω.");
    expect(text).toContain("Also shown: Series resonances.");
  });

  it("says so when there is nothing to plot, and has no trend for a single point", () => {
    expect(describeChart("Warm-up", [{ label: "Sink", points: [] }], { label: "Time" }, { label: "T" })).toBe("Warm-up: no data to plot yet.");
    const single = describeChart("Warm-up", [{ label: "Sink", points: [{ x: 30, y: 41 }] }], { label: "Time", format: "duration" }, { label: "T", format: "celsius" });
    expect(single).toBe("Warm-up: T against Time, 1 point of Sink at 30 s. Latest: 41 °C at 30 s.");
  });
});
