import { describe, expect, it } from "vitest";
import { formatCount, formatDate, formatDuration, formatPercent, formatQuantitiesInText, formatQuantity } from "./format";

describe("formatQuantity", () => {
  it("picks the SI prefix (SI Brochure, 9th ed., table 7)", () => {
    expect(formatQuantity(321_000, "Hz")).toBe("321 kHz");
    expect(formatQuantity(2.2e-9, "F")).toBe("2.2 nF");
    expect(formatQuantity(47_000, "Ω")).toBe("47 kΩ");
    expect(formatQuantity(0.0315, "H")).toBe("31.5 mH");
    expect(formatQuantity(12e-12, "F")).toBe("12 pF");
    expect(formatQuantity(-5, "A")).toBe("-5 A");
  });
  it("rounds up across a prefix boundary instead of printing 1000 k", () => {
    expect(formatQuantity(999_999, "Hz")).toBe("1 MHz");
  });
  it("shows a dash for missing values", () => {
    expect(formatQuantity(null, "Hz")).toBe("—");
    expect(formatQuantity(Number.NaN, "Hz")).toBe("—");
  });
});

describe("formatDuration and formatDate", () => {
  it("reads like a bench note", () => {
    expect(formatDuration(45)).toBe("45 s");
    expect(formatDuration(750)).toBe("12 min 30 s");
    expect(formatDuration(3900)).toBe("1 h 05 min");
  });
  it("uses the process time zone, not UTC", () => {
    // 02:00 UTC on 2 Dec is still 1 Dec in St John's (UTC−3:30); the unit tests run with TZ=America/St_Johns.
    const d = new Date("2026-12-02T02:00:00Z");
    const expected = process.env.TZ === "America/St_Johns" ? "2026-12-01" : d.toLocaleDateString("en-CA");
    expect(formatDate(d)).toBe(expected);
  });
});

describe("formatPercent", () => {
  it("rounds to the decimals asked for and never shows a negative zero", () => {
    expect(formatPercent(0.1234, 1)).toBe("12.3 %");
    expect(formatPercent(-0.00001, 1)).toBe("0.0 %");
    expect(formatPercent(-0.0006, 1)).toBe("-0.1 %");
    expect(formatPercent(null)).toBe("—");
  });
});

describe("formatQuantitiesInText", () => {
  it("gives bare SI figures in free text their prefixes, and leaves everything else alone", () => {
    expect(formatQuantitiesInText("Recorded a 120-point sweep of KM-01, first series resonance 330962 Hz")).toBe(
      "Recorded a 120-point sweep of KM-01, first series resonance 331 kHz",
    );
    expect(formatQuantitiesInText("Logged a 10 min session on KM-02 at 160 V with 6 heat-sink samples")).toBe("Logged a 10 min session on KM-02 at 160 V with 6 heat-sink samples");
    expect(formatQuantitiesInText("primary 0.0000022 F, secondary 0.0215 H")).toBe("primary 2.2 µF, secondary 21.5 mH");
    // Not a unit: a word that starts with one, a tag's digits, a version.
    expect(formatQuantitiesInText("KM-02 2 Alpha v1.2 Hzx 3 Volts")).toBe("KM-02 2 Alpha v1.2 Hzx 3 Volts");
  });
});

describe("formatCount", () => {
  it("agrees the noun with the count", () => {
    expect(formatCount(1, "version")).toBe("1 version");
    expect(formatCount(0, "version")).toBe("0 versions");
    expect(formatCount(2, "entry", "entries")).toBe("2 entries");
    expect(formatCount(1, "entry", "entries")).toBe("1 entry");
  });
});
