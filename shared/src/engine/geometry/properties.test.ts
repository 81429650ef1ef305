import fc from 'fast-check';
import { polygonMm, type PointMm, type PolygonMm } from './polygon';
import { areaIntegrals, polygonProperties, sumAreaIntegrals } from './properties';
import { arbitraryPolygonMm } from './test-arbitraries';

const rectangleRing = (x0: number, y0: number, widthMm: number, heightMm: number): PointMm[] => [
  [x0, y0],
  [x0 + widthMm, y0],
  [x0 + widthMm, y0 + heightMm],
  [x0, y0 + heightMm],
];

const reversedRings = (polygon: PolygonMm): PolygonMm => ({
  outer: [...polygon.outer].reverse(),
  holes: polygon.holes.map((hole) => [...hole].reverse()),
});

describe('polygonProperties', () => {
  it('gives a rectangle A = bh, centroid at its middle, Ix = bh³/12, Iy = hb³/12', () => {
    const b = 300;
    const h = 600;
    const properties = polygonProperties(polygonMm(rectangleRing(-100, 50, b, h)));
    // hand check from the published formula (rectangle)
    expect(properties.areaMm2).toBeCloseTo(b * h, 6);
    expect(properties.centroidXMm).toBeCloseTo(-100 + b / 2, 9);
    expect(properties.centroidYMm).toBeCloseTo(50 + h / 2, 9);
    expect(properties.inertiaXMm4 / ((b * h ** 3) / 12)).toBeCloseTo(1, 12);
    expect(properties.inertiaYMm4 / ((h * b ** 3) / 12)).toBeCloseTo(1, 12);
    expect([properties.yMinMm, properties.yMaxMm]).toEqual([50, 650]);
  });

  it('gives a triangle A = bh/2, ȳ = h/3, Ix = bh³/36, Iy = bh(b² − ab + a²)/36', () => {
    const b = 400;
    const h = 900;
    const a = 100; // apex above x = a
    const properties = polygonProperties(polygonMm([[0, 0], [b, 0], [a, h]]));
    // hand check from the published formula (triangle with apex offset a)
    expect(properties.areaMm2).toBeCloseTo((b * h) / 2, 6);
    expect(properties.centroidXMm).toBeCloseTo((b + a) / 3, 9);
    expect(properties.centroidYMm).toBeCloseTo(h / 3, 9);
    expect(properties.inertiaXMm4 / ((b * h ** 3) / 36)).toBeCloseTo(1, 12);
    expect(properties.inertiaYMm4 / ((b * h * (b * b - a * b + a * a)) / 36)).toBeCloseTo(1, 12);
  });

  it('subtracts a rectangular hole: A = BH − bh and I by the parallel-axis theorem', () => {
    const outer = rectangleRing(-500, 0, 1000, 800);
    const hole = rectangleRing(-300, 100, 600, 400); // centre y = 300, below the outline's 400
    const properties = polygonProperties(polygonMm(outer, [hole]));
    // hand check from the published formula (composite areas, parallel-axis theorem)
    const areaMm2 = 1000 * 800 - 600 * 400;
    const centroidYMm = (1000 * 800 * 400 - 600 * 400 * 300) / areaMm2;
    const inertiaMm4 =
      (1000 * 800 ** 3) / 12 + 1000 * 800 * (400 - centroidYMm) ** 2 - ((600 * 400 ** 3) / 12 + 600 * 400 * (300 - centroidYMm) ** 2);
    expect(properties.areaMm2).toBeCloseTo(areaMm2, 6);
    expect(properties.centroidYMm).toBeCloseTo(centroidYMm, 9);
    expect(properties.centroidXMm).toBeCloseTo(0, 9);
    expect(properties.inertiaXMm4 / inertiaMm4).toBeCloseTo(1, 12);
  });

  it('gives an L-shape the sums of its two rectangles', () => {
    // a 600 × 100 foot with a 100 × 500 leg standing on its left end
    const properties = polygonProperties(polygonMm([[0, 0], [600, 0], [600, 100], [100, 100], [100, 600], [0, 600]]));
    // hand check from the published formula (composite areas, parallel-axis theorem)
    const parts = [
      { area: 600 * 100, x: 300, y: 50, ix: (600 * 100 ** 3) / 12, iy: (100 * 600 ** 3) / 12 },
      { area: 100 * 500, x: 50, y: 350, ix: (100 * 500 ** 3) / 12, iy: (500 * 100 ** 3) / 12 },
    ];
    const area = parts[0]!.area + parts[1]!.area;
    const x = parts.reduce((sum, p) => sum + p.area * p.x, 0) / area;
    const y = parts.reduce((sum, p) => sum + p.area * p.y, 0) / area;
    const ix = parts.reduce((sum, p) => sum + p.ix + p.area * (p.y - y) ** 2, 0);
    const iy = parts.reduce((sum, p) => sum + p.iy + p.area * (p.x - x) ** 2, 0);
    expect(properties.areaMm2).toBeCloseTo(area, 6);
    expect(properties.centroidXMm).toBeCloseTo(x, 9);
    expect(properties.centroidYMm).toBeCloseTo(y, 9);
    expect(properties.inertiaXMm4 / ix).toBeCloseTo(1, 12);
    expect(properties.inertiaYMm4 / iy).toBeCloseTo(1, 12);
  });

  it('does not depend on the direction the rings were given in', () => {
    fc.assert(
      fc.property(arbitraryPolygonMm, (polygon) => {
        const forwards = polygonProperties(polygon);
        const backwards = polygonProperties(reversedRings(polygon));
        expect(backwards.areaMm2 / forwards.areaMm2).toBeCloseTo(1, 12);
        expect(backwards.inertiaXMm4 / forwards.inertiaXMm4).toBeCloseTo(1, 10);
        expect(backwards.centroidYMm - forwards.centroidYMm).toBeCloseTo(0, 6);
      }),
    );
  });

  it('moves the centroid with the polygon and keeps the centroidal second moments', () => {
    fc.assert(
      fc.property(arbitraryPolygonMm, fc.double({ min: -1000, max: 1000, noNaN: true }), (polygon, shiftMm) => {
        const shift = (ring: readonly (readonly [number, number])[]) => ring.map(([x, y]): PointMm => [x + shiftMm, y + shiftMm]);
        const moved = polygonProperties({ outer: shift(polygon.outer), holes: polygon.holes.map(shift) });
        const original = polygonProperties(polygon);
        expect(moved.centroidXMm - original.centroidXMm - shiftMm).toBeCloseTo(0, 6);
        expect(moved.centroidYMm - original.centroidYMm - shiftMm).toBeCloseTo(0, 6);
        expect(moved.inertiaXMm4 / original.inertiaXMm4).toBeCloseTo(1, 7);
        expect(moved.inertiaYMm4 / original.inertiaYMm4).toBeCloseTo(1, 7);
      }),
    );
  });
});

describe('polygonMm', () => {
  it('turns the outline counter-clockwise, holes clockwise, and drops repeated points', () => {
    const polygon = polygonMm([[0, 0], [0, 10], [10, 10], [10, 10], [10, 0]], [rectangleRing(2, 2, 2, 2)]);
    expect(polygon.outer).toEqual([[10, 0], [10, 10], [0, 10], [0, 0]]);
    expect(polygon.holes[0]).toEqual([[2, 4], [4, 4], [4, 2], [2, 2]]);
  });
});

describe('sumAreaIntegrals', () => {
  it('weights each part, as a transformed section does', () => {
    const square = areaIntegrals(polygonMm(rectangleRing(0, 0, 10, 10)));
    const sum = sumAreaIntegrals([
      { integrals: square, weight: 1 },
      { integrals: square, weight: 0.5 },
    ]);
    // hand check: 1.5 × the square's 100 mm² and 1.5 × its ∫ y dA = 100 × 5
    expect(sum.areaMm2).toBeCloseTo(150, 9);
    expect(sum.yFirstMomentMm3).toBeCloseTo(750, 9);
  });
});
