/** A point of a section in millimetres: x across, y up (y = 0 at the girder soffit). */
export type PointMm = readonly [xMm: number, yMm: number];

/** A closed ring of points; the last point joins back to the first and is not repeated. */
export type RingMm = readonly PointMm[];

/**
 * A polygon with holes. Built by {@link polygonMm}, the outline runs counter-clockwise and each
 * hole clockwise, so every ring keeps the material on its left.
 */
export interface PolygonMm {
  readonly outer: RingMm;
  readonly holes: readonly RingMm[];
}

/**
 * Twice the signed area of a ring by the shoelace sum (Green's theorem): positive when the ring
 * runs counter-clockwise.
 */
export function ringDoubleSignedAreaMm2(ring: RingMm): number {
  let sum = 0;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xPrevious, yPrevious] = ring[j]!;
    const [x, y] = ring[i]!;
    sum += xPrevious * y - x * yPrevious;
  }
  return sum;
}

/**
 * Builds a polygon from an outline and holes given in either direction: drops repeated
 * consecutive points, then turns the outline counter-clockwise and each hole clockwise.
 */
export function polygonMm(outer: RingMm, holes: readonly RingMm[] = []): PolygonMm {
  return {
    outer: orientRing(withoutRepeatedPoints(outer), 'counter-clockwise'),
    holes: holes.map((hole) => orientRing(withoutRepeatedPoints(hole), 'clockwise')),
  };
}

function withoutRepeatedPoints(ring: RingMm): RingMm {
  return ring.filter((point, i) => {
    const previous = ring[(i + ring.length - 1) % ring.length]!;
    return ring.length === 1 || point[0] !== previous[0] || point[1] !== previous[1];
  });
}

function orientRing(ring: RingMm, direction: 'counter-clockwise' | 'clockwise'): RingMm {
  const isCounterClockwise = ringDoubleSignedAreaMm2(ring) > 0;
  return isCounterClockwise === (direction === 'counter-clockwise') ? ring : [...ring].reverse();
}

/**
 * +1 or −1: the factor that makes a ring's signed sums count material positive, whatever the
 * direction it was given in (an outline adds area, a hole removes it).
 */
export function materialSign(ring: RingMm, isHole: boolean): number {
  const counterClockwise = ringDoubleSignedAreaMm2(ring) >= 0;
  return counterClockwise !== isHole ? 1 : -1;
}

/** The lowest and highest y of a polygon's outline. */
export function polygonYRangeMm(polygon: PolygonMm): { readonly yMinMm: number; readonly yMaxMm: number } {
  let yMinMm = Infinity;
  let yMaxMm = -Infinity;
  for (const [, y] of polygon.outer) {
    yMinMm = Math.min(yMinMm, y);
    yMaxMm = Math.max(yMaxMm, y);
  }
  return { yMinMm, yMaxMm };
}
