import { describe, expect, it } from "vitest";
import { borrowScratch } from "./scratch-buffers";

describe("borrowScratch", () => {
  it("hands a slot the same memory again, and separate slots separate memory", () => {
    const a = borrowScratch("test.a", 100);
    a[5] = 42;
    const again = borrowScratch("test.a", 80);
    expect(again.length).toBe(80);
    expect(again[5]).toBe(42);
    const b = borrowScratch("test.b", 100);
    b[5] = 7;
    expect(a[5]).toBe(42);
  });

  it("grows a slot on demand and gives very large requests their own array", () => {
    const small = borrowScratch("test.c", 10);
    const bigger = borrowScratch("test.c", 5_000);
    expect(bigger.length).toBe(5_000);
    expect(bigger.buffer).not.toBe(small.buffer);
    const huge = borrowScratch("test.c", 1 << 19);
    expect(huge.length).toBe(1 << 19);
    expect(borrowScratch("test.c", 5_000).buffer).toBe(bigger.buffer);
  });
});
