/**
 * The coil page's logbook filter (lib/db/coil-timeline.ts with lib/validation/timeline.ts): each filter keeps only its
 * kinds, shows up to the limit of them however many other records are newer, and says when there are more.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { resetDatabase, mainScope, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { getCoilTimeline, TIMELINE_FILTER_KINDS } from "@/lib/db/coil-timeline";
import { readCoilPage } from "@/lib/db/coil-page";
import { TIMELINE_FILTERS, timelineFilterSchema } from "@/lib/validation/timeline";

beforeEach(resetDatabase);

const scope = mainScope(null);

describe("the logbook filter", () => {
  it("keeps only the filter's kinds, newest first", async () => {
    const now = new Date();
    const coil = await makeCleanCoil("TL-01", now);
    const all = await getCoilTimeline(scope, coil.id);
    expect(new Set(all.events.map((e) => e.kind))).toEqual(new Set(["session", "sweep", "part-fitted"]));
    for (const filter of TIMELINE_FILTERS) {
      const filtered = await getCoilTimeline(scope, coil.id, 25, undefined, filter);
      expect(filtered.events.every((e) => TIMELINE_FILTER_KINDS[filter].includes(e.kind))).toBe(true);
      // The same events as the unfiltered timeline's of those kinds (all fit in 25 here).
      expect(filtered.events).toEqual(all.events.filter((e) => TIMELINE_FILTER_KINDS[filter].includes(e.kind)));
    }
    expect((await getCoilTimeline(scope, coil.id, 25, undefined, "sweeps")).events).toHaveLength(1);
    expect((await getCoilTimeline(scope, coil.id, 25, undefined, "parts")).events).toHaveLength(3);
  });

  it("fills the limit with its own kind even when other records are newer, and says when it is cut", async () => {
    const now = new Date();
    const coil = await makeCleanCoil("TL-02", now);
    const topLoad = await testDb.topLoad.findFirstOrThrow({ where: { coilId: coil.id } });
    // Five sweeps, older than every session: an unfiltered limit of 3 would show none of them.
    for (let i = 0; i < 5; i++) {
      await testDb.sweep.create({ data: { coilId: coil.id, topLoadId: topLoad.id, takenAt: new Date(now.getTime() - (400 + i) * 86_400_000), seriesResistanceOhm: 10_000, sourceAmplitudeV: 10 } });
    }
    const sweeps = await getCoilTimeline(scope, coil.id, 3, undefined, "sweeps");
    expect(sweeps.events.map((e) => e.kind)).toEqual(["sweep", "sweep", "sweep"]);
    expect(sweeps.truncated).toBe(true);
    expect((await getCoilTimeline(scope, coil.id, 10, undefined, "sweeps")).truncated).toBe(false);
    // Through the coil page's read, as the page passes it.
    const page = (await readCoilPage(scope, "TL-02", 3, "sweeps"))!;
    expect(page.timeline.events).toEqual(sweeps.events);
  });

  it("reads an absent, 'all' or unknown ?log= as every kind", () => {
    expect(timelineFilterSchema.parse(undefined)).toBeNull();
    expect(timelineFilterSchema.parse("all")).toBeNull();
    expect(timelineFilterSchema.parse("nonsense")).toBeNull();
    expect(timelineFilterSchema.parse(["sweeps", "loans"])).toBeNull();
    expect(timelineFilterSchema.parse("loans")).toBe("loans");
  });
});
