/**
 * Items ordered by a small whole-number key (0 ≤ key < keyCount), stable: equal keys keep their
 * order. A counting sort, linear in items + keys, where a comparison sort of a long part's
 * suggestions would cost a logarithm more per item.
 */
export function orderByKey<T>(items: readonly T[], keyOf: (item: T) => number, keyCount: number): T[] {
  const keys = new Int32Array(items.length);
  const starts = new Int32Array(keyCount + 1);
  for (let i = 0; i < items.length; i++) {
    const k = keyOf(items[i]);
    if (!Number.isInteger(k) || k < 0 || k >= keyCount) throw new RangeError(`order key ${k} outside 0…${keyCount - 1}`);
    keys[i] = k;
    starts[k + 1]++;
  }
  for (let k = 0; k < keyCount; k++) starts[k + 1] += starts[k];
  const out = new Array<T>(items.length);
  for (let i = 0; i < items.length; i++) out[starts[keys[i]]++] = items[i];
  return out;
}
