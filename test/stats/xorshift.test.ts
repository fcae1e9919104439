import { describe, expect, it } from "vitest";
import { xorshift32 } from "../../src/stats/xorshift";

describe("xorshift32", () => {
  it("follows Marsaglia's 13-17-5 recurrence (first step worked by hand from seed 1)", () => {
    // 1 ^ (1 << 13) = 8193; 8193 ^ (8193 >>> 17) = 8193; 8193 ^ (8193 << 5) = 270369
    expect(xorshift32(1)()).toBe(270369 / 2 ** 32);
  });

  it("repeats for a seed, stays in [0, 1), and treats seed 0 as 1 (the all-zero state is fixed)", () => {
    const a = xorshift32(2024);
    const b = xorshift32(2024);
    for (let i = 0; i < 10_000; i++) {
      const x = a();
      expect(x).toBe(b());
      expect(x >= 0 && x < 1).toBe(true);
    }
    expect(xorshift32(0)()).toBe(xorshift32(1)());
  });
});
