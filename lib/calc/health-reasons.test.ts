import { describe, expect, it } from "vitest";
import {
  describeBaseline,
  describeFallingMargin,
  describeMarginBelowLimit,
  describeShift,
  formatFigure,
  formatFrequency,
  formatIsoDate,
  formatPercent,
} from "./health-reasons";

describe("formatting", () => {
  it("writes dates as the UTC calendar day whatever the local time zone", () => {
    // 01:30 UTC is 22:00 the evening before in St John's (the tests' TZ)
    expect(formatIsoDate(new Date("2026-03-14T01:30:00Z"))).toBe("2026-03-14");
  });

  it("rounds figures to what a reading can support", () => {
    expect(formatFigure(1.234)).toBe("1.2");
    expect(formatFigure(14)).toBe("14");
    expect(formatFigure(0.0456)).toBe("0.046");
    expect(formatFigure(-2.5)).toBe("−2.5");
    expect(formatFigure(432.6)).toBe("433");
    expect(formatPercent(0.06)).toBe("6 %");
    expect(formatFrequency(253_840)).toBe("253.8 kHz");
    expect(formatFrequency(1_204_000)).toBe("1.204 MHz");
  });
});

describe("sentences", () => {
  it("state a margin below its limit with the session date", () => {
    expect(describeMarginBelowLimit("thermal headroom", 0.06, 0.1, new Date("2026-05-02T19:00:00Z"))).toBe(
      "Latest thermal headroom is 6 %, below the 10 % limit (session of 2026-05-02).",
    );
  });

  it("state a falling margin with its rate, range, crossing date and session count", () => {
    const text = describeFallingMargin({
      label: "voltage headroom",
      perMonth: -0.012,
      perMonthLow: -0.019,
      perMonthHigh: -0.006,
      confidence: 0.95,
      pValue: 0.0031,
      threshold: 0.2,
      crossing: {
        at: new Date("2027-03-14T00:00:00Z"),
        earliest: new Date("2026-12-01T00:00:00Z"),
        latest: null,
        daysAway: 120,
        sessionsAway: 9,
        alreadyReached: false,
      },
    });
    expect(text).toBe(
      "Voltage headroom is falling about 1.2 points a month (95 % range 0.6 to 1.9; p = 0.0031). " +
        "At this rate it reaches the 20 % limit around 2027-03-14 (in about 9 sessions; " +
        "95 % range 2026-12-01 to never, at the slowest plausible rate).",
    );
  });

  it("name what a baseline comparison compares", () => {
    expect(describeBaseline("first observations", 1, 1, "sweeps")).toBe("the latest sweep against the first");
    expect(describeBaseline("explicit", 0, 3, "sessions")).toBe("the median of the last 3 sessions against the recorded baseline");
  });

  it("state a shift with its sign and rate", () => {
    expect(
      describeShift({
        subject: "supply current at comparable supply voltage",
        shiftFraction: 0.14,
        baselineWords: describeBaseline("first observations", 3, 3, "sessions"),
        trend: { perMonth: 0.021, perMonthLow: 0.012, perMonthHigh: 0.03, confidence: 0.95 },
      }),
    ).toBe(
      "Supply current at comparable supply voltage is up 14 % since the baseline (the median of the last 3 sessions " +
        "against the first 3), changing about +2.1 % a month (95 % range +1.2 % to +3 %).",
    );
  });
});
