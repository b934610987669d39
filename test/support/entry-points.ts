/**
 * The mutating entry points of the app, discovered from the file tree (every export of a "use server" module,
 * every POST/PUT/PATCH/DELETE of app/api/**\/route.ts), and the committed table of the role each needs. Shared
 * by test/security-roles.test.ts (in-process, every action and route) and e2e/security-routes.spec.ts (the
 * routes over HTTP), so a new entry point missing from the table fails both. Node built-ins only: the e2e
 * side imports it too.
 */
import { readFileSync, readdirSync, statSync } from "node:fs";
import path from "node:path";

/** The least role at the current site, "organisation" for an organisation admin only, or "public". */
export type Required = "member" | "steward" | "admin" | "organisation" | "public";

/** The committed table: every mutating entry point and the least role that may use it. */
export const ENTRY_POINT_ROLES: Record<string, Required> = {
  // A site's admin manages that site's members; an organisation admin manages sites and organisation admins.
  "app/(app)/admin/actions.ts#addUser": "admin",
  "app/(app)/admin/actions.ts#addExistingMember": "admin",
  "app/(app)/admin/actions.ts#changeAccess": "admin",
  "app/(app)/admin/actions.ts#removeSiteMember": "admin",
  "app/(app)/admin/sites/actions.ts#addSite": "organisation",
  "app/(app)/admin/sites/actions.ts#changeSiteName": "organisation",
  "app/(app)/admin/sites/actions.ts#changeOrganisationAdmin": "organisation",
  // The site switcher (and the district view's drill-down): anyone signed in, to a site they may reach.
  "app/(app)/site-actions.ts#switchSite": "member",
  // The organisation's default lending policy: organisation admins; a site's own tightening of it: that site's admins.
  "app/(app)/admin/policy/actions.ts#saveDefaultPolicyAction": "organisation",
  "app/(app)/admin/policy/actions.ts#saveSitePolicyAction": "admin",
  "app/(app)/clearances/actions.ts#signClearanceAction": "steward",
  "app/(app)/coils/[tag]/actions.ts#changeCoilStatus": "steward",
  "app/(app)/coils/[tag]/actions.ts#addTopLoadAction": "steward",
  "app/(app)/coils/[tag]/actions.ts#retireTopLoadAction": "steward",
  "app/(app)/coils/[tag]/actions.ts#addComponentAction": "steward",
  "app/(app)/coils/[tag]/actions.ts#replaceComponentAction": "steward",
  "app/(app)/coils/actions.ts#createCoilAction": "steward",
  "app/(app)/coils/actions.ts#updateCoilAction": "steward",
  "app/(app)/coils/actions.ts#importLogbookAction": "steward",
  // Any member may work out a plan (nothing is stored); saving it as a planned coil is adding a coil: stewards.
  "app/(app)/coils/plan/actions.ts#comparePlanAction": "member",
  "app/(app)/coils/plan/actions.ts#savePlanAction": "steward",
  "app/(app)/failures/actions.ts#recordFailure": "member",
  "app/(app)/failures/actions.ts#completePostMortemAction": "steward",
  "app/(app)/loans/actions.ts#lendCoilAction": "steward",
  "app/(app)/loans/actions.ts#returnLoanAction": "steward",
  "app/(app)/sessions/actions.ts#logSession": "member",
  "app/(app)/sweeps/actions.ts#recordTypedSweep": "member",
  "app/api/coils/route.ts#POST": "steward",
  "app/api/import/json/route.ts#POST": "steward",
  "app/api/sessions/route.ts#POST": "member",
  "app/api/sweeps/import/route.ts#POST": "member",
  // next-auth's own sign-in/sign-out endpoint: public by design, protected by its CSRF token and the sign-in throttle.
  "app/api/auth/[...nextauth]/route.ts#POST": "public",
};

export const MUTATING_METHODS = ["POST", "PUT", "PATCH", "DELETE"] as const;

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? walk(full) : [full];
  });
}

/** Exported names of a module, as written: `export async function x`, `export const x`, `export { a as B }`. */
function exportedNames(source: string): string[] {
  const names = [...source.matchAll(/export\s+(?:async\s+)?(?:function\*?|const|let)\s+(\w+)/g)].map((m) => m[1]!);
  for (const list of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of list[1]!.split(",")) names.push(part.trim().split(/\s+as\s+/).pop()!.trim());
  }
  return names.filter(Boolean);
}

/** Every mutating entry point as "file#export", sorted. `root` is the project folder. */
export function discoverEntryPoints(root: string): string[] {
  const found: string[] = [];
  for (const file of walk(path.join(root, "app")).filter((f) => /\.(ts|tsx)$/.test(f))) {
    const relative = path.relative(root, file).split(path.sep).join("/");
    const source = readFileSync(file, "utf8");
    const isServerModule = /^\s*(?:\/\*[\s\S]*?\*\/\s*|\/\/.*\n\s*)*["']use server["']/.test(source);
    if (isServerModule) for (const name of exportedNames(source)) found.push(`${relative}#${name}`);
    // Inline "use server" functions inside components would escape the table: refuse them outright.
    else if (/["']use server["']/.test(source)) found.push(`${relative}#<inline "use server">`);
    if (relative.startsWith("app/api/") && relative.endsWith("/route.ts")) {
      for (const name of exportedNames(source)) if ((MUTATING_METHODS as readonly string[]).includes(name)) found.push(`${relative}#${name}`);
    }
  }
  return found.sort();
}

export interface MutatingRoute {
  /** "app/api/sessions/route.ts#POST", the key in ENTRY_POINT_ROLES. */
  key: string;
  method: string;
  /** The URL path, with dynamic segments left as written ("/api/export/coils/[tag]"). */
  path: string;
}

/** The mutating HTTP routes (app/api/**\/route.ts) among the entry points, with their URL paths. */
export function discoverMutatingRoutes(root: string): MutatingRoute[] {
  return discoverEntryPoints(root)
    .filter((key) => key.startsWith("app/api/") && key.includes("/route.ts#"))
    .map((key) => {
      const [file, method] = key.split("#") as [string, string];
      const segments = file.replace(/^app\//, "").replace(/\/route\.ts$/, "").split("/").filter((s) => !/^\(.*\)$/.test(s));
      return { key, method, path: `/${segments.join("/")}` };
    });
}

/**
 * The pages that show one record: every page.tsx under app/(app) with a dynamic segment in its path
 * ("app/(app)/coils/[tag]/page.tsx"), and every GET of app/api/**\/route.ts with one ("/api/export/coils/[tag]").
 * The site dimension of test/security-roles.test.ts must list each with how to name a record of another site, so
 * a new record page is checked for isolation as soon as it exists.
 */
export function discoverRecordPages(root: string): string[] {
  const found: string[] = [];
  for (const file of walk(path.join(root, "app"))) {
    const relative = path.relative(root, file).split(path.sep).join("/");
    if (!/\[[^\]]+\]/.test(relative)) continue;
    if (relative.startsWith("app/(app)/") && relative.endsWith("/page.tsx")) found.push(relative);
    if (relative.startsWith("app/api/") && relative.endsWith("/route.ts") && !relative.startsWith("app/api/auth/")) {
      if (exportedNames(readFileSync(file, "utf8")).includes("GET")) found.push(`${relative}#GET`);
    }
  }
  return found.sort();
}

/** The GET routes with no dynamic segment (lists and whole-fleet exports): a site's answer must name only its records. */
export function discoverListRoutes(root: string): string[] {
  const found: string[] = [];
  for (const file of walk(path.join(root, "app/api"))) {
    const relative = path.relative(root, file).split(path.sep).join("/");
    if (!relative.endsWith("/route.ts") || /\[[^\]]+\]/.test(relative)) continue;
    if (exportedNames(readFileSync(file, "utf8")).includes("GET")) found.push(`${relative}#GET`);
  }
  return found.sort();
}
