/**
 * Reading engineering quantities the way people type them at the bench: "330k", "330 kHz",
 * "2.2 nF", "2n2", "47 kΩ", "4k7", "75 mm", "3 in", "AWG 28", "-12 °C", with a decimal comma as a phone
 * set to many locales types it ("3,1 mm"), and durations on a clock ("4:00", "1:02:03"). Returns the value
 * in SI (°C for temperatures) or a message saying what was expected.
 *
 * Hand-written rather than a units library: the general-purpose ones (mathjs, js-quantities) parse
 * "330 kHz" but not bare prefixed numbers ("47k"), schematic notation ("4k7"), the Ω sign or wire
 * gauges, and they would pull in a large dependency for a grammar that fits on one page.
 */
import { awgDiameter } from "../calc/wire";

export type QuantityKind =
  | "frequency"
  | "capacitance"
  | "inductance"
  | "resistance"
  | "voltage"
  | "current"
  | "power"
  | "length"
  | "wireDiameter"
  | "time"
  | "temperature"
  | "thermalResistance"
  | "mass"
  | "count";

export type ParsedQuantity = { ok: true; value: number; unit: string } | { ok: false; message: string };

interface KindSpec {
  noun: string;
  /** The SI unit the value is returned in. */
  unit: string;
  /** Unit spellings (lower-cased where `caseless`) → factor to the SI unit; "" is the bare number. */
  units: Record<string, number>;
  /** Whether a bare SI prefix ("47k") may stand for the unit. */
  prefixAlone: boolean;
  example: string;
}

const PREFIX: Record<string, number> = { f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, "µ": 1e-6, "μ": 1e-6, m: 1e-3, k: 1e3, K: 1e3, M: 1e6, G: 1e9 };

function prefixed(symbols: string[], base = 1): Record<string, number> {
  const out: Record<string, number> = {};
  for (const symbol of symbols) {
    out[symbol] = base;
    for (const [p, f] of Object.entries(PREFIX)) out[p + symbol] = f * base;
  }
  return out;
}

const SPECS: Record<QuantityKind, KindSpec> = {
  frequency: { noun: "a frequency", unit: "Hz", units: prefixed(["Hz", "hz"]), prefixAlone: true, example: "330 kHz or 330k" },
  capacitance: { noun: "a capacitance", unit: "F", units: prefixed(["F"]), prefixAlone: true, example: "2.2 nF or 2n2" },
  inductance: { noun: "an inductance", unit: "H", units: prefixed(["H"]), prefixAlone: true, example: "31.5 mH" },
  resistance: { noun: "a resistance", unit: "Ω", units: prefixed(["Ω", "ohm", "ohms", "Ohm", "R"]), prefixAlone: true, example: "47 kΩ, 47k or 4k7" },
  // "Vpp", "Vp-p" and "Vpk" name how an amplitude was read, not another unit: the sweep records that convention
  // separately, so the figure is taken as volts.
  voltage: { noun: "a voltage", unit: "V", units: prefixed(["V", "Vpp", "Vp-p", "Vpk", "Vp"]), prefixAlone: true, example: "24 V" },
  current: { noun: "a current", unit: "A", units: prefixed(["A"]), prefixAlone: true, example: "2.5 A or 800 mA" },
  power: { noun: "a power", unit: "W", units: prefixed(["W"]), prefixAlone: true, example: "100 W" },
  length: {
    noun: "a length",
    unit: "m",
    units: { m: 1, mm: 1e-3, cm: 1e-2, "µm": 1e-6, um: 1e-6, in: 0.0254, inch: 0.0254, inches: 0.0254, '"': 0.0254, ft: 0.3048, mil: 25.4e-6, mils: 25.4e-6 },
    prefixAlone: false,
    example: "75 mm or 3 in",
  },
  wireDiameter: {
    noun: "a wire size",
    unit: "m",
    units: { m: 1, mm: 1e-3, cm: 1e-2, "µm": 1e-6, um: 1e-6, in: 0.0254, inch: 0.0254, '"': 0.0254, mil: 25.4e-6, mils: 25.4e-6 },
    prefixAlone: false,
    example: "AWG 28 or 0.32 mm",
  },
  time: { noun: "a duration", unit: "s", units: { s: 1, sec: 1, secs: 1, ms: 1e-3, min: 60, mins: 60, h: 3600, hr: 3600, hrs: 3600 }, prefixAlone: false, example: "12 min, 12:00 or 720 s" },
  temperature: { noun: "a temperature", unit: "°C", units: { "°C": 1, C: 1, degC: 1, "℃": 1 }, prefixAlone: false, example: "45 °C" },
  thermalResistance: { noun: "a thermal resistance", unit: "K/W", units: { "K/W": 1, "°C/W": 1, "C/W": 1 }, prefixAlone: false, example: "1.2 K/W" },
  mass: { noun: "a mass", unit: "kg", units: { kg: 1, g: 1e-3 }, prefixAlone: false, example: "150 g" },
  count: { noun: "a count", unit: "", units: { turns: 1, turn: 1, t: 1 }, prefixAlone: false, example: "900 or 900 turns" },
};

/** Durations as a stopwatch shows them: m:ss ("4:00") or h:mm:ss ("1:02:03"). */
const CLOCK = /^(\d+):([0-5]?\d(?:\.\d+)?)$|^(\d+):([0-5]?\d):([0-5]?\d(?:\.\d+)?)$/;

/**
 * Seconds from a stopwatch reading ("4:00" = 240, "1:02:03" = 3723), or null when `text` is not one.
 * Minutes:seconds, not hours:minutes: a bench run is timed, not scheduled.
 */
export function parseClockDuration(text: string): number | null {
  const clock = CLOCK.exec(text.trim());
  if (!clock) return null;
  return clock[1] !== undefined ? Number(clock[1]) * 60 + Number(clock[2]) : Number(clock[3]) * 3600 + Number(clock[4]) * 60 + Number(clock[5]);
}

/** A number written with a decimal comma at its start ("3,1", "0,25 mm", "-2,5"). */
const DECIMAL_COMMA = /^([+-]?\d+),(\d+)(?![\d.,])/;
/** "1,500" may be one and a half or fifteen hundred: a comma before exactly three digits after a non-zero whole part. */
const AMBIGUOUS_COMMA = /^([+-]?[1-9]\d{0,2}),(\d{3})(?![\d.,])/;

export type DecimalCommaResult = { ok: true; text: string } | { ok: false; message: string };

/**
 * Rewrites a leading decimal comma as a point ("3,1 mm" → "3.1 mm") so the rest of the grammar reads
 * it. A thousands separator is not accepted: "1,500" is refused as ambiguous rather than guessed.
 */
export function normalizeDecimalComma(text: string): DecimalCommaResult {
  const trimmed = text.trim();
  const ambiguous = AMBIGUOUS_COMMA.exec(trimmed);
  if (ambiguous) {
    const [, whole, fraction] = ambiguous;
    return { ok: false, message: `“${trimmed}” could be ${whole}.${fraction} or ${whole}${fraction}: write it without the comma, or with a point (${whole}.${fraction})` };
  }
  return { ok: true, text: trimmed.replace(DECIMAL_COMMA, "$1.$2") };
}

/**
 * A plain number without a unit, as a form sends it ("2.5", "2,5", " 10 "): the value, or a message.
 * For the few fields that are counts or percentages rather than physical quantities.
 */
export function parseDecimalNumber(input: string): { ok: true; value: number } | { ok: false; message: string } {
  const normalized = normalizeDecimalComma(input.replace(/−/g, "-"));
  if (!normalized.ok) return normalized;
  const match = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/.exec(normalized.text);
  const value = match ? Number(match[0]) : Number.NaN;
  if (!Number.isFinite(value)) return { ok: false, message: `could not read “${input.trim()}” as a number` };
  return { ok: true, value };
}

const NUMBER = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/;
/** Schematic notation: the prefix letter stands for the decimal point ("4k7" = 4.7k, "2n2" = 2.2n, "4R7" = 4.7). */
const SCHEMATIC = /^(\d+)([pnuµμmkKMGR])(\d+)\s*(.*)$/;

/**
 * Parse `input` as a quantity of `kind`. A bare number is taken in `defaultUnit` (one of the
 * kind's spellings; the SI unit when omitted).
 */
export function parseQuantity(input: string, kind: QuantityKind, defaultUnit?: string): ParsedQuantity {
  const spec = SPECS[kind];
  const spaced = input.trim().replace(/\s+/g, " ").replace(/−/g, "-");
  const fail = (): ParsedQuantity => ({ ok: false, message: `Could not read “${input.trim()}” as ${spec.noun}: try ${spec.example}.` });
  if (spaced === "") return { ok: false, message: `Enter ${spec.noun}, like ${spec.example}.` };
  if (kind === "time") {
    const clockSeconds = parseClockDuration(spaced);
    if (clockSeconds !== null) return finish(clockSeconds, spec, kind);
  }
  const normalized = normalizeDecimalComma(spaced);
  if (!normalized.ok) return { ok: false, message: `${normalized.message}.` };
  const text = normalized.text;

  if (kind === "wireDiameter") {
    const gauge = /^(?:awg|#)\s*(\d{1,2}|0{1,4}|[1-4]\/0)$|^(\d{1,2}|0{1,4}|[1-4]\/0)\s*(?:awg|ga|gauge)$/i.exec(text);
    if (gauge) {
      try {
        return { ok: true, value: awgDiameter(gauge[1] ?? gauge[2]!), unit: "m" };
      } catch {
        return { ok: false, message: `AWG ${gauge[1] ?? gauge[2]} is outside the American Wire Gauge table (0000 to 56).` };
      }
    }
  }

  let mantissa: number;
  let suffix: string;
  const schematic = SCHEMATIC.exec(text);
  if (schematic && (spec.prefixAlone || schematic[2] === "R")) {
    const [, whole, letter, fraction, rest] = schematic;
    mantissa = Number(`${whole}.${fraction}`) * (letter === "R" ? 1 : PREFIX[letter!]!);
    suffix = rest!.trim();
    if (suffix !== "" && !(suffix in spec.units && spec.units[suffix] === 1)) return fail();
    return finish(mantissa, spec, kind);
  }
  const match = NUMBER.exec(text);
  if (!match) return fail();
  mantissa = Number(match[1]);
  suffix = match[2]!.trim();
  if (!Number.isFinite(mantissa)) return fail();

  if (suffix === "") {
    const factor = defaultUnit === undefined ? 1 : spec.units[defaultUnit];
    if (factor === undefined) throw new Error(`Unknown default unit ${defaultUnit} for ${kind}`);
    return finish(mantissa * factor, spec, kind);
  }
  if (kind === "temperature" && /^(°F|F|degF|℉)$/.test(suffix)) return finish(((mantissa - 32) * 5) / 9, spec, kind);
  const factor = lookUpUnit(suffix, spec, kind);
  if (factor === undefined) return fail();
  return finish(mantissa * factor, spec, kind);
}

function lookUpUnit(suffix: string, spec: KindSpec, kind: QuantityKind): number | undefined {
  const lower = suffix.toLowerCase();
  // Millihertz never appears on a coil bench: "mhz" and "mHz" mean MHz. Likewise "kohm", "KOHM", "Mohm".
  if (kind === "frequency" && /^[kmg]?hz$/.test(lower)) return { hz: 1, khz: 1e3, mhz: 1e6, ghz: 1e9 }[lower];
  if (kind === "resistance" && /^[km]?ohms?$/.test(lower)) return lower.startsWith("k") ? 1e3 : lower.startsWith("m") ? 1e6 : 1;
  if (suffix in spec.units) return spec.units[suffix];
  if (spec.prefixAlone && suffix in PREFIX) return PREFIX[suffix];
  if (kind === "count" && lower in spec.units) return spec.units[lower];
  return undefined;
}

function finish(value: number, spec: KindSpec, kind: QuantityKind): ParsedQuantity {
  if (!Number.isFinite(value)) return { ok: false, message: `That is not a finite ${spec.noun.replace(/^an? /, "")}.` };
  if (kind === "count" && !Number.isInteger(value)) return { ok: false, message: "Enter a whole number." };
  return { ok: true, value: kind === "count" ? value : Number(value.toPrecision(12)), unit: spec.unit };
}

/**
 * The on-screen keyboard a field of this kind asks a phone for: the decimal keypad when a bare number is
 * what people type (lengths in mm, volts, minutes, °C…), the full keyboard when the usual entry needs
 * letters ("330k", "2n2", "4k7", "AWG 28") because a bare number would be read in hertz, farads or ohms.
 */
export function keypadFor(kind: QuantityKind, defaultUnit?: string): "decimal" | "text" {
  if (kind === "wireDiameter") return "text";
  const bareIsSi = defaultUnit === undefined || defaultUnit === SPECS[kind].unit;
  if (SPECS[kind].prefixAlone && bareIsSi && kind !== "voltage" && kind !== "current" && kind !== "power") return "text";
  return "decimal";
}

export function quantityUnit(kind: QuantityKind): string {
  return SPECS[kind].unit;
}

export function quantityExample(kind: QuantityKind): string {
  return SPECS[kind].example;
}
