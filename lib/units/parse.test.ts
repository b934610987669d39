import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { keypadFor, normalizeDecimalComma, parseClockDuration, parseDecimalNumber, parseQuantity } from "./parse";
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

describe("decimal commas and clock durations, as phones and stopwatches give them", () => {
  it("reads a decimal comma in every kind of quantity", () => {
    expect(value("3,1", "length", "mm")).toBeCloseTo(0.0031, 12);
    expect(value("0,25 mm", "wireDiameter")).toBeCloseTo(0.00025, 12);
    expect(value("2,2 nF", "capacitance")).toBeCloseTo(2.2e-9, 21);
    expect(value("-2,5 °C", "temperature")).toBe(-2.5);
    expect(value("1,2 K/W", "thermalResistance")).toBeCloseTo(1.2, 12);
    expect(value("48,5", "voltage")).toBe(48.5);
  });

  it("refuses a comma that could be a thousands separator rather than guessing", () => {
    const ambiguous = parseQuantity("1,500", "count");
    expect(ambiguous.ok).toBe(false);
    if (!ambiguous.ok) expect(ambiguous.message).toContain("1.500 or 1500");
    expect(normalizeDecimalComma("12,500 Hz").ok).toBe(false);
    // A leading zero or a fraction that is not three digits long cannot be a thousands separator.
    expect(normalizeDecimalComma("0,125")).toEqual({ ok: true, text: "0.125" });
    expect(normalizeDecimalComma("12,50 mm")).toEqual({ ok: true, text: "12.50 mm" });
    expect(parseQuantity("3,1,4", "length").ok).toBe(false);
  });

  it("reads minutes:seconds and hours:minutes:seconds as a duration, whatever unit a bare number takes", () => {
    expect(parseClockDuration("4:00")).toBe(240);
    expect(parseClockDuration("0:30.5")).toBe(30.5);
    expect(parseClockDuration("1:02:03")).toBe(3723);
    expect(parseClockDuration("4:75")).toBeNull();
    expect(parseClockDuration("4 min")).toBeNull();
    expect(value("4:00", "time", "min")).toBe(240);
    expect(value("12:30", "time")).toBe(750);
    expect(value("4", "time", "min")).toBe(240);
    // A clock reading is a duration, not a length or a voltage.
    expect(parseQuantity("4:00", "length").ok).toBe(false);
  });

  it("reads plain numbers with a point or a comma and names what it could not read", () => {
    expect(parseDecimalNumber("2,5")).toEqual({ ok: true, value: 2.5 });
    expect(parseDecimalNumber(" 10 ")).toEqual({ ok: true, value: 10 });
    expect(parseDecimalNumber("−3")).toEqual({ ok: true, value: -3 });
    expect(parseDecimalNumber("2.5 turns").ok).toBe(false);
    expect(parseDecimalNumber("").ok).toBe(false);
    expect(parseDecimalNumber("1,000").ok).toBe(false);
  });

  it("reads any decimal written with a comma as the same value written with a point (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 99 }), fc.integer({ min: 0, max: 9999 }), (whole, fraction) => {
        const digits = String(fraction);
        // Skip the one spelling that is refused as ambiguous: a non-zero whole part and three fraction digits.
        fc.pre(!(whole > 0 && digits.length === 3));
        const withComma = parseDecimalNumber(`${whole},${digits}`);
        const withPoint = parseDecimalNumber(`${whole}.${digits}`);
        expect(withComma).toEqual(withPoint);
      }),
    );
  });
});

describe("keypadFor", () => {
  it("asks for the decimal keypad where a bare number is the usual entry and the full keyboard where letters are", () => {
    expect(keypadFor("length", "mm")).toBe("decimal");
    expect(keypadFor("time", "min")).toBe("decimal");
    expect(keypadFor("temperature")).toBe("decimal");
    expect(keypadFor("voltage")).toBe("decimal");
    expect(keypadFor("count")).toBe("decimal");
    // "330k", "2n2", "4k7", "AWG 28": a bare number would be hertz, farads or ohms, or no gauge at all.
    expect(keypadFor("frequency")).toBe("text");
    expect(keypadFor("capacitance")).toBe("text");
    expect(keypadFor("resistance")).toBe("text");
    expect(keypadFor("wireDiameter", "mm")).toBe("text");
    expect(keypadFor("frequency", "kHz")).toBe("decimal");
  });
});
