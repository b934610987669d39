/** Two sites with a steward each, for the lending tests that cross sites (policy, cross-site loans, isolation). */
import { createSite, makeUser, resetDatabase, siteScope, testDb } from "./db";
import { DEFAULT_SITE_ID, type SiteScope } from "../../lib/db/site-scope";

/** The database as freshly migrated: only the default site (resetDatabase does this itself once sites are reset with it). */
export async function resetToDefaultSite(): Promise<void> {
  await resetDatabase();
  await testDb.site.deleteMany({ where: { id: { not: DEFAULT_SITE_ID } } });
}

export interface TwoSites {
  main: SiteScope;
  north: SiteScope;
  mainSteward: { id: string };
  northSteward: { id: string };
  northId: string;
}

/** The default site and "North", a steward at each; scopes act as them. */
export async function makeTwoSites(): Promise<TwoSites> {
  const north = await createSite("north");
  const mainSteward = await makeUser("steward@main.test", "steward");
  const northSteward = await makeUser("steward@north.test", "steward", "North steward", north.id);
  return { main: siteScope(DEFAULT_SITE_ID, mainSteward.id), north: siteScope(north.id, northSteward.id), mainSteward, northSteward, northId: north.id };
}
