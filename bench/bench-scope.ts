/** The scope the benchmarks act in: the single-club install's site (lib/db/site-scope.ts opens no database). */
import { DEFAULT_SITE_ID, type SiteScope } from "../lib/db/site-scope";

export const benchScope = (actorId: string | null): SiteScope => ({ siteId: DEFAULT_SITE_ID, actorId });
