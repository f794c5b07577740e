import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { hashOf, IdIndex } from '#shared/domain/record/id-index.ts';

// The index must behave exactly as a Map from id to the first item added under it (until replaced), with
// `items` in the order ids were first added. The model is a Map and an array.
type Item = { id: string; n: number };

describe('IdIndex', () => {
  it('agrees with a Map for any run of adds and replaces, repeats included', () => {
    const id = fc.oneof(fc.constantFrom('a', 'b', 'c', ''), fc.string({ maxLength: 40 }), fc.uuid());
    const op = fc.record({ id, replace: fc.boolean() });
    fc.assert(fc.property(fc.array(op, { maxLength: 300 }), fc.nat({ max: 400 }), (ops, expected) => {
      const index = new IdIndex<Item>(expected);
      const model = new Map<string, Item>();
      const order: string[] = [];
      ops.forEach((o, n) => {
        const item = { id: o.id, n };
        const held = model.get(o.id);
        if (held && o.replace) { index.replace(item); model.set(o.id, item); return; }
        expect(index.add(item)).toBe(held);
        if (!held) { model.set(o.id, item); order.push(o.id); }
      });
      expect(index.size).toBe(model.size);
      expect(index.items).toEqual(order.map((k) => model.get(k)));
      for (const k of model.keys()) expect(index.get(k)).toBe(model.get(k));
      expect(index.get('\u0000absent')).toBeUndefined();
    }), { numRuns: 300 });
  });

  it('tells apart ids whose hashes collide', () => {
    // Known 32-bit FNV-1a collisions (from memory of a widely cited comparison of hash functions; checked here).
    const pairs = [['costarring', 'liquid'], ['declinate', 'macallums'], ['altarage', 'zinke']] as const;
    const index = new IdIndex<Item>(2);
    pairs.forEach(([a, b], i) => {
      expect(hashOf(a)).toBe(hashOf(b));
      expect(index.add({ id: a, n: 2 * i })).toBeUndefined();
      expect(index.add({ id: b, n: 2 * i + 1 })).toBeUndefined();
    });
    pairs.forEach(([a, b], i) => {
      expect(index.get(a)?.n).toBe(2 * i);
      expect(index.get(b)?.n).toBe(2 * i + 1);
    });
    expect(index.has('costarrinG')).toBe(false);
  });

  it('refuses to replace an id it does not hold', () => {
    expect(() => new IdIndex<Item>().replace({ id: 'x', n: 0 })).toThrow(/not held/);
  });
});
