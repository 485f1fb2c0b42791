import { describe, expect, it } from "vitest";
import { seededRandom } from "@/lib/seeded-random";
import { IndexSet } from "./index-set";

/** The same queries answered by a scan over a plain sorted list: the reference. */
const prevOf = (members: number[], i: number) => members.filter((m) => m <= i).at(-1) ?? -1;
const nextOf = (members: number[], i: number, fallback: number) => members.find((m) => m > i) ?? fallback;

describe("index set (nearest member queries)", () => {
  it("answers like a scan on sizes across word and level edges", () => {
    const random = seededRandom(3);
    for (const n of [1, 2, 31, 32, 33, 64, 1023, 1024, 1025, 5000, 40_000]) {
      for (const density of [0, 0.001, 0.05, 0.5]) {
        const set = new IndexSet(n);
        const members: number[] = [];
        for (let i = 0; i < n; i++) if (random() < density) members.push(i);
        for (const m of [...members].sort(() => random() - 0.5)) set.add(m);
        const probes = n <= 2048 ? Array.from({ length: n + 2 }, (_, i) => i - 1) : Array.from({ length: 3000 }, () => Math.floor(random() * n));
        for (const i of probes) {
          expect(set.prev(i), `prev(${i}) of n=${n}`).toBe(prevOf(members, i));
          expect(set.next(i, n), `next(${i}) of n=${n}`).toBe(nextOf(members, i, n));
          if (i >= 0 && i < n) expect(set.has(i)).toBe(members.includes(i));
        }
      }
    }
  });

  it("finds members at both ends of a long set", () => {
    const set = new IndexSet(100_000);
    set.add(0);
    set.add(99_999);
    expect(set.next(0, -5)).toBe(99_999);
    expect(set.prev(99_998)).toBe(0);
    expect(set.next(99_999, -5)).toBe(-5);
    expect(set.prev(200_000)).toBe(99_999);
  });
});
