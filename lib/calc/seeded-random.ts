/**
 * A small, seeded pseudo-random source for synthetic data (demo sweeps, test noise).
 * Seeded so that a demo database or a failing test can be reproduced exactly; Math.random cannot
 * be seeded. Not for anything security-related.
 */
import { CalcInputError, requireFinite } from "./errors";

export interface SeededRandom {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal (mean 0, standard deviation 1). */
  normal(): number;
}

/**
 * A reproducible random stream from an integer seed (0 … 2³² − 1; other integers wrap).
 * Uniforms: mulberry32, T. Ettinger's public-domain 32-bit generator (from memory) — tiny, fast,
 * passes the common statistical batteries for this kind of use. Normals: the Box–Muller transform
 * (G. E. P. Box & M. E. Muller, Ann. Math. Statist. 29(2), 1958 — from memory), both outputs used.
 */
export function createSeededRandom(seed: number): SeededRandom {
  requireFinite("seed", seed);
  if (!Number.isInteger(seed)) throw new CalcInputError("seed", "an integer", seed);
  let state = seed >>> 0;
  let spare = Number.NaN;

  const uniform = (): number => {
    state = (state + 0x6d2b79f5) | 0;
    let t = Math.imul(state ^ (state >>> 15), state | 1);
    t = (t + Math.imul(t ^ (t >>> 7), t | 61)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };

  const normal = (): number => {
    if (!Number.isNaN(spare)) {
      const value = spare;
      spare = Number.NaN;
      return value;
    }
    // 1 − u lies in (0, 1], so the logarithm is always finite.
    const radius = Math.sqrt(-2 * Math.log(1 - uniform()));
    const angle = 2 * Math.PI * uniform();
    spare = radius * Math.sin(angle);
    return radius * Math.cos(angle);
  };

  return { uniform, normal };
}
