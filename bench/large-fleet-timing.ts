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
