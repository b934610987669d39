/**
 * Counts of sign-in checks and token decodes, kept only when the server runs with COILYARD_BENCH_FLOOR=1 (as the
 * benchmark starts it) so `npm run bench -- --load` can print how many a page request costs (issue 13: one check per
 * request). Kept on globalThis because the proxy and the pages are bundled separately but run in one process.
 * Otherwise nothing is counted and nothing is exposed.
 */
export type AuthStep = "signInChecks" | "tokenDecodes";

type AuthCounts = Record<AuthStep, number>;

const KEY = Symbol.for("coilyard.authCounts");

function counts(): AuthCounts {
  const holder = globalThis as { [KEY]?: AuthCounts };
  return (holder[KEY] ??= { signInChecks: 0, tokenDecodes: 0 });
}

export function countAuthStep(step: AuthStep): void {
  if (process.env.COILYARD_BENCH_FLOOR === "1") counts()[step] += 1;
}

/** The counts so far in this process (zeros unless counting is on). */
export function readAuthCounts(): AuthCounts {
  return { ...counts() };
}
