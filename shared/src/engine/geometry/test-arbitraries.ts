import fc from 'fast-check';
import { polygonMm, type PointMm, type PolygonMm } from './polygon';

/**
 * fast-check generator of simple, usually non-convex polygons for property tests: five to
 * sixteen vertices at jittered angles around a centre, each at its own radius, optionally with
 * a square hole small enough to stay inside (every edge is at least 0.43 × the smallest radius
 * from the centre because no two neighbouring vertices are more than 2.26 rad apart).
 */
export const arbitraryPolygonMm: fc.Arbitrary<PolygonMm> = fc
  .record({
    centre: fc.tuple(fc.double({ min: -500, max: 500, noNaN: true }), fc.double({ min: 0, max: 2000, noNaN: true })),
    vertices: fc.array(
      fc.record({ jitter: fc.double({ min: -0.4, max: 0.4, noNaN: true }), radiusMm: fc.double({ min: 100, max: 1000, noNaN: true }) }),
      { minLength: 5, maxLength: 16 },
    ),
    withHole: fc.boolean(),
  })
  .map(({ centre: [cx, cy], vertices, withHole }) => {
    const step = (2 * Math.PI) / vertices.length;
    const outer: PointMm[] = vertices.map(({ jitter, radiusMm }, k) => {
      const angle = (k + jitter) * step;
      return [cx + radiusMm * Math.cos(angle), cy + radiusMm * Math.sin(angle)];
    });
    const halfSide = 0.25 * Math.min(...vertices.map((v) => v.radiusMm));
    const hole: PointMm[] = [
      [cx - halfSide, cy - halfSide],
      [cx + halfSide, cy - halfSide],
      [cx + halfSide, cy + halfSide],
      [cx - halfSide, cy + halfSide],
    ];
    return polygonMm(outer, withHole ? [hole] : []);
  });
