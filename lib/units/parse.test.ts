import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { parseQuantity } from "./parse";
import { formatQuantity } from "./format";

const value = (text: string, kind: Parameters<typeof parseQuantity>[1], defaultUnit?: string) => {
  const r = parseQuantity(text, kind, defaultUnit);
  if (!r.ok) throw new Error(r.message);
  return r.value;
};

describe("parseQuantity", () => {
  it("reads SI prefixes with and without the unit (SI Brochure, 9th ed., table 7)", () => {
    expect(value("330 kHz", "frequency")).toBe(330_000);
    expect(value("330k", "frequency")).toBe(330_000);
    expect(value("1.2MHz", "frequency")).toBe(1_200_000);
    expect(value("2.2 nF", "capacitance")).toBeCloseTo(2.2e-9, 21);
    expect(value("47 kΩ", "resistance")).toBe(47_000);
    expect(value("47k", "resistance")).toBe(47_000);
    expect(value("1M", "resistance")).toBe(1_000_000);
    expect(value("31.5 mH", "inductance")).toBeCloseTo(0.0315, 12);
    expect(value("800 mA", "current")).toBeCloseTo(0.8, 12);
    expect(value("10 µF", "capacitance")).toBeCloseTo(1e-5, 18);
    expect(value("10 uF", "capacitance")).toBeCloseTo(1e-5, 18);
  });

  it("reads an amplitude written with how it was read (Vpp, Vp-p, Vpk) as volts", () => {
    expect(value("2 Vpp", "voltage")).toBe(2);
    expect(value("2Vpp", "voltage")).toBe(2);
    expect(value("500 mVpp", "voltage")).toBeCloseTo(0.5, 12);
    expect(value("10 Vp-p", "voltage")).toBe(10);
    expect(value("1.5 Vpk", "voltage")).toBe(1.5);
    expect(parseQuantity("2 Vpp", "current").ok).toBe(false);
  });

  it("reads schematic notation, where the prefix letter is the decimal point (IEC 60062 resistor and capacitor code)", () => {
    expect(value("4k7", "resistance")).toBe(4700);
    expect(value("2n2", "capacitance")).toBeCloseTo(2.2e-9, 21);
    expect(value("4R7", "resistance")).toBeCloseTo(4.7, 12);
  });

  it("reads lengths in metric and imperial units (1 in = 25.4 mm exactly, international yard and pound agreement 1959)", () => {
    expect(value("75 mm", "length")).toBeCloseTo(0.075, 12);
    expect(value("3 in", "length")).toBeCloseTo(0.0762, 12);
    expect(value('3"', "length")).toBeCloseTo(0.0762, 12);
    expect(value("75", "length", "mm")).toBeCloseTo(0.075, 12);
  });

  it("reads wire sizes as a gauge or a diameter (ASTM B258: AWG 36 = 0.005 in)", () => {
    expect(value("AWG 36", "wireDiameter")).toBeCloseTo(0.127e-3, 9);
    expect(value("36 awg", "wireDiameter")).toBeCloseTo(0.127e-3, 9);
    expect(value("0.32 mm", "wireDiameter")).toBeCloseTo(0.32e-3, 12);
    const r = parseQuantity("AWG 80", "wireDiameter");
    expect(r.ok).toBe(false);
  });

  it("takes mhz to mean megahertz (millihertz is never a coil frequency — common practice)", () => {
    expect(value("1.1 mhz", "frequency")).toBe(1_100_000);
    expect(value("1.1 mHz", "frequency")).toBe(1_100_000);
  });

  it("reads temperatures, durations and thermal resistances (°F→°C: (F − 32)·5/9, NIST SP 811 appendix B)", () => {
    expect(value("-12 °C", "temperature")).toBe(-12);
    expect(value("45C", "temperature")).toBe(45);
    expect(value("212 °F", "temperature")).toBeCloseTo(100, 10);
    expect(value("12 min", "time")).toBe(720);
    expect(value("1.2 K/W", "thermalResistance")).toBeCloseTo(1.2, 12);
    expect(value("900 turns", "count")).toBe(900);
  });

  it("rejects nonsense with a message naming what was expected", () => {
    for (const [text, kind] of [["abc", "frequency"], ["12 furlongs", "length"], ["3 kg", "voltage"], ["", "current"], ["1.5", "count"]] as const) {
      const r = parseQuantity(text, kind);
      expect(r.ok, text).toBe(false);
      if (!r.ok) expect(r.message.length).toBeGreaterThan(10);
    }
    const r = parseQuantity("12 furlongs", "length");
    expect(r.ok ? "" : r.message).toMatch(/Could not read “12 furlongs” as a length: try 75 mm or 3 in/);
  });

  it("round-trips what formatQuantity prints (property)", () => {
    // Frequencies from 1 Hz up: below that "mHz" is read as megahertz on purpose (see above).
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e9, noNaN: true }), (x) => {
        const back = value(formatQuantity(x, "Hz", 6), "frequency");
        expect(Math.abs(back - x) / x).toBeLessThan(1e-5);
      }),
    );
    fc.assert(
      fc.property(fc.double({ min: 1e-14, max: 1, noNaN: true }), (x) => {
        const back = value(formatQuantity(x, "F", 6), "capacitance");
        expect(Math.abs(back - x) / x).toBeLessThan(1e-5);
      }),
    );
  });
});
