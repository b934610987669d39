import { describe, expect, it } from "vitest";
import { fitHeatingCurve } from "../calc/heating";
import { fitFromSamples, fitSessionSamples, readStoredSinkFit } from "./session-fit";

const samples = Array.from({ length: 25 }, (_, i) => ({ elapsedS: 30 * i, temperatureC: 22 + 35 * (1 - Math.exp((-30 * i) / 240)) + (i % 3) * 0.1 }));

describe("the warm-up fit stored with a session", () => {
  it("reads back exactly the fit the samples give, through JSON as stored", () => {
    const stored = JSON.parse(JSON.stringify(fitSessionSamples(samples))) as ReturnType<typeof fitSessionSamples>;
    const read = readStoredSinkFit(stored);
    const direct = fitHeatingCurve(samples.map((s) => ({ time: s.elapsedS, temperature: s.temperatureC })));
    expect(read?.fit).toEqual(direct);
    expect(stored.sinkSteadyStateC).toBe(direct.steadyState);
    expect(stored.sinkFitSampleCount).toBe(25);
  });

  it("keeps an unbounded uncertainty unbounded (Infinity is stored as null)", () => {
    const three = samples.slice(0, 3);
    const read = readStoredSinkFit(JSON.parse(JSON.stringify(fitSessionSamples(three))) as ReturnType<typeof fitSessionSamples>);
    expect(read?.fit?.standardErrors.steadyState).toBe(Infinity);
  });

  it("says when too few samples were logged, and marks a row never fitted as such", () => {
    expect(fitFromSamples(samples.slice(0, 2))).toEqual({ fit: null, note: expect.stringMatching(/Only 2 heat-sink samples were logged: too few/) });
    expect(fitFromSamples([]).note).toMatch(/^No heat-sink samples were logged/);
    expect(readStoredSinkFit({ sinkFitSampleCount: null })).toBeUndefined();
  });
});
