/**
 * A set of indexes 0…n−1 with nearest-member queries, for the phrase split's boundaries. Bits in
 * 32-bit words, and above them a word per 32 words saying which are not empty, and so on up: a
 * query walks up only as far as the nearest member is away. Phrase boundaries lie a few notes
 * apart, so most queries end in the first or second level, however long the part (a balanced
 * tree or a Fenwick tree pays its full height, the logarithm of the part's length, every time).
 */
export class IndexSet {
  /** levels[0] holds one bit per index; levels[k + 1] one bit per word of levels[k]. */
  private readonly levels: Uint32Array[] = [];

  constructor(readonly n: number) {
    let size = n;
    do {
      size = Math.max(1, Math.ceil(size / 32));
      this.levels.push(new Uint32Array(size));
    } while (size > 1);
  }

  add(i: number): void {
    for (const level of this.levels) {
      const word = i >>> 5;
      level[word] |= 1 << (i & 31);
      i = word;
    }
  }

  has(i: number): boolean {
    return (this.levels[0][i >>> 5] & (1 << (i & 31))) !== 0;
  }

  /** Largest member ≤ i (−1 if none). */
  prev(i: number): number {
    if (i < 0) return -1;
    let k = 0;
    let at = Math.min(i, this.n - 1);
    // Up: the first level whose word holds a member at or below `at` within that word.
    for (; k < this.levels.length; k++) {
      const bits = this.levels[k][at >>> 5] & (0xffffffff >>> (31 - (at & 31)));
      if (bits !== 0) {
        at = ((at >>> 5) << 5) + 31 - Math.clz32(bits);
        break;
      }
      at = (at >>> 5) - 1;
      if (at < 0) return -1;
    }
    if (k === this.levels.length) return -1;
    // Down: the highest member inside each word found.
    for (k--; k >= 0; k--) at = (at << 5) + 31 - Math.clz32(this.levels[k][at]);
    return at;
  }

  /** Smallest member > i (`fallback` if none). */
  next(i: number, fallback: number): number {
    let k = 0;
    let at = i + 1;
    if (at >= this.n) return fallback;
    for (; k < this.levels.length; k++) {
      const bits = this.levels[k][at >>> 5] & (0xffffffff << (at & 31));
      if (bits !== 0) {
        at = ((at >>> 5) << 5) + lowestBit(bits);
        break;
      }
      at = (at >>> 5) + 1;
      if (at >= this.levels[k].length) return fallback;
    }
    if (k === this.levels.length) return fallback;
    for (k--; k >= 0; k--) at = (at << 5) + lowestBit(this.levels[k][at]);
    return at;
  }
}

/** Position of the lowest set bit of a non-zero word. */
function lowestBit(bits: number): number {
  return 31 - Math.clz32(bits & -bits);
}
