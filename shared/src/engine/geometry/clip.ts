import { ringDoubleSignedAreaMm2, type PointMm, type PolygonMm, type RingMm } from './polygon';

/**
 * The part of a polygon (convex or not, with holes) between the horizontal lines y = yLowMm and
 * y = yHighMm, or null when nothing of it lies there. Each ring is clipped against the two
 * half-planes by the Sutherland–Hodgman algorithm (Sutherland & Hodgman, "Reentrant polygon
 * clipping", Communications of the ACM 17(1), 1974). Where the band cuts a non-convex outline
 * into separate pieces, the result is one ring joined by zero-width edges along the cut line,
 * traversed once each way; a hole cut by the line runs along it too. Such edges add nothing
 * to area integrals, so the area, moments and widths of the result are exact — but the rings
 * are for integration, not for drawing. Rings that vanish are dropped.
 */
export function clipPolygonToBand(polygon: PolygonMm, yLowMm: number, yHighMm: number): PolygonMm | null {
  if (yLowMm > yHighMm) throw new RangeError(`band runs upside down: yLowMm ${yLowMm} > yHighMm ${yHighMm}`);
  const clipRing = (ring: RingMm): RingMm =>
    clipRingToHalfPlane(clipRingToHalfPlane(ring, yLowMm, 'above'), yHighMm, 'below');
  const outer = clipRing(polygon.outer);
  if (!enclosesArea(outer)) return null;
  return { outer, holes: polygon.holes.map(clipRing).filter(enclosesArea) };
}

function enclosesArea(ring: RingMm): boolean {
  return ring.length >= 3 && ringDoubleSignedAreaMm2(ring) !== 0;
}

/** One Sutherland–Hodgman pass: keeps the side of the line y = lineYMm named by `keep`. */
function clipRingToHalfPlane(ring: RingMm, lineYMm: number, keep: 'above' | 'below'): RingMm {
  const isInside = keep === 'above' ? (p: PointMm) => p[1] >= lineYMm : (p: PointMm) => p[1] <= lineYMm;
  const clipped: PointMm[] = [];
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const previous = ring[j]!;
    const current = ring[i]!;
    const currentInside = isInside(current);
    if (currentInside !== isInside(previous)) clipped.push(crossingOfLine(previous, current, lineYMm));
    if (currentInside) clipped.push(current);
  }
  return clipped;
}

/** Where the edge from `a` to `b` (one end on each side) meets the line y = lineYMm. */
function crossingOfLine(a: PointMm, b: PointMm, lineYMm: number): PointMm {
  const t = (lineYMm - a[1]) / (b[1] - a[1]);
  return [a[0] + t * (b[0] - a[0]), lineYMm];
}
