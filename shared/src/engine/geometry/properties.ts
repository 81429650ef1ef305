import { materialSign, polygonYRangeMm, type PolygonMm, type RingMm } from './polygon';

/** Area integrals about the origin of the section's axes (x across, y up from the soffit). */
export interface AreaIntegrals {
  /** ∫ dA */
  readonly areaMm2: number;
  /** ∫ x dA: the first moment about the vertical axis x = 0. */
  readonly xFirstMomentMm3: number;
  /** ∫ y dA: the first moment about the horizontal axis y = 0 (the soffit). */
  readonly yFirstMomentMm3: number;
  /** ∫ x² dA about x = 0. */
  readonly xSecondMomentMm4: number;
  /** ∫ y² dA about y = 0. */
  readonly ySecondMomentMm4: number;
}

/** Properties of a polygon about its own centroid, with the integrals they come from. */
export interface PolygonProperties extends AreaIntegrals {
  readonly centroidXMm: number;
  readonly centroidYMm: number;
  /** ∫ (y − ȳ)² dA: second moment about the horizontal axis through the centroid. */
  readonly inertiaXMm4: number;
  /** ∫ (x − x̄)² dA: second moment about the vertical axis through the centroid. */
  readonly inertiaYMm4: number;
  readonly yMinMm: number;
  readonly yMaxMm: number;
}

const NO_AREA: AreaIntegrals = {
  areaMm2: 0,
  xFirstMomentMm3: 0,
  yFirstMomentMm3: 0,
  xSecondMomentMm4: 0,
  ySecondMomentMm4: 0,
};

/**
 * Area, first and second moments of a polygon with holes about the origin, by Green's theorem
 * turned into sums over the edges (the closed forms in Steger, "On the calculation of arbitrary
 * moments of polygons", TU München report FGBV-96-05, 1996). Exact for straight edges; the
 * outline adds and the holes subtract whatever direction their rings run.
 */
export function areaIntegrals(polygon: PolygonMm): AreaIntegrals {
  const rings = [
    { ring: polygon.outer, isHole: false },
    ...polygon.holes.map((ring) => ({ ring, isHole: true })),
  ];
  return sumAreaIntegrals(
    rings.map(({ ring, isHole }) => ({ integrals: ringIntegrals(ring), weight: materialSign(ring, isHole) })),
  );
}

/**
 * The weighted sum Σ wᵢ ∫ … dAᵢ of several parts' integrals: the transformed section of
 * elastic theory when each weight is a part's modular ratio to the base material.
 */
export function sumAreaIntegrals(
  terms: readonly { readonly integrals: AreaIntegrals; readonly weight: number }[],
): AreaIntegrals {
  return terms.reduce<AreaIntegrals>(
    (sum, { integrals, weight }) => ({
      areaMm2: sum.areaMm2 + weight * integrals.areaMm2,
      xFirstMomentMm3: sum.xFirstMomentMm3 + weight * integrals.xFirstMomentMm3,
      yFirstMomentMm3: sum.yFirstMomentMm3 + weight * integrals.yFirstMomentMm3,
      xSecondMomentMm4: sum.xSecondMomentMm4 + weight * integrals.xSecondMomentMm4,
      ySecondMomentMm4: sum.ySecondMomentMm4 + weight * integrals.ySecondMomentMm4,
    }),
    NO_AREA,
  );
}

/** Signed sums for one ring (positive for a counter-clockwise ring). */
function ringIntegrals(ring: RingMm): AreaIntegrals {
  let doubleArea = 0;
  let sixTimesX = 0;
  let sixTimesY = 0;
  let twelveTimesXx = 0;
  let twelveTimesYy = 0;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [x0, y0] = ring[j]!;
    const [x1, y1] = ring[i]!;
    const cross = x0 * y1 - x1 * y0;
    doubleArea += cross;
    sixTimesX += (x0 + x1) * cross;
    sixTimesY += (y0 + y1) * cross;
    twelveTimesXx += (x0 * x0 + x0 * x1 + x1 * x1) * cross;
    twelveTimesYy += (y0 * y0 + y0 * y1 + y1 * y1) * cross;
  }
  return {
    areaMm2: doubleArea / 2,
    xFirstMomentMm3: sixTimesX / 6,
    yFirstMomentMm3: sixTimesY / 6,
    xSecondMomentMm4: twelveTimesXx / 12,
    ySecondMomentMm4: twelveTimesYy / 12,
  };
}

/**
 * Centroid and centroidal second moments from integrals about the origin, by the
 * parallel-axis theorem: I about the centroid = ∫ y² dA − A ȳ². Throws for zero area, which has
 * no centroid.
 */
export function centroidalProperties(integrals: AreaIntegrals): Omit<PolygonProperties, 'yMinMm' | 'yMaxMm'> {
  const { areaMm2, xFirstMomentMm3, yFirstMomentMm3, xSecondMomentMm4, ySecondMomentMm4 } = integrals;
  if (!(areaMm2 > 0)) throw new RangeError(`a section needs a positive area, not ${areaMm2} mm²`);
  const centroidXMm = xFirstMomentMm3 / areaMm2;
  const centroidYMm = yFirstMomentMm3 / areaMm2;
  return {
    ...integrals,
    centroidXMm,
    centroidYMm,
    inertiaXMm4: ySecondMomentMm4 - areaMm2 * centroidYMm * centroidYMm,
    inertiaYMm4: xSecondMomentMm4 - areaMm2 * centroidXMm * centroidXMm,
  };
}

/**
 * Area, first moments, centroid, centroidal second moments (Ix about the horizontal axis, Iy
 * about the vertical) and the y range of a polygon with holes, by Green's-theorem sums (see
 * {@link areaIntegrals}) and the parallel-axis theorem.
 */
export function polygonProperties(polygon: PolygonMm): PolygonProperties {
  return { ...centroidalProperties(areaIntegrals(polygon)), ...polygonYRangeMm(polygon) };
}
