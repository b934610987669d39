/**
 * Every page of the app, with the lowest role that may see it and how to reach a real instance of it in the
 * demo data. The accessibility audit (e2e/accessibility.spec.ts) visits each; `pageFilesWithoutRoute` keeps
 * the table honest: a new page.tsx fails the audit's first test until it is listed here.
 */
import { readdirSync, statSync } from "node:fs";
import path from "node:path";
import { expect, type Page } from "@playwright/test";
import type { DemoRole } from "./accounts";

export interface AuditRoute {
  /** A short name for the test title. */
  name: string;
  /** The page file it renders (relative to the repository), or a special page (sign-in, not found, forbidden). */
  file: string;
  /** Who visits it; "anonymous" for the sign-in page. */
  role: DemoRole | "anonymous";
  /** The URL, or how to find one from a list page when the path has an id in it. */
  path: string | ((page: Page) => Promise<string>);
}

/** The first link on `listPath` whose path matches `pattern`: a real record of the demo data. */
export function firstLink(listPath: string, pattern: RegExp): (page: Page) => Promise<string> {
  return async (page) => {
    await page.goto(listPath);
    const hrefs = await page.locator("main a[href]").evaluateAll((links) => links.map((a) => new URL((a as HTMLAnchorElement).href).pathname));
    const found = hrefs.find((href) => pattern.test(href));
    expect(found, `a link matching ${pattern} on ${listPath}`).toBeDefined();
    return found!;
  };
}

/** A demo coil with sweeps, sessions, parts and a top load (prisma/demo). */
export const AUDIT_COIL = "KM-07";

export const ROUTE_TABLE: AuditRoute[] = [
  { name: "sign-in", file: "app/(auth)/sign-in/page.tsx", role: "anonymous", path: "/sign-in" },
  { name: "not found", file: "app/not-found.tsx", role: "member", path: "/no-such-page" },
  { name: "forbidden", file: "app/forbidden.tsx", role: "member", path: "/admin" },
  { name: "fleet dashboard", file: "app/(app)/page.tsx", role: "member", path: "/" },
  { name: "coils list", file: "app/(app)/coils/page.tsx", role: "member", path: "/coils" },
  { name: "new coil", file: "app/(app)/coils/new/page.tsx", role: "steward", path: "/coils/new" },
  { name: "coil import", file: "app/(app)/coils/import/page.tsx", role: "steward", path: "/coils/import" },
  { name: "planner", file: "app/(app)/coils/plan/page.tsx", role: "member", path: "/coils/plan" },
  { name: "coil page", file: "app/(app)/coils/[tag]/page.tsx", role: "member", path: `/coils/${AUDIT_COIL}` },
  { name: "coil edit", file: "app/(app)/coils/[tag]/edit/page.tsx", role: "steward", path: `/coils/${AUDIT_COIL}/edit` },
  { name: "coil label", file: "app/(app)/coils/[tag]/label/page.tsx", role: "member", path: `/coils/${AUDIT_COIL}/label` },
  { name: "new part", file: "app/(app)/coils/[tag]/parts/new/page.tsx", role: "steward", path: `/coils/${AUDIT_COIL}/parts/new` },
  {
    name: "replace part",
    file: "app/(app)/coils/[tag]/parts/[id]/replace/page.tsx",
    role: "steward",
    path: firstLink(`/coils/${AUDIT_COIL}`, new RegExp(`^/coils/${AUDIT_COIL}/parts/[^/]+/replace$`)),
  },
  { name: "new top load", file: "app/(app)/coils/[tag]/top-loads/new/page.tsx", role: "steward", path: `/coils/${AUDIT_COIL}/top-loads/new` },
  { name: "coil trends", file: "app/(app)/fleet/[tag]/trends/page.tsx", role: "member", path: `/fleet/${AUDIT_COIL}/trends` },
  { name: "reliability", file: "app/(app)/fleet/reliability/page.tsx", role: "member", path: "/fleet/reliability" },
  { name: "predictions", file: "app/(app)/fleet/predictions/page.tsx", role: "member", path: "/fleet/predictions" },
  { name: "sweeps list", file: "app/(app)/sweeps/page.tsx", role: "member", path: "/sweeps" },
  { name: "new sweep", file: "app/(app)/sweeps/new/page.tsx", role: "member", path: "/sweeps/new" },
  { name: "sweep import", file: "app/(app)/sweeps/import/page.tsx", role: "member", path: "/sweeps/import" },
  { name: "sweep page", file: "app/(app)/sweeps/[id]/page.tsx", role: "member", path: firstLink("/sweeps", /^\/sweeps\/(?!new$|import$)[^/]+$/) },
  { name: "sessions list", file: "app/(app)/sessions/page.tsx", role: "member", path: "/sessions" },
  { name: "new session", file: "app/(app)/sessions/new/page.tsx", role: "member", path: `/sessions/new?coil=${AUDIT_COIL}` },
  { name: "session page", file: "app/(app)/sessions/[id]/page.tsx", role: "member", path: firstLink("/sessions", /^\/sessions\/(?!new$)[^/]+$/) },
  { name: "failures list", file: "app/(app)/failures/page.tsx", role: "member", path: "/failures" },
  { name: "new failure", file: "app/(app)/failures/new/page.tsx", role: "member", path: "/failures/new" },
  { name: "failure page", file: "app/(app)/failures/[id]/page.tsx", role: "member", path: firstLink("/failures", /^\/failures\/(?!new$)[^/]+$/) },
  {
    name: "post-mortem report",
    file: "app/(app)/failures/[id]/report/page.tsx",
    role: "member",
    path: async (page) => `${await firstLink("/failures", /^\/failures\/(?!new$)[^/]+$/)(page)}/report`,
  },
  { name: "clearances list", file: "app/(app)/clearances/page.tsx", role: "member", path: "/clearances" },
  { name: "new clearance", file: "app/(app)/clearances/new/page.tsx", role: "steward", path: `/clearances/new?coil=${AUDIT_COIL}` },
  { name: "clearance decision", file: "app/(app)/clearances/[id]/page.tsx", role: "member", path: firstLink("/clearances", /^\/clearances\/(?!new$)[^/]+$/) },
  {
    name: "clearance sheet",
    file: "app/(app)/clearances/[id]/sheet/page.tsx",
    role: "member",
    path: async (page) => `${await firstLink("/clearances", /^\/clearances\/(?!new$)[^/]+$/)(page)}/sheet`,
  },
  { name: "loans list", file: "app/(app)/loans/page.tsx", role: "member", path: "/loans" },
  { name: "new loan", file: "app/(app)/loans/new/page.tsx", role: "steward", path: "/loans/new" },
  { name: "loan sheet", file: "app/(app)/loans/[id]/sheet/page.tsx", role: "member", path: firstLink("/loans", /^\/loans\/[^/]+\/sheet$/) },
  { name: "loan return", file: "app/(app)/loans/[id]/return/page.tsx", role: "steward", path: firstLink("/loans", /^\/loans\/[^/]+\/return$/) },
  { name: "admin: users and audit log", file: "app/(app)/admin/page.tsx", role: "admin", path: "/admin" },
  { name: "admin: policy", file: "app/(app)/admin/policy/page.tsx", role: "admin", path: "/admin/policy" },
  { name: "admin: sites", file: "app/(app)/admin/sites/page.tsx", role: "organiser", path: "/admin/sites" },
  { name: "district", file: "app/(app)/district/page.tsx", role: "organiser", path: "/district" },
  // Served only to the benchmark (COILYARD_BENCH_FLOOR=1); everywhere else, this test server included, the not-found page.
  { name: "benchmark page floor", file: "app/(app)/bench-floor/page.tsx", role: "member", path: "/bench-floor" },
];

/** The page.tsx files under app/ that the table does not list (should be none). */
export function pageFilesWithoutRoute(root: string): string[] {
  const pages: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const full = path.join(dir, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (name === "page.tsx") pages.push(path.relative(root, full).split(path.sep).join("/"));
    }
  };
  walk(path.join(root, "app"));
  const listed = new Set(ROUTE_TABLE.map((r) => r.file));
  return pages.filter((file) => !listed.has(file)).sort();
}
