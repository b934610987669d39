/**
 * Query-string schemas for the list pages. A bad or hostile query string falls back to defaults
 * (catch) instead of breaking the page: lists are for reading, not for error messages.
 */
import { z } from "zod";

const first = (v: unknown) => (Array.isArray(v) ? v[0] : v);
const optionalText = z.preprocess(first, z.string().trim().max(100).optional().catch(undefined));
const page = z.preprocess(first, z.coerce.number().int().min(1).max(100_000).catch(1).default(1));

export const coilListQuerySchema = z.object({
  q: optionalText,
  status: z.preprocess(first, z.enum(["planned", "active", "repair", "retired"]).optional().catch(undefined)),
  sort: z.preprocess(first, z.enum(["tag", "name", "updated"]).catch("tag").default("tag")),
  page,
});

export const sessionListQuerySchema = z.object({
  q: optionalText,
  coil: optionalText,
  outcome: z.preprocess(first, z.enum(["normal", "stopped", "anomaly", "failed"]).optional().catch(undefined)),
  sort: z.preprocess(first, z.enum(["newest", "oldest", "voltage", "current", "duration"]).catch("newest").default("newest")),
  page,
});

export const sweepListQuerySchema = z.object({
  q: optionalText,
  coil: optionalText,
  sort: z.preprocess(first, z.enum(["newest", "oldest", "frequency"]).catch("newest").default("newest")),
  page,
});

export const failureListQuerySchema = z.object({
  q: optionalText,
  status: z.preprocess(first, z.enum(["open", "closed"]).optional().catch(undefined)),
  mode: z.preprocess(
    first,
    z.enum(["over_voltage", "over_current", "over_temperature", "reverse_base_breakdown", "mechanical", "unknown"]).optional().catch(undefined),
  ),
  page,
});

export const loanListQuerySchema = z.object({
  state: z.preprocess(first, z.enum(["out", "overdue", "returned", "all"]).catch("all").default("all")),
  page,
});

const optionalDay = z.preprocess(first, z.string().regex(/^\d{4}-\d{2}-\d{2}$/).optional().catch(undefined));

/** The admin audit log's filters: who (a user id), what (the kind of record and words of the summary), when (days, inclusive). */
export const auditQuerySchema = z.object({
  who: z.preprocess(first, z.string().trim().max(100).optional().catch(undefined)),
  entity: z.preprocess(first, z.string().trim().max(40).optional().catch(undefined)),
  q: optionalText,
  from: optionalDay,
  to: optionalDay,
  page,
});

export type SearchParams = Record<string, string | string[] | undefined>;
