import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { assessThermalMargin, THERMAL_INPUT_NAMES, worstCaseSinkProjection, type SinkProjection } from "./thermal-margin";

const inputValue = (m: { inputs: { name: string; value: number }[] }, name: string) => m.inputs.find((i) => i.name === name)?.value;

describe("assessThermalMargin judging where a run was heading", () => {
  // A 280 W / 150 °C / 0.45 K/W TO-247 MOSFET (IRFP460 figures, from memory) on a 1.5 K/W sink, greased at 0.5 K/W.
  const device = { ratedPowerW: 280, maxJunctionTempC: 150, junctionToCaseKPerW: 0.45, caseToSinkKPerW: 0.5, sinkToAmbientKPerW: 1.5 };
  const projection = (sinkC: number): SinkProjection => ({ basis: "fit-upper-bound", sinkC, source: "upper 95 % bound of the fitted steady state" });

  it("flags a run whose recorded end was fine but whose projection passes T_j,max, reporting both junction temperatures", () => {
    const recordedOnly = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 55 });
    expect(recordedOnly.status).toBe("ok");
    const projected = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 55, sinkProjection: projection(115) });
    // Thermal chain (docs/references.md): P = (115 − 25)/1.5 = 60 W; T_j = 115 + 60·0.95 = 172 °C > 150 °C;
    // at the recorded end, with the same (transient-corrected) power: 55 + 57 = 112 °C.
    expect(inputValue(projected, THERMAL_INPUT_NAMES.junctionTemp)).toBeCloseTo(172, 9);
    expect(inputValue(projected, THERMAL_INPUT_NAMES.endJunctionTemp)).toBeCloseTo(112, 9);
    expect(inputValue(projected, THERMAL_INPUT_NAMES.caseTemp)).toBeCloseTo(145, 9); // 115 + 60·0.5
    expect(projected.status).toBe("exceeded");
    expect(projected.notes.join(" ")).toMatch(/Projected junction temperature 172 °C, above T_j,max 150 °C; at the recorded end of the run it was 112 °C/);
  });

  it("never makes the projected junction cooler when more rise remains (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 30, max: 140, noNaN: true }), fc.double({ min: 0, max: 40, noNaN: true }), (sink, more) => {
        const a = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 30, sinkProjection: projection(sink) });
        const b = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 30, sinkProjection: projection(sink + more) });
        expect(inputValue(b, THERMAL_INPUT_NAMES.junctionTemp)!).toBeGreaterThanOrEqual(inputValue(a, THERMAL_INPUT_NAMES.junctionTemp)!);
        // The status never improves. (Headroom itself can jump once the case passes T_j,max, where the derating
        // check has no permissible power left to divide by and only the junction criterion remains; both are "exceeded".)
        const severity = { ok: 0, thin: 1, exceeded: 2, unknown: 3 } as const;
        expect(severity[b.status]).toBeGreaterThanOrEqual(severity[a.status]);
      }),
    );
  });

  it("judges a run with no usable fit at the marked worst case P ≤ V·I", () => {
    // Derived bound: 24 V · 2 A = 48 W all into a 1.5 K/W sink from 25 °C: 25 + 72 = 97 °C.
    const worst = worstCaseSinkProjection({ ambientTempC: 25, supplyVoltageV: 24, supplyCurrentA: 2, sinkToAmbientKPerW: 1.5, reason: "too few samples" });
    expect(worst.basis).toBe("worst-case");
    expect(worst.sinkC).toBeCloseTo(97, 12);
    const m = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 40, sinkProjection: worst });
    expect(m.estimated).toBe(true);
    expect(m.notes.join(" ")).toMatch(/WORST CASE/);
    // P = 48 W; T_j = 97 + 48·0.95 = 142.6 °C: inside T_j,max but with a rise of 117.6/125: thin, not a silent "ok".
    expect(inputValue(m, THERMAL_INPUT_NAMES.junctionTemp)).toBeCloseTo(142.6, 9);
    expect(m.status).toBe("thin");
  });

  it("derates by the datasheet-style linear rule at the projected case temperature", () => {
    // Linear derating (Toshiba FAQ, docs/references.md): P_derated = P25·(Tj,max − Tc)/(Tj,max − 25).
    // Projected sink 85 °C: P = 40 W, Tc = 85 + 20 = 105 °C, P_derated = 280·45/125 = 100.8 W.
    const m = assessThermalMargin({ ...device, ambientTempC: 25, sinkProjection: projection(85) });
    expect(inputValue(m, THERMAL_INPUT_NAMES.deratedPower)).toBeCloseTo(100.8, 9);
  });
});
