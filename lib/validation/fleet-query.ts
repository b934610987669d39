/** The fleet dashboard's filters and sort order, read from the query string (bad values fall back to defaults). */
import { z } from "zod";

const first = (v: unknown) => (Array.isArray(v) ? v[0] : v);

export const FLEET_HEALTH_FILTERS = ["all", "fine", "watch", "hold", "not enough data"] as const;
export const FLEET_CLEARANCE_FILTERS = ["all", "valid", "not-valid", "none", "expired", "lapsed", "refused"] as const;
export const FLEET_LOAN_FILTERS = ["all", "out", "overdue", "in"] as const;
export const FLEET_SORTS = ["severity", "tag", "hours", "sweep-age"] as const;

export const fleetQuerySchema = z.object({
  health: z.preprocess(first, z.enum(FLEET_HEALTH_FILTERS).catch("all").default("all")),
  clearance: z.preprocess(first, z.enum(FLEET_CLEARANCE_FILTERS).catch("all").default("all")),
  loan: z.preprocess(first, z.enum(FLEET_LOAN_FILTERS).catch("all").default("all")),
  sort: z.preprocess(first, z.enum(FLEET_SORTS).catch("severity").default("severity")),
});

export type FleetQuery = z.output<typeof fleetQuerySchema>;
