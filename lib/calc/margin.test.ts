import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { assessMargin, classifyHeadroom, DEFAULT_MARGIN_THRESHOLDS, reportUnknownMargin, requireFiniteOrAbsent } from "./margin";

describe("classifyHeadroom", () => {
  it("treats a peak at exactly 80 % of the rating as within the guidance, and anything above as thin", () => {
    // Renesas knowledge base: stay within 80 % of the rated drain–source voltage (vendor guidance).
    expect(DEFAULT_MARGIN_THRESHOLDS.voltage).toBe(0.2);
    expect(classifyHeadroom(1 - 80 / 100, 0.2)).toBe("ok");
    expect(classifyHeadroom(1 - 81 / 100, 0.2)).toBe("thin");
    expect(classifyHeadroom(0, 0.2)).toBe("thin");
    expect(classifyHeadroom(-0.01, 0.2)).toBe("exceeded");
  });

  it("refuses a threshold outside 0..1 or a non-finite headroom", () => {
    expect(() => classifyHeadroom(0.5, 1.5)).toThrow(CalcInputError);
    expect(() => classifyHeadroom(Number.NaN, 0.2)).toThrow(/headroom/);
  });
});

describe("assessMargin / reportUnknownMargin", () => {
  const input = { name: "x", value: 1, unit: "V", estimated: false, source: "test" };

  it("computes headroom as 1 − value/limit and flags estimates from the inputs", () => {
    const m = assessMargin({ kind: "voltage", value: 90, limit: 120, formula: "V_peak / V_rating", inputs: [input, { ...input, estimated: true }], thinBelow: 0.2 });
    expect(m.headroom).toBeCloseTo(0.25, 15); // 1 − 90/120 by hand
    expect(m.status).toBe("ok");
    expect(m.estimated).toBe(true);
  });

  it("refuses a zero limit instead of producing an infinite headroom", () => {
    expect(() => assessMargin({ kind: "thermal", value: 1, limit: 0, formula: "P / P_derated", inputs: [], thinBelow: 0.2 })).toThrow(/thermal\.limit/);
  });

  it("reports an unknown margin with nulls, never NaN, and insists on saying what is missing", () => {
    const m = reportUnknownMargin({ kind: "current", formula: "I / I_rating", inputs: [input], notes: ["rating missing"] });
    expect(m).toMatchObject({ status: "unknown", value: null, limit: null, headroom: null });
    expect(JSON.stringify(m)).not.toMatch(/NaN|Infinity/);
    expect(() => reportUnknownMargin({ kind: "current", formula: "", inputs: [], notes: [] })).toThrow(CalcInputError);
  });
});

describe("requireFiniteOrAbsent", () => {
  it("reads null and undefined as not recorded but refuses NaN", () => {
    expect(requireFiniteOrAbsent("a", null)).toBeUndefined();
    expect(requireFiniteOrAbsent("a", undefined)).toBeUndefined();
    expect(requireFiniteOrAbsent("a", 0)).toBe(0);
    expect(() => requireFiniteOrAbsent("points[2].v", Number.NaN)).toThrow(/^points\[2\]\.v/);
  });
});
