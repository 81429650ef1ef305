import { materialSign, type PolygonMm, type RingMm } from './polygon';

/**
 * A polygon's width function w(y), the length of the horizontal chord through the material at
 * height y. Between consecutive vertex heights every edge is a straight line, so w is linear
 * there: each slab k from boundariesMm[k] to boundariesMm[k + 1] stores its end widths.
 */
interface WidthTable {
  readonly boundariesMm: Float64Array;
  readonly widthAtSlabBottomMm: Float64Array;
  readonly widthAtSlabTopMm: Float64Array;
}

/** ∫∫ f dA and ∫∫ f·y dA over a band: with f a stress in MPa, a force and its moment about y = 0. */
export interface BandIntegral {
  readonly forceN: number;
  readonly momentAboutSoffitNmm: number;
}

/**
 * Eight-point Gauss–Legendre nodes and weights on [−1, 1] (Abramowitz & Stegun, Handbook of
 * Mathematical Functions, Table 25.4): exact for polynomials up to degree 15.
 */
const GAUSS_NODES = Float64Array.from([
  -0.9602898564975363, -0.7966664774136267, -0.525532409916329, -0.1834346424956498, 0.1834346424956498,
  0.525532409916329, 0.7966664774136267, 0.9602898564975363,
]);
const GAUSS_WEIGHTS = Float64Array.from([
  0.1012285362903763, 0.2223810344533745, 0.3137066458778873, 0.362683783378362, 0.362683783378362,
  0.3137066458778873, 0.2223810344533745, 0.1012285362903763,
]);

/** Polygons are immutable, so each one's width table is built once and kept while it lives. */
const widthTables = new WeakMap<PolygonMm, WidthTable>();

function widthTableOf(polygon: PolygonMm): WidthTable {
  let table = widthTables.get(polygon);
  if (table === undefined) {
    table = buildWidthTable(polygon);
    widthTables.set(polygon, table);
  }
  return table;
}

function buildWidthTable(polygon: PolygonMm): WidthTable {
  const rings = [
    { ring: polygon.outer, sign: materialSign(polygon.outer, false) },
    ...polygon.holes.map((ring) => ({ ring, sign: materialSign(ring, true) })),
  ];
  const heights = [...new Set(rings.flatMap(({ ring }) => ring.map(([, y]) => y)))].sort((a, b) => a - b);
  const slabCount = Math.max(heights.length - 1, 0);
  const widthAtSlabBottomMm = new Float64Array(slabCount);
  const widthAtSlabTopMm = new Float64Array(slabCount);
  for (let k = 0; k < slabCount; k++) {
    widthAtSlabBottomMm[k] = chordLengthMm(rings, heights[k]!, heights[k + 1]!, heights[k]!);
    widthAtSlabTopMm[k] = chordLengthMm(rings, heights[k]!, heights[k + 1]!, heights[k + 1]!);
  }
  return { boundariesMm: Float64Array.from(heights), widthAtSlabBottomMm, widthAtSlabTopMm };
}

/**
 * The chord length at yMm inside the slab (slabBottomMm, slabTopMm), which no vertex enters.
 * With the material on each ring's left, an edge crossing upwards is a right-hand boundary and
 * one crossing downwards a left-hand boundary, so the chord is Σ ± x over the crossing edges.
 */
function chordLengthMm(
  rings: readonly { readonly ring: RingMm; readonly sign: number }[],
  slabBottomMm: number,
  slabTopMm: number,
  yMm: number,
): number {
  let length = 0;
  for (const { ring, sign } of rings) {
    for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
      const [x0, y0] = ring[j]!;
      const [x1, y1] = ring[i]!;
      const spansSlab = Math.min(y0, y1) <= slabBottomMm && Math.max(y0, y1) >= slabTopMm;
      if (!spansSlab) continue;
      const xAtY = x0 + ((yMm - y0) / (y1 - y0)) * (x1 - x0);
      length += (y1 > y0 ? sign : -sign) * xAtY;
    }
  }
  return length;
}

/** The first slab whose top lies above yMm (binary search), or the slab count if none. */
function firstSlabEndingAbove(table: WidthTable, yMm: number): number {
  let low = 0;
  let high = table.widthAtSlabBottomMm.length;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if (table.boundariesMm[middle + 1]! > yMm) high = middle;
    else low = middle + 1;
  }
  return low;
}

function widthInSlabMm(table: WidthTable, slab: number, yMm: number): number {
  const bottom = table.boundariesMm[slab]!;
  const t = (yMm - bottom) / (table.boundariesMm[slab + 1]! - bottom);
  const widthBottom = table.widthAtSlabBottomMm[slab]!;
  return widthBottom + t * (table.widthAtSlabTopMm[slab]! - widthBottom);
}

/**
 * The width of a polygon's material at height yMm (holes and re-entrant parts excluded): the
 * derivative of the area below y, linear between vertex heights. Where the width jumps (at a
 * horizontal edge) it is the width just above; at the very top, the width just below; 0
 * outside the polygon's height.
 */
export function widthAtMm(polygon: PolygonMm, yMm: number): number {
  const table = widthTableOf(polygon);
  const slabCount = table.widthAtSlabBottomMm.length;
  if (slabCount === 0 || yMm < table.boundariesMm[0]! || yMm > table.boundariesMm[slabCount]!) return 0;
  return widthInSlabMm(table, Math.min(firstSlabEndingAbove(table, yMm), slabCount - 1), yMm);
}

/**
 * ∫∫ f(y) dA and ∫∫ f(y)·y dA over the part of a polygon between y = yLowMm and y = yHighMm,
 * for a stress f (MPa) that varies with height only: a compression zone's force (N) and its
 * moment about the soffit (N·mm). Written as ∫ f(y) w(y) dy with the width function w, the band
 * is split at every vertex height, where w is linear, and each piece is integrated by
 * eight-point Gauss–Legendre quadrature (Abramowitz & Stegun 25.4.29). The force is exact when f
 * is a polynomial of degree ≤ 14 in each piece, the moment when of degree ≤ 13; a smooth curve
 * such as a parabolic stress–strain law is integrated to near round-off. Split the band yourself
 * where f has a kink or a jump (the end of a stress block, the peak of a parabolic–rectangular
 * curve). The polygon's width table is built on first use and cached, so build a section's
 * polygons once and pass the same objects on every call.
 */
export function integrateOverBand(
  polygon: PolygonMm,
  yLowMm: number,
  yHighMm: number,
  stressAt: (yMm: number) => number,
): BandIntegral {
  if (yLowMm > yHighMm) throw new RangeError(`band runs upside down: yLowMm ${yLowMm} > yHighMm ${yHighMm}`);
  const table = widthTableOf(polygon);
  const boundaries = table.boundariesMm;
  const slabCount = table.widthAtSlabBottomMm.length;
  let forceN = 0;
  let momentAboutSoffitNmm = 0;
  for (let slab = firstSlabEndingAbove(table, yLowMm); slab < slabCount && boundaries[slab]! < yHighMm; slab++) {
    const pieceBottom = Math.max(yLowMm, boundaries[slab]!);
    const pieceTop = Math.min(yHighMm, boundaries[slab + 1]!);
    const halfHeight = (pieceTop - pieceBottom) / 2;
    const middle = (pieceTop + pieceBottom) / 2;
    let pieceForce = 0;
    let pieceMoment = 0;
    for (let i = 0; i < GAUSS_NODES.length; i++) {
      const y = middle + halfHeight * GAUSS_NODES[i]!;
      const forcePerHeight = stressAt(y) * widthInSlabMm(table, slab, y) * GAUSS_WEIGHTS[i]!;
      pieceForce += forcePerHeight;
      pieceMoment += forcePerHeight * y;
    }
    forceN += pieceForce * halfHeight;
    momentAboutSoffitNmm += pieceMoment * halfHeight;
  }
  return { forceN, momentAboutSoffitNmm };
}
