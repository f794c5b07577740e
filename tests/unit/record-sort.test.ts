import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { sortByKey } from '#shared/domain/record/sort.ts';

// The bucket sort must give exactly what a comparison sort gives, for any keys: spread, clustered, tied,
// with outliers, negative, huge. The reference is Array.prototype.sort with the same total order.
type Item = { key: number; id: number };
const compare = (a: Item, b: Item) => a.key - b.key || a.id - b.id;
const reference = (items: Item[]) => items.slice().sort(compare);
const withIds = (keys: number[]) => keys.map((key, id) => ({ key, id }));

describe('sortByKey', () => {
  it('agrees with a comparison sort on any finite keys', () => {
    fc.assert(fc.property(fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { maxLength: 400 }), (keys) => {
      const items = withIds(keys);
      expect(sortByKey(items, (x) => x.key, compare)).toEqual(reference(items));
    }), { numRuns: 300 });
  });

  it('agrees on case-like times: seconds apart, many ties, a few far outliers', () => {
    const t0 = Date.UTC(2026, 0, 5, 8, 0, 0);
    const key = fc.oneof(
      { weight: 20, arbitrary: fc.integer({ min: 0, max: 4 * 3600 }).map((s) => t0 + s * 1000) },
      { weight: 5, arbitrary: fc.constantFrom(t0, t0 + 1000, t0 + 60_000) },
      { weight: 1, arbitrary: fc.constantFrom(0, t0 * 3, -t0, Number.MAX_VALUE, -Number.MAX_VALUE) },
    );
    fc.assert(fc.property(fc.array(key, { minLength: 60, maxLength: 600 }), (keys) => {
      const items = withIds(keys);
      expect(sortByKey(items, (x) => x.key, compare)).toEqual(reference(items));
    }), { numRuns: 200 });
  });

  it('keeps the input as it was and sorts a long nearly-ordered log', () => {
    const keys = Array.from({ length: 5000 }, (_, i) => i * 7 + ((i * 7919) % 50));
    const items = withIds(keys);
    const before = items.slice();
    const sorted = sortByKey(items, (x) => x.key, compare);
    expect(items).toEqual(before);
    expect(sorted).toEqual(reference(items));
  });
});
