import { describe, expect, it } from "vitest";
import { selectHealthWindow } from "./health-window";

const numbers = (n: number) => Array.from({ length: n }, (_, i) => i);

describe("selectHealthWindow", () => {
  it("keeps a short logbook whole", () => {
    expect(selectHealthWindow(numbers(63))).toEqual(numbers(63));
  });

  it("keeps the baseline and the most recent sessions of a long logbook, in order", () => {
    const kept = selectHealthWindow(numbers(500));
    expect(kept).toHaveLength(63);
    expect(kept.slice(0, 3)).toEqual([0, 1, 2]);
    expect(kept.slice(3)).toEqual(numbers(60).map((i) => 440 + i));
  });

  it("honours a custom window", () => {
    expect(selectHealthWindow(numbers(10), { baselineSessions: 1, recentSessions: 2 })).toEqual([0, 8, 9]);
  });
});
