import { describe, expect, it } from "vitest";
import { shortenReason } from "./short-reason";

describe("shortenReason", () => {
  it("keeps the leading clause of a reason", () => {
    expect(shortenReason("A failure (over current) recorded on 2026-11-02 is still open: the coil is on hold until its post-mortem is complete.")).toBe(
      "A failure (over current) recorded on 2026-11-02 is still open",
    );
    expect(shortenReason("Every margin with a trend is above its limit and not heading for it within 30 days (12 sessions).")).toBe(
      "Every margin with a trend is above its limit and not heading for it within 30 days",
    );
  });

  it("ignores a break so early that the clause would say nothing", () => {
    expect(shortenReason("Thermal: headroom 12 % is below the policy's 20 %.")).toBe("Thermal: headroom 12 % is below the policy's 20 %");
  });

  it("cuts a long clause at a word boundary and marks the cut", () => {
    const long = "word ".repeat(40).trim();
    const short = shortenReason(long, 30);
    expect(short.length).toBeLessThanOrEqual(30);
    expect(short.endsWith("word…")).toBe(true);
  });

  it("leaves a short reason as it is, without its full stop", () => {
    expect(shortenReason("Not enough sessions yet.")).toBe("Not enough sessions yet");
  });
});
