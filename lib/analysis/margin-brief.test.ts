import { describe, expect, it } from "vitest";
import { briefSessionMargins } from "./margin-brief";
import type { Margin } from "../calc/margin";

const margin = (kind: Margin["kind"], headroom: number | null): Margin => ({
  kind,
  value: 1,
  limit: 2,
  headroom,
  status: headroom === null ? "unknown" : headroom < 0 ? "exceeded" : "ok",
  formula: `${kind} ratio`,
  inputs: [{ name: "x", value: 1, unit: "V", estimated: true, source: "a long explanation of where the value came from" }],
  estimated: true,
  notes: ["a note the session page shows"],
});

describe("briefSessionMargins", () => {
  it("keeps each margin's headroom, status, formula and estimate flag, and drops inputs and notes", () => {
    const brief = briefSessionMargins({ voltage: margin("voltage", 0.2), current: margin("current", -0.1), thermal: margin("thermal", null) });
    expect(brief).toEqual({
      voltage: { kind: "voltage", headroom: 0.2, status: "ok", formula: "voltage ratio", estimated: true },
      current: { kind: "current", headroom: -0.1, status: "exceeded", formula: "current ratio", estimated: true },
      thermal: { kind: "thermal", headroom: null, status: "unknown", formula: "thermal ratio", estimated: true },
    });
    expect(JSON.stringify(brief)).not.toContain("long explanation");
  });
});
