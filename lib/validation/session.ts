/**
 * The quick run-session log, shared by the bench form and its server action. Every number goes
 * through quantityField so "12 min", "334k" and "48 V" read as typed; the heat-sink samples go
 * through the pure sample parser so errors name the row and column.
 */
import { z } from "zod";
import { optionalQuantityField, quantityField } from "./quantity";
import { describeSampleError, parseHeatSinkSamples } from "../import/heat-sink-samples";

export const sessionOutcomeSchema = z.enum(["normal", "stopped", "anomaly", "failed"], {
  error: "Outcome: choose normal, stopped early, anomaly or failed.",
});

/** How far ahead of the server's clock a start time may be (a phone's clock can run a little fast). */
const FUTURE_ALLOWANCE_MS = 15 * 60 * 1000;

/** A datetime-local value ("2026-12-02T14:05"), read in the server's (the lab's) time zone. */
export function localDateTimeField(label: string) {
  return z.string({ error: `${label}: enter a date and time.` }).transform((raw, ctx) => {
    const text = raw.trim();
    const date = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2})?$/.test(text) ? new Date(text) : new Date(Number.NaN);
    if (Number.isNaN(date.getTime())) {
      ctx.addIssue({ code: "custom", message: `${label}: enter a date and time like 2026-12-02 14:05.` });
      return z.NEVER;
    }
    if (date.getTime() > Date.now() + FUTURE_ALLOWANCE_MS) {
      ctx.addIssue({ code: "custom", message: `${label} is in the future.` });
      return z.NEVER;
    }
    return date;
  });
}

/** The value a datetime-local field shows for `date`, in the server's time zone. */
export function toLocalDateTimeValue(date: Date): string {
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}T${pad(date.getHours())}:${pad(date.getMinutes())}`;
}

/**
 * Duty cycle as a fraction or a percentage ("0.42", "0,42", "42 %"). Not a physical quantity with a unit
 * in lib/units, so it is read here; the message names the field like quantityField's do.
 */
const dutyCycleField = z.preprocess(
  (v) => (typeof v === "string" && v.trim() === "" ? undefined : v),
  z
    .string()
    .transform((raw, ctx) => {
      const match = /^\s*(\d+(?:[.,]\d+)?)\s*(%)?\s*$/.exec(raw);
      const value = match ? Number(match[1]!.replace(",", ".")) / (match[2] ? 100 : 1) : Number.NaN;
      if (!(value > 0 && value < 1)) {
        ctx.addIssue({ code: "custom", message: `Duty cycle: enter a fraction between 0 and 1 or a percentage, like 0.42 or 42 %; “${raw.trim()}” is not one.` });
        return z.NEVER;
      }
      return value;
    })
    .optional(),
);

const samplesField = z
  .string()
  .default("")
  .transform((text, ctx) => {
    const result = parseHeatSinkSamples(text);
    if (!result.ok) {
      ctx.addIssue({ code: "custom", message: `Heat-sink samples: ${result.errors.slice(0, 5).map(describeSampleError).join(" ")}${result.errors.length > 5 ? ` (and ${result.errors.length - 5} more)` : ""}` });
      return z.NEVER;
    }
    return result.samples;
  });

/**
 * The idempotency key of one submission: a UUID the logging client generates once per filled-in form, so a
 * replayed or double-tapped submit is stored once (lib/db/sessions.ts). Optional: a script that sends none gets
 * a new session per request, as before.
 */
export const clientKeyField = z.preprocess(
  (v) => (typeof v === "string" && v.trim() === "" ? undefined : typeof v === "string" ? v.trim().toLowerCase() : v),
  z.uuid({ error: "Submission key: send a UUID such as 0b6f6f64-3f4e-4d59-9c1e-6f1f5d2a7c41, or leave it out." }).optional(),
);

export const sessionSchema = z
  .object({
    coilId: z.string().min(1, "Coil: choose a coil."),
    topLoadId: z.preprocess((v) => (v === "" ? undefined : v), z.string().optional()),
    startedAt: localDateTimeField("Started at"),
    supplyVoltageV: quantityField({ label: "Supply voltage", kind: "voltage", min: 1, max: 1_000 }),
    supplyCurrentA: quantityField({ label: "Average current", kind: "current", min: 0.001, max: 100 }),
    durationS: quantityField({ label: "Duration", kind: "time", min: 1, max: 24 * 3600, defaultUnit: "min" }),
    ambientTempC: quantityField({ label: "Ambient temperature", kind: "temperature", min: -20, max: 50 }),
    heatSinkStartC: optionalQuantityField({ label: "Heat sink at start", kind: "temperature", min: -20, max: 250 }),
    heatSinkEndC: optionalQuantityField({ label: "Heat sink at end", kind: "temperature", min: -20, max: 250 }),
    runningFrequencyHz: optionalQuantityField({ label: "Running frequency", kind: "frequency", min: 1_000, max: 20_000_000 }),
    peakSwitchVoltageV: optionalQuantityField({ label: "Peak collector/drain voltage", kind: "voltage", min: 1, max: 10_000 }),
    dutyCycle: dutyCycleField,
    outcome: sessionOutcomeSchema.default("normal"),
    notes: z.string().max(5_000, "Notes: at most 5 000 characters.").default(""),
    samples: samplesField,
    clientKey: clientKeyField,
  })
  .superRefine((s, ctx) => {
    if (s.peakSwitchVoltageV !== undefined && s.peakSwitchVoltageV < s.supplyVoltageV) {
      ctx.addIssue({ code: "custom", path: ["peakSwitchVoltageV"], message: "Peak collector/drain voltage: it cannot be below the supply voltage; check the probe's attenuation." });
    }
    const last = s.samples.at(-1);
    if (last && last.elapsedS > s.durationS * 1.1 + 60) {
      ctx.addIssue({ code: "custom", path: ["samples"], message: `Heat-sink samples: the last sample (${last.elapsedS} s) is after the run ended (${s.durationS} s).` });
    }
  });

export type SessionInput = z.output<typeof sessionSchema>;
