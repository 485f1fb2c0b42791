import { describe, expect, it } from "vitest";
import { seededRandom } from "@/lib/seeded-random";
import { orderByKey } from "./order";

describe("order by a whole-number key", () => {
  it("orders like the stable built-in sort (ECMAScript 2019 Array.prototype.sort is stable)", () => {
    const random = seededRandom(11);
    for (const [count, keys] of [[0, 1], [1, 1], [50, 3], [2000, 40], [2000, 5000]] as const) {
      const items = Array.from({ length: count }, (_, id) => ({ id, k: Math.floor(random() * keys) }));
      const reference = [...items].sort((a, b) => a.k - b.k);
      expect(orderByKey(items, (x) => x.k, keys)).toEqual(reference);
    }
  });

  it("refuses a key outside its range rather than losing the item", () => {
    expect(() => orderByKey([{ k: 3 }], (x) => x.k, 3)).toThrow(RangeError);
    expect(() => orderByKey([{ k: 0.5 }], (x) => x.k, 3)).toThrow(RangeError);
  });
});
