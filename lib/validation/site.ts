/** Site schemas, shared by the organisation admin's site forms, the site switcher and their server actions. */
import { z } from "zod";

/** The short name in the site switcher and the site cookie: lower-case letters, digits and single hyphens. */
export const siteSlugSchema = z
  .string({ error: "Enter a short name." })
  .trim()
  .toLowerCase()
  .min(2, "Use at least 2 characters.")
  .max(40, "Keep the short name under 40 characters.")
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, "Use lower-case letters, digits and single hyphens, like north-school.");

export const siteSchema = z.object({
  name: z.string({ error: "Enter a name." }).trim().min(1, "Enter a name.").max(100, "Keep the name under 100 characters."),
  slug: siteSlugSchema,
});

export type SiteInput = z.infer<typeof siteSchema>;

export const renameSiteSchema = siteSchema.extend({ siteId: z.string().min(1, "Choose a site.") });

export const switchSiteSchema = z.object({ slug: siteSlugSchema });
