import { areaIntegrals, centroidalProperties, polygonYRangeMm, sumAreaIntegrals, type PolygonMm } from '../geometry';

/** Elastic properties of a section about its horizontal centroidal axis (calc-file output keys). */
export interface SectionProperties {
  readonly areaMm2: number;
  readonly centroidFromSoffitMm: number;
  readonly inertiaMm4: number;
  /** Zt = I / yt, with yt from the centroid up to the top fibre. */
  readonly topModulusMm3: number;
  /** Zb = I / yb, with yb from the centroid down to the bottom fibre. */
  readonly bottomModulusMm3: number;
  readonly topYMm: number;
  readonly bottomYMm: number;
}

/** Polygons of one material and their modular ratio to the section's base material. */
export interface WeightedPolygons {
  readonly polygons: readonly PolygonMm[];
  readonly modularRatio: number;
}

/**
 * A, ȳ, I about the horizontal centroidal axis, Zt = I/yt and Zb = I/yb of a section of one
 * material (engineering reference §2), from the Green's-theorem sums of its polygons.
 */
export function sectionProperties(polygons: readonly PolygonMm[]): SectionProperties {
  return transformedSectionProperties([{ polygons, modularRatio: 1 }]);
}

/**
 * Properties of the transformed section of elastic theory: each part's area weighted by its
 * modular ratio n = E_part / E_base (engineering reference §2, `nDeckToGirder`), then A, ȳ and I
 * by the parallel-axis theorem; the extreme fibres are those of all the parts given.
 */
export function transformedSectionProperties(parts: readonly WeightedPolygons[]): SectionProperties {
  const integrals = sumAreaIntegrals(
    parts.flatMap(({ polygons, modularRatio }) => polygons.map((polygon) => ({ integrals: areaIntegrals(polygon), weight: modularRatio }))),
  );
  const { areaMm2, centroidYMm, inertiaXMm4 } = centroidalProperties(integrals);
  const ranges = parts.flatMap(({ polygons }) => polygons.map(polygonYRangeMm));
  const topYMm = Math.max(...ranges.map((range) => range.yMaxMm));
  const bottomYMm = Math.min(...ranges.map((range) => range.yMinMm));
  return {
    areaMm2,
    centroidFromSoffitMm: centroidYMm,
    inertiaMm4: inertiaXMm4,
    topModulusMm3: inertiaXMm4 / (topYMm - centroidYMm),
    bottomModulusMm3: inertiaXMm4 / (centroidYMm - bottomYMm),
    topYMm,
    bottomYMm,
  };
}
