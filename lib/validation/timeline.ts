/** The coil page's logbook filter (`?log=…`): which kind of record the timeline shows; absent or "all" for every kind. */
import { z } from "zod";

export const TIMELINE_FILTERS = ["sessions", "sweeps", "failures", "parts", "clearances", "loans"] as const;
export type TimelineFilter = (typeof TIMELINE_FILTERS)[number];

/** An unknown or repeated value falls back to every kind rather than failing the page: it is a view filter, not data. */
export const timelineFilterSchema = z
  .union([z.enum(TIMELINE_FILTERS), z.literal("all"), z.undefined()])
  .catch(undefined)
  .transform((value): TimelineFilter | null => (value === undefined || value === "all" ? null : value));
