/**
 * The WCAG 2.1 AA audit (axe-core) of every page in the route table (e2e/support/route-table.ts), at desktop
 * and phone widths, in the light and the dark colour scheme: no serious or critical violation anywhere; the
 * moderate and minor findings are printed for the record.
 */
import { fileURLToPath } from "node:url";
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Browser, type BrowserContextOptions } from "@playwright/test";
import { signInAs, type DemoRole } from "./support/accounts";
import { pageFilesWithoutRoute, ROUTE_TABLE, type AuditRoute } from "./support/route-table";

const WCAG_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"];
const WIDTHS: { label: string; options: BrowserContextOptions }[] = [
  { label: "desktop", options: { viewport: { width: 1280, height: 800 } } },
  { label: "phone", options: { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true } },
];
const SCHEMES = ["light", "dark"] as const;

type StorageState = Awaited<ReturnType<Awaited<ReturnType<Browser["newContext"]>>["storageState"]>>;
const signedIn = new Map<DemoRole, StorageState>();

async function storageFor(browser: Browser, role: AuditRoute["role"]): Promise<StorageState | undefined> {
  if (role === "anonymous") return undefined;
  if (!signedIn.has(role)) {
    const context = await browser.newContext();
    await signInAs(await context.newPage(), role);
    signedIn.set(role, await context.storageState());
    await context.close();
  }
  return signedIn.get(role);
}

test("the route table lists every page of the app", () => {
  expect(pageFilesWithoutRoute(fileURLToPath(new URL("..", import.meta.url)))).toEqual([]);
});

for (const route of ROUTE_TABLE) {
  test(`axe WCAG 2.1 AA: ${route.name} (${route.role})`, async ({ browser }) => {
    // Four full audits (two widths, two schemes) of one page: longer than a journey's step budget.
    test.setTimeout(180_000);
    const storageState = await storageFor(browser, route.role);
    let url: string | undefined;
    const findings: string[] = [];
    const blocking: string[] = [];
    for (const width of WIDTHS) {
      const context = await browser.newContext({ ...width.options, storageState });
      const page = await context.newPage();
      url ??= typeof route.path === "string" ? route.path : await route.path(page);
      await page.goto(url);
      await expect(page.locator("h1").first()).toBeVisible();
      // Inside the app, wait for app/ui/scrollable-regions.tsx to have marked the wide tables (a page without a table,
      // such as the not-found page outside the signed-in layout, has none to mark).
      if (route.role !== "anonymous") {
        await expect(page.locator("main#main[data-scroll-regions=ready], main#main:not(:has(table)), body:not(:has(main#main))").first()).toBeAttached();
      }
      for (const scheme of SCHEMES) {
        await page.emulateMedia({ colorScheme: scheme });
        const { violations } = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze();
        for (const v of violations) {
          const line = `[${width.label}/${scheme}] ${v.impact} ${v.id}: ${v.help} — ${v.nodes
            .slice(0, 4)
            .map((n) => n.target.join(" "))
            .join(", ")}${v.nodes.length > 4 ? ` (+${v.nodes.length - 4} more)` : ""}`;
          if (v.impact === "serious" || v.impact === "critical") blocking.push(line);
          else findings.push(line);
        }
      }
      await context.close();
    }
    if (findings.length > 0) console.log(`${route.name} ${url}: moderate/minor findings\n  ${findings.join("\n  ")}`);
    expect(blocking, `${route.name} ${url}: serious or critical WCAG 2.1 AA violations`).toEqual([]);
  });
}
