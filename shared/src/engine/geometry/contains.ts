import type { PointMm, PolygonMm, RingMm } from './polygon';

/** Where a point lies against one ring, by even–odd ray casting: inside, outside, or on the ring itself. */
export function ringContainsPointMm([x, y]: PointMm, ring: RingMm): 'inside' | 'outside' | 'edge' {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i]!;
    const [xj, yj] = ring[j]!;
    const cross = (xj - xi) * (y - yi) - (yj - yi) * (x - xi);
    const withinBox = Math.min(xi, xj) <= x && x <= Math.max(xi, xj) && Math.min(yi, yj) <= y && y <= Math.max(yi, yj);
    if (Math.abs(cross) <= 1e-9 * (1 + Math.abs(xj - xi) + Math.abs(yj - yi)) && withinBox) return 'edge';
    if (yi > y !== yj > y && x < xi + ((y - yi) / (yj - yi)) * (xj - xi)) inside = !inside;
  }
  return inside ? 'inside' : 'outside';
}

/**
 * Whether a point lies in the material of a polygon (inside the outline, outside every hole).
 * Points on a boundary count as in the material, so that a strand or a spall edge may touch it.
 */
export function polygonContainsPointMm(polygon: PolygonMm, point: PointMm): boolean {
  if (ringContainsPointMm(point, polygon.outer) === 'outside') return false;
  return polygon.holes.every((hole) => ringContainsPointMm(point, hole) !== 'inside');
}
