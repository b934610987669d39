/**
 * A site's lending policy against the organisation's default. The organisation sets the floor every site lends
 * by; a site may ask more of its own coils (a higher headroom, a fresher sweep, more checklist items…) but never
 * less. This file says, field by field, where a site's rules are looser than the default (a save is refused with
 * those messages), where they are stricter, and what the effective policy is: the stricter of each threshold, so
 * a later change of the default can never leave a site below it, whichever of the two was saved last.
 *
 * Directions (a policy choice, common practice): a higher least headroom, junction margin or count of clean
 * sessions is stricter; a shorter sweep age or validity is stricter; not accepting estimated margins is stricter;
 * every checklist item of the default must stay, in the default's words, and a site may add its own.
 * The ITU region is not a strictness: the bands differ between regions (Region 1 adds long wave), so none
 * contains the others and a site cannot "tighten" it. It is where the organisation's coils are run, set once by the
 * organisation; a site's rules must name the same region, and the effective policy always takes the default's.
 */
import { validateClearancePolicy, type ClearancePolicyRules } from "./clearance-policy";
import type { ChecklistItem } from "./lending-checklist";

export type PolicyField = keyof ClearancePolicyRules;

export interface PolicyFieldComparison {
  field: PolicyField;
  /** For a checklist finding: the item concerned. */
  itemId?: string;
  relation: "looser" | "stricter";
  /** Plain words naming the field, the site's value and the default's. */
  message: string;
}

type Direction = "higher-is-stricter" | "lower-is-stricter";

interface NumericField {
  field: "minVoltageHeadroom" | "minCurrentHeadroom" | "minThermalHeadroom" | "minJunctionMarginK" | "maxSweepAgeDays" | "minFailureFreeSessions" | "validityDays";
  label: string;
  direction: Direction;
  show: (value: number) => string;
}

const percent = (fraction: number) => `${Math.round(fraction * 1000) / 10} %`;
const days = (n: number) => `${n} day${n === 1 ? "" : "s"}`;

const NUMERIC_FIELDS: readonly NumericField[] = [
  { field: "minVoltageHeadroom", label: "Least voltage headroom", direction: "higher-is-stricter", show: percent },
  { field: "minCurrentHeadroom", label: "Least current headroom", direction: "higher-is-stricter", show: percent },
  { field: "minThermalHeadroom", label: "Least thermal headroom", direction: "higher-is-stricter", show: percent },
  { field: "minJunctionMarginK", label: "Junction margin", direction: "higher-is-stricter", show: (k) => `${k} K` },
  { field: "maxSweepAgeDays", label: "Oldest acceptable sweep", direction: "lower-is-stricter", show: days },
  { field: "minFailureFreeSessions", label: "Clean sessions needed", direction: "higher-is-stricter", show: (n) => `${n} session${n === 1 ? "" : "s"}` },
  { field: "validityDays", label: "Validity", direction: "lower-is-stricter", show: days },
];

/**
 * Every field where the site's rules differ from the default's, each marked looser or stricter, in the order the
 * policy form shows them. An empty list: the site asks exactly what the default does.
 */
export function comparePolicyToDefault(defaultRules: ClearancePolicyRules, siteRules: ClearancePolicyRules): PolicyFieldComparison[] {
  validateClearancePolicy(defaultRules);
  validateClearancePolicy(siteRules);
  const found: PolicyFieldComparison[] = [];
  for (const { field, label, direction, show } of NUMERIC_FIELDS) {
    const site = siteRules[field];
    const floor = defaultRules[field];
    if (site === floor) continue;
    const stricter = direction === "higher-is-stricter" ? site > floor : site < floor;
    const way = direction === "higher-is-stricter" ? (stricter ? "above" : "below") : stricter ? "under" : "over";
    found.push({
      field,
      relation: stricter ? "stricter" : "looser",
      message: stricter
        ? `${label}: ${show(site)}, ${way} the organisation's ${show(floor)}.`
        : `${label}: ${show(site)} is looser than the organisation's ${show(floor)}; a site may only ${direction === "higher-is-stricter" ? "raise" : "lower"} it.`,
    });
  }
  if (siteRules.acceptEstimatedMargins !== defaultRules.acceptEstimatedMargins) {
    found.push(
      siteRules.acceptEstimatedMargins
        ? {
            field: "acceptEstimatedMargins",
            relation: "looser",
            message: "Estimated margins: the organisation does not accept margins resting on estimates, so a site cannot accept them.",
          }
        : { field: "acceptEstimatedMargins", relation: "stricter", message: "Estimated margins: not accepted at this site (the organisation accepts them)." },
    );
  }
  if (siteRules.ituRegion !== defaultRules.ituRegion) {
    found.push({
      field: "ituRegion",
      relation: "looser",
      message: `ITU region: the organisation lends by Region ${defaultRules.ituRegion}'s broadcast bands; a site cannot change the region (Region ${siteRules.ituRegion} asked).`,
    });
  }
  found.push(...compareChecklists(defaultRules.requiredChecklist, siteRules.requiredChecklist));
  return found;
}

function compareChecklists(defaultItems: readonly ChecklistItem[], siteItems: readonly ChecklistItem[]): PolicyFieldComparison[] {
  const siteById = new Map(siteItems.map((item) => [item.id, item]));
  const defaultIds = new Set(defaultItems.map((item) => item.id));
  const found: PolicyFieldComparison[] = [];
  for (const item of defaultItems) {
    const own = siteById.get(item.id);
    if (!own) {
      found.push({ field: "requiredChecklist", itemId: item.id, relation: "looser", message: `Checklist: the organisation's item “${item.id}” cannot be left out.` });
    } else if (own.text !== item.text) {
      found.push({
        field: "requiredChecklist",
        itemId: item.id,
        relation: "looser",
        message: `Checklist: the organisation's item “${item.id}” cannot be reworded at a site; keep its words and add an item of the site's own instead.`,
      });
    }
  }
  for (const item of siteItems) {
    if (!defaultIds.has(item.id)) found.push({ field: "requiredChecklist", itemId: item.id, relation: "stricter", message: `Checklist: adds “${item.id}”.` });
  }
  return found;
}

/** Only the fields where the site's rules are looser than the default: what refuses a site's save. */
export function findLoosenings(defaultRules: ClearancePolicyRules, siteRules: ClearancePolicyRules): PolicyFieldComparison[] {
  return comparePolicyToDefault(defaultRules, siteRules).filter((c) => c.relation === "looser");
}

/**
 * The policy a site lends by: the stricter of each threshold of the default and the site's own rules, the union of
 * the checklists (the default's items first, in its words; then the site's own) and the default's ITU region.
 * With no rules of the site's own it is the default.
 */
export function effectivePolicyRules(defaultRules: ClearancePolicyRules, siteRules: ClearancePolicyRules | null): ClearancePolicyRules {
  validateClearancePolicy(defaultRules);
  if (siteRules === null) return defaultRules;
  validateClearancePolicy(siteRules);
  const defaultIds = new Set(defaultRules.requiredChecklist.map((item) => item.id));
  return {
    minVoltageHeadroom: Math.max(defaultRules.minVoltageHeadroom, siteRules.minVoltageHeadroom),
    minCurrentHeadroom: Math.max(defaultRules.minCurrentHeadroom, siteRules.minCurrentHeadroom),
    minThermalHeadroom: Math.max(defaultRules.minThermalHeadroom, siteRules.minThermalHeadroom),
    minJunctionMarginK: Math.max(defaultRules.minJunctionMarginK, siteRules.minJunctionMarginK),
    acceptEstimatedMargins: defaultRules.acceptEstimatedMargins && siteRules.acceptEstimatedMargins,
    ituRegion: defaultRules.ituRegion,
    maxSweepAgeDays: Math.min(defaultRules.maxSweepAgeDays, siteRules.maxSweepAgeDays),
    minFailureFreeSessions: Math.max(defaultRules.minFailureFreeSessions, siteRules.minFailureFreeSessions),
    requiredChecklist: [...defaultRules.requiredChecklist, ...siteRules.requiredChecklist.filter((item) => !defaultIds.has(item.id))],
    validityDays: Math.min(defaultRules.validityDays, siteRules.validityDays),
  };
}
