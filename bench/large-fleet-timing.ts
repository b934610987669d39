/** Median-of-N timing after warm-up, shared by the large-fleet benchmarks. */
export async function medianMs(run: () => unknown, { warmUp = 2, rounds = 7 }: { warmUp?: number; rounds?: number } = {}): Promise<number> {
  for (let i = 0; i < warmUp; i++) await run();
  const times: number[] = [];
  for (let i = 0; i < rounds; i++) {
    const started = performance.now();
    await run();
    times.push(performance.now() - started);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)]!;
}
