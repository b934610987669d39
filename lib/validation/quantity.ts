/**
 * A zod field for an engineering quantity: accepts what people type ("330 kHz", "47k", "3 in",
 * "AWG 28") or a number already in SI, and yields the SI value. Errors name the field and say what
 * was understood when it is out of range ("Form diameter must be between 5 mm and 1 m; “75 m” was read as 75 m").
 */
import { z } from "zod";
import { parseDecimalNumber, parseQuantity, quantityUnit, type QuantityKind } from "../units/parse";
import { formatQuantity } from "../units/format";

export interface QuantityFieldOptions {
  label: string;
  kind: QuantityKind;
  /** Inclusive range in SI units (°C for temperatures). */
  min: number;
  max: number;
  /** Unit a bare number is read in (one of the kind's spellings); SI when omitted. */
  defaultUnit?: string;
}

function show(value: number, kind: QuantityKind): string {
  const unit = quantityUnit(kind);
  if (kind === "temperature") return `${Number(value.toPrecision(4))} °C`;
  if (kind === "count") return String(value);
  if (kind === "time") return `${Number(value.toPrecision(4))} s`;
  if (kind === "thermalResistance") return `${Number(value.toPrecision(3))} K/W`;
  return formatQuantity(value, unit === "Ω" ? "Ω" : unit);
}

export function quantityField(options: QuantityFieldOptions) {
  const { label, kind, min, max, defaultUnit } = options;
  return z.union([z.string(), z.number()], { error: `${label}: enter ${kind === "count" ? "a number" : "a value"}.` }).transform((raw, ctx) => {
    let value: number;
    let typed: string;
    if (typeof raw === "number") {
      value = raw;
      typed = String(raw);
    } else {
      const parsed = parseQuantity(raw, kind, defaultUnit);
      if (!parsed.ok) {
        ctx.addIssue({ code: "custom", message: `${label}: ${parsed.message}` });
        return z.NEVER;
      }
      value = parsed.value;
      typed = raw.trim();
    }
    if (!Number.isFinite(value) || value < min || value > max) {
      ctx.addIssue({
        code: "custom",
        message: `${label} must be between ${show(min, kind)} and ${show(max, kind)}; “${typed}” was read as ${show(value, kind)}.`,
      });
      return z.NEVER;
    }
    return value;
  });
}

/** The same field, optional: an empty string or null means "not recorded". */
export function optionalQuantityField(options: QuantityFieldOptions) {
  return z.preprocess((v) => (v === "" || v === null || (typeof v === "string" && v.trim() === "") ? undefined : v), quantityField(options).optional());
}

/** Render a stored SI value as the text a form shows back ("330 kHz"). */
export function describeQuantity(value: number | null | undefined, kind: QuantityKind): string {
  return value === null || value === undefined ? "" : show(value, kind);
}

/**
 * Reads a form's text as a plain number with the same grammar as the quantities ("2,5" = 2.5), for the
 * fields that are counts or percentages; `unitWord` ("%", "turns") may follow. Unreadable text becomes
 * NaN so the number schema after it reports the field's own message.
 */
export function readDecimalText(raw: unknown, unitWord?: RegExp): unknown {
  if (typeof raw !== "string") return raw;
  const text = unitWord ? raw.replace(unitWord, "") : raw;
  if (text.trim() === "") return undefined;
  const parsed = parseDecimalNumber(text);
  return parsed.ok ? parsed.value : Number.NaN;
}
