import { describe, expect, it } from "vitest";
import { seededRandom } from "@/lib/seeded-random";
import { startOrder } from "./bar-evidence";

describe("the sounding notes in order of start", () => {
  it("orders several parts and voices like the stable built-in sort (ECMAScript 2019 Array.prototype.sort is stable)", () => {
    const random = seededRandom(5);
    for (const [parts, bars] of [[1, 1], [2, 3], [3, 40], [5, 200]] as const) {
      // Each part written bar by bar, voices of a bar one after the other (as after a `backup`),
      // notes on a sixteenth grid so that parts strike together.
      const pos: number[] = [];
      const bar: number[] = [];
      for (let p = 0; p < parts; p++) {
        for (let b = 0; b < bars; b++) {
          const voices = 1 + Math.floor(random() * 2);
          for (let v = 0; v < voices; v++) for (let t = 0; t < 1; t += 1 / 16) if (random() < 0.4) {
            pos.push(b + t);
            bar.push(b);
          }
        }
      }
      const reference = pos.map((_, k) => k).sort((a, b) => pos[a] - pos[b] || a - b);
      const order = startOrder(pos, bar, pos.length);
      const sortedAlready = reference.every((k, i) => k === i);
      if (sortedAlready) expect(order).toBeNull();
      else expect([...order!]).toEqual(reference);
    }
  });

  it("leaves one voice's notes as read", () => {
    expect(startOrder([0, 0.25, 0.5, 1, 1], [0, 0, 0, 1, 1], 5)).toBeNull();
  });
});
