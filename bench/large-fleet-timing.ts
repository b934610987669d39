/** Timing helpers shared by the benchmarks: median-of-N after warm-up, page-vs-floor pairs, and batched alternation. */
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
 * A page against its floor, measured in alternation so that whatever else the machine is doing weighs on both alike; on
 * this shared 2-core machine two separate runs of the same floor differed by ×2. The order within a round swaps every
 * round (page then floor, floor then page), so neither always runs on the caches the other just warmed. Reports each
 * median and the median of the per-round ratios. `prepare` runs before each page run, untimed.
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
    const floorFirst = i % 2 === 1;
    const floorBefore = floorFirst ? await time(floor) : 0;
    await prepare?.();
    const ms = await time(run);
    const floorMs = floorFirst ? floorBefore : await time(floor);
    runs.push(ms);
    floors.push(floorMs);
    ratios.push(ms / floorMs);
  }
  return { ms: median(runs), floorMs: median(floors), ratio: median(ratios) };
}

/** One way of doing a workload's call: the code measured, or its floor. */
export interface Contender {
  name: string;
  call: () => unknown;
}

/**
 * Per-call time of each contender for calls too short to time one by one: batches of `batch` calls, the contenders
 * taking turns within each round and the order rotating round by round, so that whatever else the shared machine does
 * weighs on all alike. Returns each one's median per-call ms and its median per-round ratio to the LAST contender
 * (the floor).
 */
export async function alternateBatches(
  contenders: Contender[],
  { batch, rounds = 15, warmUp = batch * 2 }: { batch: number; rounds?: number; warmUp?: number },
): Promise<{ name: string; ms: number; ratio: number }[]> {
  for (const c of contenders) for (let i = 0; i < warmUp; i++) await c.call();
  const perCall = contenders.map(() => [] as number[]);
  const ratios = contenders.map(() => [] as number[]);
  for (let round = 0; round < rounds; round++) {
    const times: number[] = new Array(contenders.length);
    for (let k = 0; k < contenders.length; k++) {
      const index = (k + round) % contenders.length;
      const started = performance.now();
      for (let i = 0; i < batch; i++) await contenders[index]!.call();
      times[index] = (performance.now() - started) / batch;
    }
    const floor = times[contenders.length - 1]!;
    times.forEach((t, index) => {
      perCall[index]!.push(t);
      ratios[index]!.push(t / floor);
    });
  }
  return contenders.map((c, index) => ({ name: c.name, ms: median(perCall[index]!), ratio: median(ratios[index]!) }));
}
