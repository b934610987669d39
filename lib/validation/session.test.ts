import { describe, expect, it } from "vitest";
import { sessionSchema, toLocalDateTimeValue } from "./session";

const base = {
  coilId: "c1",
  startedAt: "2026-01-10T14:05",
  supplyVoltageV: "48 V",
  supplyCurrentA: "2.5",
  durationS: "12 min",
  ambientTempC: "21",
  runningFrequencyHz: "334k",
  samples: "0:00 21\n6:00 38\n12 min 45",
};

describe("sessionSchema", () => {
  it("reads bench notation into SI", () => {
    const parsed = sessionSchema.parse({ ...base, dutyCycle: "42 %", durationS: "720 s" });
    expect(parsed).toMatchObject({ supplyVoltageV: 48, supplyCurrentA: 2.5, durationS: 720, runningFrequencyHz: 334_000, dutyCycle: 0.42, outcome: "normal" });
    expect(parsed.samples).toHaveLength(3);
    expect(toLocalDateTimeValue(parsed.startedAt)).toBe("2026-01-10T14:05");
  });

  it("reads a bare duration as minutes", () => {
    expect(sessionSchema.parse({ ...base, durationS: "12" }).durationS).toBe(720);
  });

  it("names each bad field", () => {
    const result = sessionSchema.safeParse({ ...base, supplyVoltageV: "48 kV", dutyCycle: "1.5", samples: "0:00 21\n1:00 lots", startedAt: "yesterday" });
    expect(result.success).toBe(false);
    const messages = Object.fromEntries(result.error!.issues.map((i) => [i.path.join("."), i.message]));
    expect(messages.supplyVoltageV).toMatch(/^Supply voltage must be between/);
    expect(messages.dutyCycle).toMatch(/^Duty cycle/);
    expect(messages.samples).toMatch(/Row 2, temperature column/);
    expect(messages.startedAt).toMatch(/^Started at/);
  });

  it("refuses a peak switch voltage below the supply and samples after the run", () => {
    const result = sessionSchema.safeParse({ ...base, peakSwitchVoltageV: "30", samples: "0 21\n60 min 50" });
    const paths = result.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["peakSwitchVoltageV", "samples"]));
  });

  it("refuses a start in the future", () => {
    const next = new Date(Date.now() + 2 * 3600_000);
    expect(sessionSchema.safeParse({ ...base, startedAt: toLocalDateTimeValue(next) }).success).toBe(false);
  });
});
