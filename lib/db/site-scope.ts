/**
 * Who is acting, and for which site: the first argument of every lib/db read and write of a site's records.
 * Reads narrow by the site in the query itself, so another site's record is simply not found: a page or
 * route answers exactly as for a record that does not exist and never reveals that it does.
 *
 * Coils carry their site; everything recorded about a coil (parts, top loads, sweeps and their points,
 * sessions and their samples, failures, clearances, loans, the dashboard summary) belongs to the coil's
 * site through it, so a child row can never disagree with its coil about where it belongs. Lending policies
 * and audit events name their site directly (null: the organisation's).
 */
export interface SiteScope {
  readonly siteId: string;
  /** The acting user; null for work no user started (the demo loader, a lapse the system found). */
  readonly actorId: string | null;
}

/** The site a single-club install has, created by the migration that introduced sites. */
export const DEFAULT_SITE_ID = "site-main";

/** `where` for a coil of the scope's site. */
export function coilOfSite(scope: SiteScope): { siteId: string } {
  return { siteId: scope.siteId };
}

/** `where` for a record that belongs to the scope's site through its coil. */
export function recordOfSite(scope: SiteScope): { coil: { siteId: string } } {
  return { coil: { siteId: scope.siteId } };
}
