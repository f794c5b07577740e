import { describe, expect, it } from 'vitest';
import {
  circumferenceMm, COMPUTED_NOTE_CAUTION, ellipseAreaMm2, ellipsePerimeterExactMm, mm2PerMinute, ramanujanPerimeterMm,
} from '#shared/domain/geometry.ts';

// Sources: ellipse area πab (Archimedes, On Conoids and Spheroids, Prop. 4 in Heath's translation; from
// memory); Ramanujan's first approximation (Ramanujan 1914, Quart. J. Pure Appl. Math. 45:350–372); the
// exact perimeter by the arithmetic-geometric mean (Gauss–Legendre AGM for complete elliptic integrals,
// Abramowitz & Stegun 17.6.3–17.6.4).

describe('the specimen area as an ellipse (π/4 × long × short)', () => {
  it.each([
    // long, short, expected: π/4·long·short worked by hand (π/4 × 1200 = 300π, and so on).
    [40, 30, 300 * Math.PI],
    [20, 20, 100 * Math.PI], // a circle of diameter 20 mm: πr² with r = 10
    [32, 29, 232 * Math.PI],
    [10, 0, 0],
  ])('is %d × %d mm → %f mm²', (long, short, expected) => {
    expect(ellipseAreaMm2(long, short)).toBeCloseTo(expected, 10);
  });

  it('refuses sizes that are not finite non-negative numbers', () => {
    expect(ellipseAreaMm2(-1, 10)).toBeNull();
    expect(ellipseAreaMm2(Number.NaN, 10)).toBeNull();
    expect(ellipseAreaMm2(10, Number.POSITIVE_INFINITY)).toBeNull();
  });
});

describe('the exact perimeter by the arithmetic-geometric mean', () => {
  it('is 2πr for a circle', () => {
    expect(ellipsePerimeterExactMm(2, 2)).toBeCloseTo(2 * Math.PI, 14);
  });

  it('gives 4·E(m = ½) for semi-axes 1 and 1/√2, matching the published value of E', () => {
    // E(m = ½) = 1.3506438810476755025… (Abramowitz & Stegun Table 17.1 at modular angle 45°; digits from memory).
    expect(ellipsePerimeterExactMm(2, Math.SQRT2)).toBeCloseTo(4 * 1.3506438810476755, 13);
  });

  it('agrees with the closed form of E(m = ½) through Γ(¼) and Legendre’s relation', () => {
    // K(1/√2) = Γ(¼)² / (4√π), and Legendre's relation EK′ + E′K − KK′ = π/2 with k = k′ gives
    // E = K/2 + π/(4K) (Abramowitz & Stegun 17.3.13; Γ(¼) = 3.6256099082219083119… from memory, OEIS A068466).
    const gammaQuarter = 3.625609908221908; // Γ(¼) to double precision
    const K = gammaQuarter ** 2 / (4 * Math.sqrt(Math.PI));
    const E = K / 2 + Math.PI / (4 * K);
    expect(ellipsePerimeterExactMm(2, Math.SQRT2)).toBeCloseTo(4 * E, 12);
  });

  it('is four times the semi-major axis for a flat ellipse (a segment gone round twice)', () => {
    expect(ellipsePerimeterExactMm(2, 0)).toBe(4);
  });
});

describe("Ramanujan's first approximation against the exact perimeter", () => {
  it.each([
    // Specimen and defect sizes of the trade (long × short, mm): relative error under 1e-4.
    [40, 30], [32, 29], [38, 31], [26, 21], [60, 20],
  ])('is within 0.01 %% for a %d × %d mm ellipse', (long, short) => {
    const exact = ellipsePerimeterExactMm(long, short)!;
    const approx = ramanujanPerimeterMm(long, short)!;
    expect(Math.abs(approx - exact) / exact).toBeLessThan(1e-4);
  });

  it('is exact for a circle', () => {
    expect(ramanujanPerimeterMm(30, 30)).toBeCloseTo(30 * Math.PI, 12);
  });

  it('errs low by about π(a+b)·h³/512 for a near-circle', () => {
    // With h = ((a−b)/(a+b))², the Gauss–Kummer series P = π(a+b)(1 + h/4 + h²/64 + h³/256 + …) and the
    // expansion of π(a+b)(3 − √(4 − h)) = π(a+b)(1 + h/4 + h²/64 + h³/512 + …) differ first by h³/512
    // (worked by hand from the binomial series).
    const [a, b] = [1, 0.8];
    const h = ((a - b) / (a + b)) ** 2;
    const gap = (ellipsePerimeterExactMm(2 * a, 2 * b)! - ramanujanPerimeterMm(2 * a, 2 * b)!) / (Math.PI * (a + b));
    expect(gap).toBeGreaterThan(0);
    expect(gap / (h ** 3 / 512)).toBeCloseTo(1, 1);
  });

  it('is about 0.4 % low at worst, for the flattest ellipse', () => {
    // π(3 − √3) for semi-axes 1 and 0 against the exact 4: 3.98338… (worked by hand), i.e. 0.415 % low.
    expect(ramanujanPerimeterMm(2, 0)).toBeCloseTo(Math.PI * (3 - Math.sqrt(3)), 12);
    expect(1 - ramanujanPerimeterMm(2, 0)! / 4).toBeCloseTo(0.00415, 4);
  });
});

describe('a loop’s circumference and the resection speed', () => {
  it('gives π × diameter for a 30 mm loop', () => {
    expect(circumferenceMm(30)).toBeCloseTo(94.24777960769379, 10);
  });

  it('divides area by minutes, and gives nothing without both', () => {
    expect(mm2PerMinute(942, 60)).toBeCloseTo(15.7, 10);
    expect(mm2PerMinute(null, 60)).toBeNull();
    expect(mm2PerMinute(942, 0)).toBeNull();
    expect(mm2PerMinute(942, null)).toBeNull();
  });

  it('carries the caution every computed note shows', () => {
    expect(COMPUTED_NOTE_CAUTION).toBe('computed note for the record, not advice; check before signing');
  });
});
