import fc from 'fast-check';
import { integrateOverBand, widthAtMm } from './band-integration';
import { clipPolygonToBand } from './clip';
import { polygonMm, polygonYRangeMm, type PolygonMm } from './polygon';
import { areaIntegrals } from './properties';
import { arbitraryPolygonMm } from './test-arbitraries';

const rectangle = polygonMm([[-150, 0], [150, 0], [150, 800], [-150, 800]]);
const triangle = polygonMm([[0, 0], [600, 0], [300, 900]]);
// a tee: a 200 wide web to y = 600 under a 1000 wide flange to y = 800
const tee = polygonMm([[-100, 0], [100, 0], [100, 600], [500, 600], [500, 800], [-500, 800], [-500, 600], [-100, 600]]);

describe('widthAtMm', () => {
  it('follows the edges linearly and is zero outside', () => {
    // hand check: the triangle narrows linearly from 600 at y = 0 to 0 at y = 900
    expect(widthAtMm(triangle, 0)).toBeCloseTo(600, 9);
    expect(widthAtMm(triangle, 300)).toBeCloseTo(400, 9);
    expect(widthAtMm(triangle, 900)).toBeCloseTo(0, 9);
    expect(widthAtMm(triangle, -1)).toBe(0);
    expect(widthAtMm(triangle, 901)).toBe(0);
  });

  it('takes the width just above a step, and the width just below the top', () => {
    expect(widthAtMm(tee, 300)).toBeCloseTo(200, 9);
    expect(widthAtMm(tee, 600)).toBeCloseTo(1000, 9);
    expect(widthAtMm(tee, 800)).toBeCloseTo(1000, 9);
  });

  it('leaves out holes, whatever the direction of the rings', () => {
    const withHole = { outer: rectangle.outer, holes: [[[-50, 200], [50, 200], [50, 400], [-50, 400]] as const] };
    // hand check: 300 less the hole's 100
    expect(widthAtMm(withHole, 300)).toBeCloseTo(200, 9);
    expect(widthAtMm(polygonMm(withHole.outer, withHole.holes), 300)).toBeCloseTo(200, 9);
  });
});

describe('integrateOverBand', () => {
  it('integrates a constant stress over a rectangle: f·b·h and f·b·(h₂² − h₁²)/2', () => {
    const { forceN, momentAboutSoffitNmm } = integrateOverBand(rectangle, 500, 800, () => -20);
    // hand check from the published formula (resultant of a uniform stress on a rectangle)
    expect(forceN).toBeCloseTo(-20 * 300 * 300, 6);
    expect(momentAboutSoffitNmm / ((-20 * 300 * (800 ** 2 - 500 ** 2)) / 2)).toBeCloseTo(1, 12);
  });

  it('integrates a linear stress over a triangle in closed form', () => {
    // f(y) = y/900 on w(y) = 600 (1 − y/900): ∫ f w dy = 600·900/6, ∫ f w y dy = 600·900²/12
    const { forceN, momentAboutSoffitNmm } = integrateOverBand(triangle, 0, 900, (y) => y / 900);
    // hand check from the closed-form integrals above
    expect(forceN / ((600 * 900) / 6)).toBeCloseTo(1, 12);
    expect(momentAboutSoffitNmm / ((600 * 900 ** 2) / 12)).toBeCloseTo(1, 12);
  });

  it('is exact for a degree-14 stress on a rectangle', () => {
    // ∫₀¹ b y¹⁴ dy = b/15 for a unit-high rectangle of width b
    const unitHigh = polygonMm([[0, 0], [2, 0], [2, 1], [0, 1]]);
    // hand check from the closed-form integral above
    expect(integrateOverBand(unitHigh, 0, 1, (y) => y ** 14).forceN).toBeCloseTo(2 / 15, 14);
  });

  it('splits the band at the flange of a tee', () => {
    const { forceN, momentAboutSoffitNmm } = integrateOverBand(tee, 500, 800, () => 1);
    // hand check from the published formula (composite areas): web 200 × 100 at y = 550, flange 1000 × 200 at y = 700
    expect(forceN).toBeCloseTo(200 * 100 + 1000 * 200, 6);
    expect(momentAboutSoffitNmm).toBeCloseTo(200 * 100 * 550 + 1000 * 200 * 700, 3);
  });

  it('gives nothing outside the polygon and refuses an upside-down band', () => {
    expect(integrateOverBand(rectangle, 900, 1000, () => 1)).toEqual({ forceN: 0, momentAboutSoffitNmm: 0 });
    expect(() => integrateOverBand(rectangle, 600, 500, () => 1)).toThrow(/upside down/);
  });

  it('agrees with the clipped polygon’s area and first moment for a unit stress', () => {
    fc.assert(
      fc.property(arbitraryPolygonMm, fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (polygon, a, b) => {
        const { yMinMm, yMaxMm } = polygonYRangeMm(polygon);
        const lowMm = yMinMm + Math.min(a, b) * (yMaxMm - yMinMm);
        const highMm = yMinMm + Math.max(a, b) * (yMaxMm - yMinMm);
        const clipped: PolygonMm | null = clipPolygonToBand(polygon, lowMm, highMm);
        const expected = clipped === null ? { areaMm2: 0, yFirstMomentMm3: 0 } : areaIntegrals(clipped);
        const { forceN, momentAboutSoffitNmm } = integrateOverBand(polygon, lowMm, highMm, () => 1);
        const scale = areaIntegrals(polygon).areaMm2;
        expect((forceN - expected.areaMm2) / scale).toBeCloseTo(0, 9);
        expect((momentAboutSoffitNmm - expected.yFirstMomentMm3) / (scale * yMaxMm)).toBeCloseTo(0, 9);
      }),
    );
  });
});
