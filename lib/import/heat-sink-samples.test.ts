import { describe, expect, it } from "vitest";
import { describeSampleError, parseHeatSinkSamples, parseSampleTemperature, parseSampleTime } from "./heat-sink-samples";

describe("parseSampleTime", () => {
  it.each([
    ["0:30", 30],
    ["12:05", 725],
    ["1:02:03", 3723],
    ["30 s", 30],
    ["0.5 min", 30],
    ["2 min", 120],
    ["45", 45],
    ["0", 0],
  ])("reads %s as %d s", (text, seconds) => {
    expect(parseSampleTime(text)).toEqual({ ok: true, seconds });
  });

  it("refuses what is not a time, and negative times", () => {
    expect(parseSampleTime("soon")).toMatchObject({ ok: false, message: expect.stringContaining("0:30") });
    expect(parseSampleTime("-5 s")).toMatchObject({ ok: false, message: expect.stringContaining("before switch-on") });
    expect(parseSampleTime("0:75")).toMatchObject({ ok: false });
  });
});

describe("parseSampleTemperature", () => {
  it("reads °C with or without the unit and converts °F", () => {
    expect(parseSampleTemperature("31.2")).toEqual({ ok: true, celsius: 31.2 });
    expect(parseSampleTemperature("31.2 °C")).toEqual({ ok: true, celsius: 31.2 });
    const fahrenheit = parseSampleTemperature("212 °F");
    expect(fahrenheit.ok && fahrenheit.celsius).toBeCloseTo(100, 9);
  });

  it("refuses implausible readings", () => {
    expect(parseSampleTemperature("900")).toMatchObject({ ok: false, message: expect.stringContaining("250 °C") });
    expect(parseSampleTemperature("hot")).toMatchObject({ ok: false });
  });
});

describe("parseHeatSinkSamples", () => {
  it("reads pasted lines with mixed separators and time styles", () => {
    const result = parseHeatSinkSamples("0:00 22.0\n0:30, 25.5\n1 min; 28.1 °C\n90 s\t30.0\n\n2 min 31.4");
    expect(result).toEqual({
      ok: true,
      samples: [
        { elapsedS: 0, temperatureC: 22 },
        { elapsedS: 30, temperatureC: 25.5 },
        { elapsedS: 60, temperatureC: 28.1 },
        { elapsedS: 90, temperatureC: 30 },
        { elapsedS: 120, temperatureC: 31.4 },
      ],
    });
  });

  it("skips a header row and reads a CSV export with Windows line ends", () => {
    const result = parseHeatSinkSamples("time,temperature\r\n0,21.5\r\n60,27.0\r\n120,30.5\r\n");
    expect(result.ok && result.samples.map((s) => s.elapsedS)).toEqual([0, 60, 120]);
  });

  it("reports every bad row with its row and column", () => {
    const result = parseHeatSinkSamples("time,temp\n0,21\n0:30,warm\nlater,25\n2:00,28,extra\n1:00,29");
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors).toEqual([
      { row: 3, column: "temperature", message: expect.stringContaining("“warm”") },
      { row: 4, column: "time", message: expect.stringContaining("“later”") },
      { row: 5, column: "row", message: expect.stringContaining("found 3") },
    ]);
    expect(describeSampleError(result.errors[0]!)).toMatch(/^Row 3, temperature column: could not read/);
  });

  it("insists that times increase", () => {
    const result = parseHeatSinkSamples("0:00 20\n1:00 25\n0:30 26");
    expect(result).toEqual({ ok: false, errors: [{ row: 3, column: "time", message: "times must increase; 30 s does not come after 60 s" }] });
  });

  it("refuses a line with only one value", () => {
    const result = parseHeatSinkSamples("0:00 20\n25");
    expect(result).toMatchObject({ ok: false, errors: [{ row: 2, column: "row" }] });
  });

  it("gives no samples for empty text", () => {
    expect(parseHeatSinkSamples("  \n ")).toEqual({ ok: true, samples: [] });
  });
});
