/**
 * Stored SI values as text for the coil form's fields. Not in quantity-input.tsx: that module is "use client",
 * and the edit page (a server component) calls this while rendering — a client module's function cannot be
 * called on the server (the edit page answered 500 in the production build).
 */
import type { QuantityKind } from "@/lib/units/parse";
import { formatQuantity } from "@/lib/units/format";

/** The stored SI value as text the parser reads back without loss (six significant figures). */
export function quantityText(value: number | null | undefined, kind: QuantityKind, defaultUnit?: string): string {
  if (value === null || value === undefined) return "";
  const n = (v: number) => String(Number(v.toPrecision(6)));
  switch (kind) {
    case "length":
    case "wireDiameter":
      return defaultUnit === "mm" || kind === "wireDiameter" ? `${n(value * 1000)} mm` : `${n(value)} m`;
    case "temperature":
      return `${n(value)} °C`;
    case "thermalResistance":
      return `${n(value)} K/W`;
    case "mass":
      return value < 1 ? `${n(value * 1000)} g` : `${n(value)} kg`;
    case "count":
      return String(value);
    case "time":
      return `${n(value)} s`;
    default: {
      const unit = { frequency: "Hz", capacitance: "F", inductance: "H", resistance: "Ω", voltage: "V", current: "A", power: "W" }[kind];
      return formatQuantity(value, unit, 6);
    }
  }
}
