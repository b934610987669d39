import { expect, test, type Page } from "@playwright/test";
import { signInAs } from "./support/accounts";

/** The planner, as a small page object. */
class PlanPage {
  constructor(private readonly page: Page) {}

  async open() {
    await this.page.goto("/coils");
    await this.page.getByRole("link", { name: "Plan a build" }).click();
    await expect(this.page.getByRole("heading", { name: "Plan a build", level: 1 })).toBeVisible();
  }

  field(label: string) {
    return this.page.getByLabel(label, { exact: true });
  }

  /** Two variants: the example build as "Short", and a copy of it with a longer winding as "Tall". */
  async planTwoVariants() {
    await this.field("Variant label").fill("Short");
    await this.field("Clamp voltage").fill("150 V");
    await this.page.getByRole("button", { name: "Add variant (copy of this one)" }).click();
    await expect(this.page.getByRole("tab", { name: "Variant B" })).toHaveAttribute("aria-selected", "true");
    await this.field("Variant label").fill("Tall");
    await this.field("Winding length").fill("350 mm");
  }

  async compare() {
    await this.page.getByRole("button", { name: /^Compare \d variants$/ }).click();
  }

  table() {
    return this.page.getByRole("table", { name: "Planned figures by variant" });
  }
}

test("a member plans two variants and compares them; a steward saves one as a planned coil", async ({ page, browser }) => {
  await signInAs(page, "member");
  const plan = new PlanPage(page);
  await plan.open();
  await expect(page.getByRole("complementary", { name: "Safety cautions" })).toBeVisible();
  await plan.planTwoVariants();

  // An absurd turn count is refused under the field, naming the variant.
  await plan.field("Turns").fill("90000");
  await plan.compare();
  await expect(page.getByRole("status").filter({ hasText: "Some fields need attention in Tall" })).toBeVisible();
  await expect(page.getByText(/Turns must be between 10 and 20 ?000/)).toBeVisible();
  await expect(page.getByRole("tab", { name: "Tall (check fields)" })).toBeVisible();
  await plan.field("Turns").fill("");

  await plan.compare();
  const table = plan.table();
  await expect(table.getByRole("columnheader", { name: "Short" })).toBeVisible();
  await expect(table.getByRole("columnheader", { name: "Tall" })).toBeVisible();
  // The longer winding changes the turns and the resonance: those rows are marked as differing.
  await expect(table.getByRole("row", { name: /Turns \(differs\)/ })).toBeVisible();
  await expect(table.getByRole("row", { name: /^First resonance \(differs\)/ })).toBeVisible();
  await expect(table.getByRole("row", { name: /Peak with clamp/ })).toContainText("150 V");
  await expect(table.getByRole("row", { name: /Steady junction temperature/ })).toContainText("°C");
  await expect(table.getByRole("row", { name: /Broadcast note/ })).toBeVisible();
  await expect(page.getByText(/passed the team's checks on paper, not that the build is safe/)).toBeVisible();
  // Members plan; saving is for stewards.
  await expect(page.getByRole("button", { name: "Save as a planned coil" })).toHaveCount(0);

  const stewardContext = await browser.newContext();
  const stewardPage = await stewardContext.newPage();
  await signInAs(stewardPage, "steward");
  const stewardPlan = new PlanPage(stewardPage);
  await stewardPlan.open();
  await stewardPlan.planTwoVariants();
  await stewardPlan.compare();
  await expect(stewardPlan.table().getByRole("columnheader", { name: "Tall" })).toBeVisible();
  await stewardPage.getByLabel("Tag", { exact: true }).fill("E2E-P1");
  await stewardPage.getByLabel("Name", { exact: true }).fill("Planned tall");
  await stewardPage.getByLabel("Builder", { exact: true }).fill("Browser tester");
  await stewardPage.getByLabel("Variant to save").selectOption({ label: "Tall" });
  await stewardPage.getByRole("button", { name: "Save as a planned coil" }).click();

  await expect(stewardPage).toHaveURL(/\/coils\/E2E-P1\?planned=1/);
  await expect(stewardPage.getByRole("heading", { name: "E2E-P1 — Planned tall" })).toBeVisible();
  await expect(stewardPage.locator(".badge", { hasText: "Planned" })).toBeVisible();
  const planned = stewardPage.getByRole("region", { name: "Planned vs measured" });
  await expect(planned.getByRole("row", { name: /First resonance/ })).toContainText("not yet measured");
  await expect(planned.getByRole("row", { name: /First resonance/ })).toContainText("Hz");
  await expect(planned.getByRole("row", { name: /Collector\/drain peak/ })).toContainText("150 V");
  await expect(stewardPage.getByRole("link", { name: "Lend" })).toHaveCount(0);
  const parts = stewardPage.getByRole("region", { name: "Fitted parts" });
  await expect(parts.getByText("Planned clamp 150 V")).toBeVisible();

  // Into service through the ordinary status form.
  await stewardPage.getByLabel("Status", { exact: true }).selectOption("active");
  await stewardPage.getByRole("button", { name: "Save status" }).click();
  await expect(stewardPage.getByText("Status set to active.")).toBeVisible();
  await stewardContext.close();
});
