import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { DEFAULT_CLEARANCE_POLICY, type ClearancePolicyRules } from "./clearance-policy";
import { comparePolicyToDefault, effectivePolicyRules, findLoosenings } from "./policy-tightening";
import { CalcInputError } from "./errors";

// The organisation's default in these tests is the shipped default policy (clearance-policy.ts, common practice values).
const base: ClearancePolicyRules = { ...DEFAULT_CLEARANCE_POLICY };
const siteItem = { id: "site-key-box", text: "The driver's key is kept in the site's key box between runs.", source: "common practice" };

describe("findLoosenings: a site's rules against the default, field by field", () => {
  it("finds nothing when the site asks exactly what the default does", () => {
    expect(comparePolicyToDefault(base, base)).toEqual([]);
  });

  it("names each looser threshold with the site's value, the default's and which way it may move", () => {
    const found = findLoosenings(base, {
      ...base,
      minVoltageHeadroom: base.minVoltageHeadroom - 0.05,
      minJunctionMarginK: base.minJunctionMarginK - 5,
      maxSweepAgeDays: base.maxSweepAgeDays + 30,
      validityDays: base.validityDays + 1,
    });
    expect(found.map((f) => f.field)).toEqual(["minVoltageHeadroom", "minJunctionMarginK", "maxSweepAgeDays", "validityDays"]);
    expect(found[0]!.message).toBe(
      `Least voltage headroom: ${Math.round((base.minVoltageHeadroom - 0.05) * 1000) / 10} % is looser than the organisation's ${Math.round(base.minVoltageHeadroom * 1000) / 10} %; a site may only raise it.`,
    );
    expect(found[1]!.message).toBe(`Junction margin: ${base.minJunctionMarginK - 5} K is looser than the organisation's ${base.minJunctionMarginK} K; a site may only raise it.`);
    expect(found[2]!.message).toBe(`Oldest acceptable sweep: ${base.maxSweepAgeDays + 30} days is looser than the organisation's ${base.maxSweepAgeDays} days; a site may only lower it.`);
    expect(found[3]!.message).toContain("a site may only lower it");
  });

  it("refuses fewer clean sessions, each current and thermal headroom on its own", () => {
    expect(findLoosenings(base, { ...base, minFailureFreeSessions: base.minFailureFreeSessions - 1 }).map((f) => f.field)).toEqual(["minFailureFreeSessions"]);
    expect(findLoosenings(base, { ...base, minCurrentHeadroom: base.minCurrentHeadroom / 2 }).map((f) => f.field)).toEqual(["minCurrentHeadroom"]);
    expect(findLoosenings(base, { ...base, minThermalHeadroom: 0 }).map((f) => f.field)).toEqual(["minThermalHeadroom"]);
  });

  it("refuses accepting estimates the organisation does not accept, and allows refusing them", () => {
    const strictDefault = { ...base, acceptEstimatedMargins: false };
    expect(findLoosenings(strictDefault, { ...strictDefault, acceptEstimatedMargins: true })).toEqual([
      expect.objectContaining({ field: "acceptEstimatedMargins", message: expect.stringContaining("cannot accept them") }),
    ]);
    expect(comparePolicyToDefault(base, { ...base, acceptEstimatedMargins: false })).toEqual([expect.objectContaining({ field: "acceptEstimatedMargins", relation: "stricter" })]);
  });

  it("refuses another ITU region: no region's bands contain the others' (ITU RR Article 5, broadcast-band.ts)", () => {
    const found = findLoosenings(base, { ...base, ituRegion: base.ituRegion === 1 ? 2 : 1 });
    expect(found).toHaveLength(1);
    expect(found[0]!.field).toBe("ituRegion");
    expect(found[0]!.message).toContain(`Region ${base.ituRegion}`);
  });

  it("refuses a default checklist item left out or reworded, naming the item; an added item is stricter", () => {
    const [first, second, ...rest] = base.requiredChecklist;
    const found = comparePolicyToDefault(base, { ...base, requiredChecklist: [{ ...second!, text: `${second!.text} Mostly.` }, ...rest, siteItem] });
    expect(found).toEqual([
      { field: "requiredChecklist", itemId: first!.id, relation: "looser", message: `Checklist: the organisation's item “${first!.id}” cannot be left out.` },
      expect.objectContaining({ field: "requiredChecklist", itemId: second!.id, relation: "looser", message: expect.stringContaining("cannot be reworded") }),
      { field: "requiredChecklist", itemId: siteItem.id, relation: "stricter", message: `Checklist: adds “${siteItem.id}”.` },
    ]);
  });

  it("marks a tightening as stricter and finds no loosening in it", () => {
    const tighter = { ...base, minVoltageHeadroom: base.minVoltageHeadroom + 0.1, validityDays: 30, requiredChecklist: [...base.requiredChecklist, siteItem] };
    expect(findLoosenings(base, tighter)).toEqual([]);
    expect(comparePolicyToDefault(base, tighter).map((c) => [c.field, c.relation])).toEqual([
      ["minVoltageHeadroom", "stricter"],
      ["validityDays", "stricter"],
      ["requiredChecklist", "stricter"],
    ]);
  });

  it("throws CalcInputError naming the field of rules out of range", () => {
    expect(() => findLoosenings(base, { ...base, minVoltageHeadroom: 1.5 })).toThrow(CalcInputError);
    expect(() => findLoosenings(base, { ...base, validityDays: 0 })).toThrow(/policy\.validityDays/);
  });
});

describe("effectivePolicyRules: the stricter of each threshold", () => {
  it("is the default when the site has no rules of its own", () => {
    expect(effectivePolicyRules(base, null)).toEqual(base);
  });

  it("takes each field from whichever side is stricter, the union of the checklists and the default's region", () => {
    const site: ClearancePolicyRules = {
      ...base,
      minVoltageHeadroom: base.minVoltageHeadroom + 0.1, // stricter at the site
      minCurrentHeadroom: base.minCurrentHeadroom - 0.05, // looser (the default was raised after the site saved)
      maxSweepAgeDays: 30,
      validityDays: base.validityDays + 10,
      acceptEstimatedMargins: false,
      ituRegion: base.ituRegion === 1 ? 3 : 1,
      requiredChecklist: [siteItem, ...base.requiredChecklist.slice(1)],
    };
    const effective = effectivePolicyRules(base, site);
    expect(effective.minVoltageHeadroom).toBe(site.minVoltageHeadroom);
    expect(effective.minCurrentHeadroom).toBe(base.minCurrentHeadroom);
    expect(effective.maxSweepAgeDays).toBe(30);
    expect(effective.validityDays).toBe(base.validityDays);
    expect(effective.acceptEstimatedMargins).toBe(false);
    expect(effective.ituRegion).toBe(base.ituRegion);
    expect(effective.requiredChecklist.map((i) => i.id)).toEqual([...base.requiredChecklist.map((i) => i.id), siteItem.id]);
  });

  const fraction = fc.double({ min: 0, max: 1, noNaN: true });
  const rulesArb: fc.Arbitrary<ClearancePolicyRules> = fc.record({
    minVoltageHeadroom: fraction,
    minCurrentHeadroom: fraction,
    minThermalHeadroom: fraction,
    minJunctionMarginK: fc.integer({ min: 0, max: 150 }),
    acceptEstimatedMargins: fc.boolean(),
    ituRegion: fc.constantFrom(1 as const, 2 as const, 3 as const),
    maxSweepAgeDays: fc.integer({ min: 1, max: 3650 }),
    minFailureFreeSessions: fc.integer({ min: 0, max: 1000 }),
    requiredChecklist: fc.subarray([...base.requiredChecklist, siteItem], { minLength: 1 }),
    validityDays: fc.integer({ min: 1, max: 3650 }),
  });

  it("is never looser than the default, whatever either says (property)", () => {
    fc.assert(
      fc.property(rulesArb, rulesArb, (defaultRules, siteRules) => {
        expect(findLoosenings(defaultRules, effectivePolicyRules(defaultRules, siteRules))).toEqual([]);
      }),
    );
  });

  it("keeps every tightening a site saved (property)", () => {
    fc.assert(
      fc.property(rulesArb, rulesArb, (defaultRules, siteRules) => {
        const effective = effectivePolicyRules(defaultRules, siteRules);
        // Against the site's own rules the effective policy is looser only where the site may not decide: the region.
        const sameRegionSite = { ...siteRules, ituRegion: defaultRules.ituRegion };
        const looser = findLoosenings({ ...sameRegionSite, requiredChecklist: siteRules.requiredChecklist.filter((i) => effective.requiredChecklist.some((e) => e.id === i.id && e.text === i.text)) }, effective);
        expect(looser).toEqual([]);
      }),
    );
  });
});
