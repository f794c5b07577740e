/**
 * Specimen and defect geometry for the record. Pure arithmetic; every result is a computed note for the
 * record, never advice (PRODUCT.md, Cautions shown in the product).
 *
 * Sizes are in millimetres. A specimen is measured by its long and short axis (full diameters), so the
 * ellipse's semi-axes are half of each.
 */

/** Shown beside every computed geometric note. */
export const COMPUTED_NOTE_CAUTION = 'computed note for the record, not advice; check before signing';

const isSize = (x: number) => Number.isFinite(x) && x >= 0;

/**
 * Area of an ellipse from its two axes: π·a·b with semi-axes a = long/2, b = short/2, i.e. π/4 · long · short
 * (Archimedes, On Conoids and Spheroids, Prop. 4 in Heath's translation, from memory: an ellipse is to
 * the circle on its major axis as its minor axis is to its major axis). Null for a size that is not a finite non-negative number.
 */
export function ellipseAreaMm2(longMm: number, shortMm: number): number | null {
  if (!isSize(longMm) || !isSize(shortMm)) return null;
  return (Math.PI / 4) * longMm * shortMm;
}

/**
 * Ramanujan's first approximation of an ellipse's perimeter from its full axes (S. Ramanujan, "Modular
 * equations and approximations to π", Quart. J. Pure Appl. Math. 45 (1914) 350–372, §16; from memory):
 * P ≈ π [3(a + b) − √((3a + b)(a + 3b))] with semi-axes a, b. It is exact for a circle and errs low, by
 * at most about 0.4 % for the flattest ellipse.
 */
export function ramanujanPerimeterMm(longMm: number, shortMm: number): number | null {
  if (!isSize(longMm) || !isSize(shortMm)) return null;
  const a = longMm / 2;
  const b = shortMm / 2;
  return Math.PI * (3 * (a + b) - Math.sqrt((3 * a + b) * (a + 3 * b)));
}

/**
 * The exact perimeter of an ellipse by the arithmetic-geometric mean (Gauss; the AGM method for complete
 * elliptic integrals, Abramowitz & Stegun, Handbook of Mathematical Functions, 17.6.3–17.6.4):
 * with a₀ = a, b₀ = b, c₀² = a² − b², aₙ₊₁ = (aₙ + bₙ)/2, bₙ₊₁ = √(aₙbₙ), cₙ₊₁ = (aₙ − bₙ)/2,
 * P = 4a·E(e) = (2π / AGM(a, b)) · (a² − Σₙ 2ⁿ⁻¹ cₙ²). Converges quadratically; used here as the reference
 * that Ramanujan's approximation is checked against.
 */
export function ellipsePerimeterExactMm(longMm: number, shortMm: number): number | null {
  if (!isSize(longMm) || !isSize(shortMm)) return null;
  let a = Math.max(longMm, shortMm) / 2;
  let b = Math.min(longMm, shortMm) / 2;
  if (b === 0) return 4 * a; // the degenerate ellipse is a segment traversed twice
  const a0 = a;
  let sum = (a * a - b * b) / 2; // n = 0 term: 2⁻¹ c₀²
  let weight = 1; // 2ⁿ⁻¹ for n = 1
  for (let n = 1; n < 64 && a - b > 1e-15 * a; n++) {
    const c = (a - b) / 2;
    const nextA = (a + b) / 2;
    b = Math.sqrt(a * b);
    a = nextA;
    sum += weight * c * c;
    weight *= 2;
  }
  return (2 * Math.PI / a) * (a0 * a0 - sum);
}

/** Circumference of a circle from its diameter: π · d (a loop's opening, for instance). */
export function circumferenceMm(diameterMm: number): number | null {
  if (!isSize(diameterMm)) return null;
  return Math.PI * diameterMm;
}

/** Area covered per minute, mm²/min; null when either figure is missing or the time is not positive. */
export function mm2PerMinute(areaMm2: number | null, minutes: number | null): number | null {
  if (areaMm2 === null || minutes === null || !isSize(areaMm2) || !Number.isFinite(minutes) || minutes <= 0) return null;
  return areaMm2 / minutes;
}
