import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { computeKendallS, computeKendallVariance, computeMannKendall, measureTies } from "./mann-kendall";

/** All permutations of 0…n−1 (Heap's algorithm), for exact null distributions of S. */
function permutations(n: number): number[][] {
  const out: number[][] = [];
  const a = Array.from({ length: n }, (_, i) => i);
  const c = new Array<number>(n).fill(0);
  out.push([...a]);
  let i = 0;
  while (i < n) {
    if (c[i]! < i) {
      const j = i % 2 === 0 ? 0 : c[i]!;
      [a[j], a[i]] = [a[i]!, a[j]!];
      out.push([...a]);
      c[i]! += 1;
      i = 0;
    } else {
      c[i] = 0;
      i++;
    }
  }
  return out;
}

/** S for every rearrangement of ys against fixed xs: the exact distribution under "no trend". */
function nullDistributionOfS(xs: number[], ys: number[]): number[] {
  return permutations(ys.length).map((perm) => computeKendallS(xs, perm.map((k) => ys[k]!)));
}

describe("Kendall's S", () => {
  it("is ±n(n−1)/2 for a strictly monotone series", () => {
    // derived: every pair is concordant (or every pair discordant)
    const xs = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    expect(computeKendallS(xs, xs.map((x) => x * x))).toBe(45);
    expect(computeKendallS(xs, xs.map((x) => -x))).toBe(-45);
  });
});

describe("variance of S", () => {
  it("is n(n−1)(2n+5)/18 without ties: 125 at n = 10", () => {
    // derived by hand: 10·9·25/18 = 125 (Kendall, Rank Correlation Methods, 1970, from memory)
    const none = measureTies([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    expect(computeKendallVariance(10, none, none)).toBe(125);
  });

  it("equals the exact permutation variance of S with ties in both x and y", () => {
    // Independent check: enumerate all 7! = 5040 rearrangements of y; E[S] = 0, so Var(S) = mean of S².
    const cases: [number[], number[]][] = [
      [[1, 2, 3, 4, 5, 6, 7], [3, 1, 4, 1, 5, 9, 2]],
      [[1, 1, 2, 3, 3, 3, 4], [2, 2, 2, 5, 6, 6, 1]],
      [[0, 0, 0, 1, 1, 2, 2], [1, 1, 1, 1, 2, 2, 3]],
    ];
    for (const [xs, ys] of cases) {
      const dist = nullDistributionOfS(xs, ys);
      const exact = dist.reduce((sum, s) => sum + s * s, 0) / dist.length;
      expect(computeKendallVariance(7, measureTies(xs), measureTies(ys))).toBeCloseTo(exact, 9);
    }
  });
});

describe("Mann–Kendall test", () => {
  it("gives the normal-approximation p-value close to the exact permutation p-value at n = 8", () => {
    // Exact two-sided p = P(|S| ≥ |s|) over all 8! orderings. Kendall (1970, from memory) gives the
    // continuity-corrected normal approximation as adequate from n ≈ 8; we hold it to 0.01 absolute.
    const xs = [1, 2, 3, 4, 5, 6, 7, 8];
    const ys = [2.1, 1.4, 3.3, 2.9, 4.8, 4.1, 6.0, 5.2];
    const result = computeMannKendall(xs, ys);
    const dist = nullDistributionOfS(xs, ys);
    const exactP = dist.filter((s) => Math.abs(s) >= Math.abs(result.s)).length / dist.length;
    expect(result.s).toBe(20); // counted by hand: 24 concordant, 4 discordant pairs
    expect(exactP).toBeLessThan(0.05); // so the check is made where decisions are taken
    expect(Math.abs(result.pValue - exactP)).toBeLessThan(0.01);
  });

  it("reports p = 1 and τ = 0 when y never changes", () => {
    const result = computeMannKendall([1, 2, 3, 4], [5, 5, 5, 5]);
    expect(result).toMatchObject({ s: 0, z: 0, pValue: 1, kendallTau: 0 });
  });

  it("gives Kendall's τ-b as the cosine between the pairwise sign vectors of x and y", () => {
    // derived: τ-b = Σ aᵢⱼbᵢⱼ / √(Σa²·Σb²) with a = sign(Δx), b = sign(Δy) — a different route to the same number
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 5 }), fc.integer({ min: 0, max: 5 })), { minLength: 3, maxLength: 25 }),
        (pts) => {
          const xs = pts.map(([x]) => x);
          const ys = pts.map(([, y]) => y);
          let ab = 0;
          let aa = 0;
          let bb = 0;
          for (let i = 0; i < pts.length; i++) {
            for (let j = i + 1; j < pts.length; j++) {
              const a = Math.sign(xs[j]! - xs[i]!);
              const b = Math.sign(ys[j]! - ys[i]!);
              ab += a * b;
              aa += a * a;
              bb += b * b;
            }
          }
          const expected = aa > 0 && bb > 0 ? ab / Math.sqrt(aa * bb) : 0;
          expect(computeMannKendall(xs, ys).kendallTau).toBeCloseTo(expected, 12);
        },
      ),
    );
  });
});
