/**
 * Timing of the two heavy lib/calc routines on large inputs, each against one plain pass over the
 * same data, so a slowdown shows up as a ratio rather than a machine-dependent number.
 */
import { impedanceFromDividerRatio } from "../lib/calc/divider";
import { fitHeatingCurve, type HeatingSample } from "../lib/calc/heating";
import { createLineModel, simulateSweep } from "../lib/calc/line-model";
import { createSeededRandom } from "../lib/calc/seeded-random";
import { analyzeSweep } from "../lib/calc/sweep";

const WARM_UP_RUNS = 10;
const TIMED_RUNS = 21;

/**
 * Median wall times in ms of `work` and of `plain`, run alternately (after WARM_UP_RUNS untimed
 * rounds) so that both meet the data in the same cache state.
 */
function medianPairMs(work: () => number, plain: () => number): { work: number; plain: number } {
  let sink = 0;
  for (let i = 0; i < WARM_UP_RUNS; i++) sink += work() + plain();
  const workTimes: number[] = [];
  const plainTimes: number[] = [];
  for (let i = 0; i < TIMED_RUNS; i++) {
    let start = performance.now();
    sink += work();
    workTimes.push(performance.now() - start);
    start = performance.now();
    sink += plain();
    plainTimes.push(performance.now() - start);
  }
  if (Number.isNaN(sink)) throw new Error("benchmark produced NaN");
  const median = (xs: number[]) => xs.sort((a, b) => a - b)[xs.length >> 1] as number;
  return { work: median(workTimes), plain: median(plainTimes) };
}

function report(name: string, { work, plain }: { work: number; plain: number }): void {
  console.log(`${name}: median ${work.toFixed(2)} ms; one plain pass ${plain.toFixed(3)} ms; ratio ${(work / plain).toFixed(1)}×`);
}

function benchSweep(): void {
  const count = 100_000;
  const resistance = 20_000;
  const source = 20;
  const model = createLineModel({
    firstSeriesResonance: 180e3,
    characteristicImpedance: 5e3,
    topCapacitance: 12e-12,
    dispersionExponent: 0.15,
    q: 40,
  });
  const rng = createSeededRandom(2024);
  const frequencies: number[] = [];
  let f = 60e3;
  for (let i = 0; i < count; i++) {
    frequencies.push(f);
    f *= 1 + 3.5e-5 * (0.3 + 1.4 * rng.uniform()); // uneven steps, 60 kHz to about 2 MHz
  }
  const points = simulateSweep({ model, seriesResistance: resistance, sourceAmplitude: source, frequencies, noise: { relative: 0.01 }, rng });
  const times = medianPairMs(
    () => {
      const result = analyzeSweep({ seriesResistance: resistance, sourceAmplitude: source, points });
      return result.seriesResonances.length + result.parallelResonances.length;
    },
    () => {
      // one pass: the divider |Z| of every reading, summed
      let sum = 0;
      for (const p of points) sum += impedanceFromDividerRatio(resistance, p.amplitude / source);
      return sum;
    },
  );
  const found = analyzeSweep({ seriesResistance: resistance, sourceAmplitude: source, points });
  report(
    `analyzeSweep, ${count} points (${found.seriesResonances.length} series, ${found.parallelResonances.length} parallel found)`,
    times,
  );
}

function benchHeating(): void {
  const count = 10_000;
  const rng = createSeededRandom(7);
  const samples: HeatingSample[] = [];
  for (let i = 0; i < count; i++) {
    const time = 0.5 * i;
    samples.push({ time, temperature: 23 + 41 * (1 - Math.exp(-time / 900)) + 0.2 * rng.normal() });
  }
  const fit = fitHeatingCurve(samples);
  const times = medianPairMs(
    () => fitHeatingCurve(samples).timeConstant,
    () => {
      // one pass: the model's squared residuals, summed
      let sum = 0;
      for (const s of samples) {
        const r = s.temperature - (fit.ambient + fit.rise * (1 - Math.exp(-s.time / fit.timeConstant)));
        sum += r * r;
      }
      return sum;
    },
  );
  report(`fitHeatingCurve, ${count} samples (τ = ${fit.timeConstant.toFixed(0)} s)`, times);
}

export async function benchCalc(): Promise<void> {
  console.log("lib/calc");
  benchSweep();
  benchHeating();
}
