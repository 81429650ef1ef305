import fc from 'fast-check';
import { clipPolygonToBand } from './clip';
import { polygonMm, polygonYRangeMm, type PolygonMm } from './polygon';
import { areaIntegrals, polygonProperties } from './properties';
import { arbitraryPolygonMm } from './test-arbitraries';

const areaOf = (polygon: PolygonMm | null): number => (polygon === null ? 0 : areaIntegrals(polygon).areaMm2);
const yMomentOf = (polygon: PolygonMm | null): number => (polygon === null ? 0 : areaIntegrals(polygon).yFirstMomentMm3);

describe('clipPolygonToBand', () => {
  const rectangle = polygonMm([[-200, 0], [200, 0], [200, 1000], [-200, 1000]]);

  it('cuts a rectangle to the band: 400 × (700 − 250)', () => {
    const clipped = clipPolygonToBand(rectangle, 250, 700)!;
    // hand check: the band is itself a rectangle
    expect(areaOf(clipped)).toBeCloseTo(400 * 450, 6);
    expect(polygonYRangeMm(clipped)).toEqual({ yMinMm: 250, yMaxMm: 700 });
  });

  it('keeps a similar triangle when cutting off a triangle’s top', () => {
    const triangle = polygonMm([[0, 0], [600, 0], [300, 900]]);
    const top = clipPolygonToBand(triangle, 600, 2000)!;
    // hand check: the part above y = 600 is similar with ratio 300/900, so its area is (1/3)² of 270 000
    expect(areaOf(top)).toBeCloseTo(270_000 / 9, 6);
    expect(polygonProperties(top).centroidYMm).toBeCloseTo(600 + 300 / 3, 9);
  });

  it('cuts both arms of a U-shape exactly, though it joins them along the cut line', () => {
    const u = polygonMm([[0, 0], [500, 0], [500, 600], [400, 600], [400, 100], [100, 100], [100, 600], [0, 600]]);
    const arms = clipPolygonToBand(u, 200, 500)!;
    // hand check: two 100 × 300 arms, centroid at mid-band
    expect(areaOf(arms)).toBeCloseTo(2 * 100 * 300, 6);
    expect(polygonProperties(arms).centroidYMm).toBeCloseTo(350, 9);
    expect(polygonProperties(arms).inertiaXMm4 / ((2 * 100 * 300 ** 3) / 12)).toBeCloseTo(1, 12);
  });

  it('subtracts a hole that the band cuts through', () => {
    const box = polygonMm(rectangle.outer, [[[-100, 200], [100, 200], [100, 800], [-100, 800]]]);
    const clipped = clipPolygonToBand(box, 500, 1000)!;
    // hand check: 400 × 500 less the hole's 200 × 300 above y = 500
    expect(areaOf(clipped)).toBeCloseTo(400 * 500 - 200 * 300, 6);
  });

  it('gives null outside the polygon and refuses an upside-down band', () => {
    expect(clipPolygonToBand(rectangle, 1000, 1200)).toBeNull();
    expect(clipPolygonToBand(rectangle, -50, -10)).toBeNull();
    expect(() => clipPolygonToBand(rectangle, 600, 500)).toThrow(/upside down/);
  });

  it('splits the area and first moment exactly: below y plus above y equals the whole', () => {
    fc.assert(
      fc.property(arbitraryPolygonMm, fc.double({ min: 0, max: 1, noNaN: true }), (polygon, fraction) => {
        const { yMinMm, yMaxMm } = polygonYRangeMm(polygon);
        const cutMm = yMinMm + fraction * (yMaxMm - yMinMm);
        const below = clipPolygonToBand(polygon, yMinMm - 1, cutMm);
        const above = clipPolygonToBand(polygon, cutMm, yMaxMm + 1);
        const whole = areaIntegrals(polygon);
        expect((areaOf(below) + areaOf(above)) / whole.areaMm2).toBeCloseTo(1, 10);
        // Measured against area × height, not against the whole's own first moment: that is near zero for a shape centred on y = 0.
        const momentScale = whole.areaMm2 * (yMaxMm - yMinMm);
        expect(Math.abs(yMomentOf(below) + yMomentOf(above) - whole.yFirstMomentMm3) / momentScale).toBeLessThan(1e-8);
      }),
    );
  });
});
