import { describe, expect, it } from "vitest";
import { collectPartKinds, computePartExposures, countFailureModesByPart, normalizePartKey } from "./part-hours";
import { partReliability } from "../calc/reliability";

const at = (h: number) => new Date(Date.UTC(2026, 0, 1) + h * 3600_000);

describe("computePartExposures", () => {
  it("counts session hours only while each part was fitted, and failures recorded against it", () => {
    const coilA = {
      components: [
        { id: "a1", kind: "switch", partNumber: "IRFP260N", installedAt: at(0), removedAt: at(10) },
        { id: "a2", kind: "switch", partNumber: "irfp 260n", installedAt: at(10), removedAt: null },
      ],
      sessions: [
        { startedAt: at(1), durationS: 1800 },
        { startedAt: at(5), durationS: 1800 },
        { startedAt: at(12), durationS: 3600 },
      ],
    };
    const coilB = { components: [{ id: "b1", kind: "heat_sink", partNumber: "HS-40", installedAt: at(0), removedAt: null }], sessions: [{ startedAt: at(2), durationS: 7200 }] };
    const rows = computePartExposures([coilA, coilB], [{ componentId: "a1" }, { componentId: null }]);
    expect(rows.find((r) => r.componentId === "a1")).toMatchObject({ partKey: "IRFP260N", operatingHours: 1, failures: 1 });
    expect(rows.find((r) => r.componentId === "a2")).toMatchObject({ partKey: "IRFP260N", operatingHours: 1, failures: 0 });
    expect(rows.find((r) => r.componentId === "b1")).toMatchObject({ partKey: "HS40", operatingHours: 2 });

    // Pooled by part number across installs: 2 h and one failure → MTBF 2 h.
    const pooled = partReliability(rows);
    expect(pooled.find((p) => p.partKey === "IRFP260N")).toMatchObject({ records: 2, operatingHours: 2, failures: 1, mtbfHours: 2 });
    expect(collectPartKinds(rows).get("HS40")).toEqual(["heat_sink"]);
  });

  it("normalises part numbers so spelling variants pool together", () => {
    expect(normalizePartKey(" mje-13009 ")).toBe("MJE13009");
  });

  it("splits each part's failures by their stored mode, pooled like the hours", () => {
    const coil = {
      components: [
        { id: "a1", kind: "switch", partNumber: "IRFP260N", installedAt: at(0), removedAt: at(10) },
        { id: "a2", kind: "switch", partNumber: "irfp-260n", installedAt: at(10), removedAt: null },
        { id: "b1", kind: "heat_sink", partNumber: "HS-40", installedAt: at(0), removedAt: null },
      ],
      sessions: [],
    };
    const failures = [
      { componentId: "a1", mode: "unknown" },
      { componentId: "a2", mode: "over_voltage" },
      { componentId: "a1", mode: "over_voltage" },
      { componentId: null, mode: "mechanical" },
      { componentId: "gone", mode: "mechanical" },
    ];
    const modes = countFailureModesByPart(computePartExposures([coil], failures), failures);
    expect(modes.get("IRFP260N")).toEqual([
      ["over_voltage", 2],
      ["unknown", 1],
    ]);
    expect(modes.has("HS40")).toBe(false);
  });
});
