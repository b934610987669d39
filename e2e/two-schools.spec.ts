/**
 * Two schools on one server: two app instances sharing one database (PostgreSQL when COILYARD_TEST_POSTGRES_URL
 * names a test server, else one SQLite file; e2e/support/site-servers.ts) with the demo network loaded: the
 * Kettlewell Maker Collective and Fenwick Street School (prisma/demo/people.ts). Each steward signs in on a
 * different instance and sees only their own fleet; the club lends a cleared coil to the school's event, and the
 * school's steward sees that loan and the coil's clearance sheet but gets "not found" for the coil itself; the
 * organisation admin's district view shows both sites and drills down into one.
 */
import { fileURLToPath } from "node:url";
import { expect, test, type Browser, type Page } from "@playwright/test";
import { SignInPage } from "./support/accounts";
import { startSharedServers, type SharedServers } from "./support/site-servers";

const ROOT = fileURLToPath(new URL("..", import.meta.url));

/** The demo network's people this spec signs in as (prisma/demo/people.ts; demo passwords, listed in the README). */
const PEOPLE = {
  clubSteward: { email: "steward@kettlewell.example", password: "demo-steward-pass" },
  schoolSteward: { email: "steward@fenwick.example", password: "demo-school-steward-pass" },
  organiser: { email: "coordinator@northmoor.example", password: "demo-organisation-pass" },
} as const;

const CLUB = { name: "Kettlewell Maker Collective", tags: ["KM-01", "KM-02", "KM-03", "KM-04", "KM-05", "KM-06", "KM-07"] };
const SCHOOL = { name: "Fenwick Street School", tags: ["FS-01", "FS-02"] };
/** A club coil with a standing clearance that is not out on loan in the demo (KM-03 is out with Riverside Library). */
const LENT_COIL = "KM-02";

test.describe.configure({ mode: "serial", timeout: 180_000 });

let shared: SharedServers;

test.beforeAll(async () => {
  test.setTimeout(240_000);
  shared = await startSharedServers(ROOT);
});

test.afterAll(async () => {
  await shared?.stop();
});

async function signedIn(browser: Browser, instance: 0 | 1, person: keyof typeof PEOPLE): Promise<Page> {
  const context = await browser.newContext({ baseURL: shared.servers[instance].baseURL });
  const page = await context.newPage();
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(PEOPLE[person].email, PEOPLE[person].password);
  await expect(page.getByRole("button", { name: "Sign out" })).toBeVisible();
  return page;
}

/** The tags the coils list shows (its links to coil pages). */
async function listedTags(page: Page): Promise<string[]> {
  await page.goto("/coils");
  const hrefs = await page.locator("main a[href^='/coils/']").evaluateAll((links) => links.map((a) => new URL((a as HTMLAnchorElement).href).pathname));
  return [...new Set(hrefs.map((href) => decodeURIComponent(href.split("/")[2] ?? "")).filter((tag) => /^[A-Z0-9][A-Z0-9-]+$/.test(tag)))].sort();
}

async function expectNotFound(page: Page, path: string) {
  const response = await page.goto(path);
  expect(response?.status(), path).toBe(404);
}

test("each school's steward, on a different instance, sees only their own fleet", async ({ browser }) => {
  const club = await signedIn(browser, 0, "clubSteward");
  const school = await signedIn(browser, 1, "schoolSteward");

  // The current site is always named in the header.
  await expect(club.getByRole("banner")).toContainText(CLUB.name);
  await expect(school.getByRole("banner")).toContainText(SCHOOL.name);
  await expect(school.getByRole("banner")).not.toContainText(CLUB.name);

  expect(await listedTags(club)).toEqual(CLUB.tags);
  expect(await listedTags(school)).toEqual(SCHOOL.tags);

  // Another site's coil is not found, on either instance, by any of its pages.
  for (const path of [`/coils/${LENT_COIL}`, `/coils/${LENT_COIL}/label`, `/fleet/${LENT_COIL}/trends`, `/api/export/coils/${LENT_COIL}.json`]) await expectNotFound(school, path);
  await expectNotFound(club, `/coils/${SCHOOL.tags[0]}`);

  // The whole-fleet exports over HTTP hold only the site's own coils.
  const exported = await school.request.get("/api/export/fleet.json");
  expect(exported.status()).toBe(200);
  const logbook = (await exported.json()) as { coils: { tag: string }[] };
  expect(logbook.coils.map((coil) => coil.tag).sort()).toEqual(SCHOOL.tags);

  // The dashboard, sessions and sweeps lists name only the site's own coils.
  for (const path of ["/", "/sessions", "/sweeps"]) {
    await school.goto(path);
    const main = school.getByRole("main");
    for (const tag of CLUB.tags) await expect(main.getByText(tag, { exact: true }), `${path} at ${SCHOOL.name}`).toHaveCount(0);
  }
  await club.context().close();
  await school.context().close();
});

test("the club lends a cleared coil to the school's event: the school sees the loan and the clearance sheet, not the coil", async ({ browser }) => {
  const club = await signedIn(browser, 0, "clubSteward");
  await club.goto(`/loans/new?coil=${LENT_COIL}`);
  const form = club.getByRole("form", { name: "Lend coil" });
  await form.getByLabel("Borrowing site").selectOption({ label: SCHOOL.name });
  await form.getByLabel("Borrower").fill("Marguerite Osei");
  await form.getByLabel("Event").fill("Fenwick science fair");
  await form.getByRole("button", { name: "Lend coil" }).click();
  await expect(club.getByRole("heading", { level: 1, name: new RegExp(`^Handover sheet: ${LENT_COIL}`) })).toBeVisible();
  const loanSheet = new URL(club.url()).pathname;

  // The school's steward, on the other instance, finds it among the loans borrowed from other sites.
  const school = await signedIn(browser, 1, "schoolSteward");
  await school.goto("/loans");
  const borrowed = school.getByRole("region", { name: "Borrowed from other sites" });
  await expect(borrowed.getByRole("row", { name: new RegExp(`${LENT_COIL}.*${CLUB.name}.*Fenwick science fair`) })).toBeVisible();
  await borrowed.getByRole("link", { name: `Loan sheet for ${LENT_COIL} from ${CLUB.name}` }).click();
  await expect(school).toHaveURL(new RegExp(`${loanSheet}$`));
  await expect(school.getByRole("heading", { level: 1, name: new RegExp(`^Handover sheet: ${LENT_COIL}`) })).toBeVisible();
  await expect(school.getByText("Fenwick science fair", { exact: true })).toBeVisible();

  await school.goto("/loans");
  await school.getByRole("region", { name: "Borrowed from other sites" }).getByRole("link", { name: `Clearance sheet for ${LENT_COIL} from ${CLUB.name}` }).click();
  await expect(school.getByRole("heading", { level: 1, name: new RegExp(`^Lending sheet: ${LENT_COIL}`) })).toBeVisible();
  await expect(school).toHaveURL(/\/clearances\/[^/]+\/sheet$/);

  // Nothing else of the lending site: the coil page, its decision page, the return form.
  await expectNotFound(school, `/coils/${LENT_COIL}`);
  const clearanceDecision = new URL(school.url()).pathname.replace(/\/sheet$/, "");
  await expectNotFound(school, clearanceDecision);
  await expectNotFound(school, loanSheet.replace(/\/sheet$/, "/return"));
  await club.context().close();
  await school.context().close();
});

test("the organisation admin's district view shows every site's fleet and drills down into one", async ({ browser }) => {
  const organiser = await signedIn(browser, 0, "organiser");
  await organiser.getByRole("link", { name: "District" }).click();
  await expect(organiser.getByRole("heading", { level: 1, name: "District" })).toBeVisible();
  const table = organiser.getByRole("table");
  const headings = await table.getByRole("columnheader").allTextContents();
  const figure = async (site: string, column: string) => {
    const cells = table.getByRole("row", { name: new RegExp(site) }).getByRole("cell");
    // The site's name is the row header; the cells follow the column headings after "Site".
    return (await cells.nth(headings.indexOf(column) - 1).textContent())?.trim();
  };
  expect(await figure(CLUB.name, "Coils")).toBe(String(CLUB.tags.length));
  expect(await figure(SCHOOL.name, "Coils")).toBe(String(SCHOOL.tags.length));
  // Loans count at the lending site: the demo's loan to the library and the one lent to the school above.
  expect(await figure(CLUB.name, "On loan")).toBe("2");
  expect(await figure(SCHOOL.name, "On loan")).toBe("0");

  await organiser.getByRole("button", { name: `${SCHOOL.name}: open its dashboard` }).click();
  await expect(organiser).toHaveURL(/\/$/);
  await expect(organiser.getByRole("combobox", { name: "Site" }).locator("option:checked")).toHaveText(`${SCHOOL.name} (admin)`);
  expect(await listedTags(organiser)).toEqual(SCHOOL.tags);

  // A site's steward is not an organisation admin: no District link, and the page is refused.
  const club = await signedIn(browser, 1, "clubSteward");
  await expect(club.getByRole("link", { name: "District" })).toHaveCount(0);
  const response = await club.goto("/district");
  expect(response?.status()).toBe(403);
  await organiser.context().close();
  await club.context().close();
});
