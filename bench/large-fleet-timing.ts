/** Median-of-N timing after warm-up, shared by the large-fleet benchmarks. `prepare` runs before each round, untimed. */
export async function medianMs(
  run: () => unknown,
  { warmUp = 2, rounds = 7, prepare }: { warmUp?: number; rounds?: number; prepare?: () => unknown } = {},
): Promise<number> {
  for (let i = 0; i < warmUp; i++) {
    await prepare?.();
    await run();
  }
  const times: number[] = [];
  for (let i = 0; i < rounds; i++) {
    await prepare?.();
    const started = performance.now();
    await run();
    times.push(performance.now() - started);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)]!;
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

/**
 * A page against its floor, measured in alternation (page, floor, page, floor…) so that whatever else the machine is
 * doing weighs on both alike; on this shared 2-core machine two separate runs of the same floor differed by ×2.
 * Reports each median and the median of the per-round ratios. `prepare` runs before each page round, untimed.
 */
export async function pairedMs(
  run: () => unknown,
  floor: () => unknown,
  { warmUp = 10, rounds = 41, prepare }: { warmUp?: number; rounds?: number; prepare?: () => unknown } = {},
): Promise<{ ms: number; floorMs: number; ratio: number }> {
  const time = async (f: () => unknown) => {
    const started = performance.now();
    await f();
    return performance.now() - started;
  };
  for (let i = 0; i < warmUp; i++) {
    await prepare?.();
    await run();
    await floor();
  }
  const runs: number[] = [];
  const floors: number[] = [];
  const ratios: number[] = [];
  for (let i = 0; i < rounds; i++) {
    await prepare?.();
    const ms = await time(run);
    const floorMs = await time(floor);
    runs.push(ms);
    floors.push(floorMs);
    ratios.push(ms / floorMs);
  }
  return { ms: median(runs), floorMs: median(floors), ratio: median(ratios) };
}
