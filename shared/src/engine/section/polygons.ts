import { polygonMm, type PointMm, type PolygonMm, type RingMm } from '../geometry';
import type { DoubleTeeSection, SectionShape, VoidedSlabSection } from './shapes';

/** Sides of the regular polygon that stands in for a circular void; a multiple of 4 (see {@link voidRing}). */
export const CIRCLE_POLYGON_SIDES = 96;

/** A symmetric outline's width at rising heights, `[yMm, widthMm]`; equal heights make a step. */
type WidthLevels = readonly (readonly [yMm: number, widthMm: number])[];

/**
 * The polygons of a calculation-file section, x across centred on 0 (a custom polygon keeps
 * the x it was given) and y = 0 at the soffit: one polygon with its voids as holes, for every
 * shape. Expects a shape that passed `sectionShapeSchema`. A circular void becomes a
 * regular {@link CIRCLE_POLYGON_SIDES}-gon of the circle's area (common practice); its own
 * second moment then exceeds the circle's πr⁴/4 by about one part in ten million.
 */
export function shapeToPolygons(shape: SectionShape): PolygonMm[] {
  switch (shape.shape) {
    case 'rectangle':
      return [polygonMm(rectangleRing(shape.widthMm, 0, shape.depthMm))];
    case 'tee': {
      const webTopMm = shape.depthMm - shape.flangeThicknessMm;
      const levels: WidthLevels = [
        [0, shape.webWidthMm],
        [webTopMm, shape.webWidthMm],
        [webTopMm, shape.flangeWidthMm],
        [shape.depthMm, shape.flangeWidthMm],
      ];
      return [polygonMm(symmetricRing(levels))];
    }
    case 'i-girder': {
      const bottomFlangeTopMm = shape.bottomFlangeThicknessMm;
      const webBottomMm = bottomFlangeTopMm + shape.bottomTaperHeightMm;
      const topFlangeBottomMm = shape.depthMm - shape.topFlangeThicknessMm;
      const webTopMm = topFlangeBottomMm - shape.topTaperHeightMm;
      return [
        polygonMm(
          symmetricRing([
            [0, shape.bottomFlangeWidthMm],
            [bottomFlangeTopMm, shape.bottomFlangeWidthMm],
            [webBottomMm, shape.webWidthMm],
            [webTopMm, shape.webWidthMm],
            [topFlangeBottomMm, shape.topFlangeWidthMm],
            [shape.depthMm, shape.topFlangeWidthMm],
          ]),
        ),
      ];
    }
    case 'profile':
      return [polygonMm(symmetricRing(shape.widthsMm))];
    case 'box': {
      const filletMm = shape.voidFilletMm ?? 0;
      const voidTopMm = shape.voidBottomMm + shape.voidDepthMm;
      const voidLevels: WidthLevels = [
        [shape.voidBottomMm, shape.voidWidthMm - 2 * filletMm],
        [shape.voidBottomMm + filletMm, shape.voidWidthMm],
        [voidTopMm - filletMm, shape.voidWidthMm],
        [voidTopMm, shape.voidWidthMm - 2 * filletMm],
      ];
      return [polygonMm(rectangleRing(shape.widthMm, 0, shape.depthMm), [symmetricRing(voidLevels)])];
    }
    case 'voided-slab':
      const voids = voidCentresXMm(shape).map((xMm) => voidRing(shape, xMm));
      return [polygonMm(rectangleRing(shape.widthMm, 0, shape.depthMm), voids)];
    case 'double-tee':
      return [polygonMm(doubleTeeRing(shape))];
    case 'polygon':
      return [polygonMm(shape.pointsMm, shape.holesMm ?? [])];
  }
}

/** A rectangle of the given width centred on x = 0, from bottomMm to topMm. */
export function rectangleRing(widthMm: number, bottomMm: number, topMm: number): RingMm {
  const half = widthMm / 2;
  return [[-half, bottomMm], [half, bottomMm], [half, topMm], [-half, topMm]];
}

/** Up the right-hand side (x = +width/2) and back down the left. */
function symmetricRing(levels: WidthLevels): RingMm {
  const right = levels.map(([y, width]): PointMm => [width / 2, y]);
  const left = [...levels].reverse().map(([y, width]): PointMm => [-width / 2, y]);
  return [...right, ...left];
}

function voidCentresXMm(slab: VoidedSlabSection): number[] {
  return Array.from({ length: slab.voidCount }, (_, i) => (slab.widthMm * (i + 0.5)) / slab.voidCount - slab.widthMm / 2);
}

/**
 * The equal-area regular polygon of a void: circumradius r·√(2π / (n sin(2π/n))). Its vertices
 * sit half a step off the axes, so flat sides face up, down and sideways at r·√((π/n) / tan(π/n))
 * < r from the centre: the polygon never reaches past the circle's own extent.
 */
function voidRing(slab: VoidedSlabSection, centreXMm: number): RingMm {
  const n = CIRCLE_POLYGON_SIDES;
  const circumradiusMm = (slab.voidDiameterMm / 2) * Math.sqrt((2 * Math.PI) / (n * Math.sin((2 * Math.PI) / n)));
  return Array.from({ length: n }, (_, k): PointMm => {
    const angle = ((k + 0.5) * 2 * Math.PI) / n;
    return [centreXMm + circumradiusMm * Math.cos(angle), slab.voidCentreYMm + circumradiusMm * Math.sin(angle)];
  });
}

/** The outline of flange and both stems in one ring, counter-clockwise from the left stem's foot. */
function doubleTeeRing(section: DoubleTeeSection): RingMm {
  const stemTopMm = section.depthMm - section.flangeThicknessMm;
  const flangeHalf = section.flangeWidthMm / 2;
  const bottomHalf = section.stemBottomWidthMm / 2;
  const topHalf = section.stemTopWidthMm / 2;
  const left = -section.stemSpacingMm / 2;
  const right = section.stemSpacingMm / 2;
  return [
    [left - bottomHalf, 0],
    [left + bottomHalf, 0],
    [left + topHalf, stemTopMm],
    [right - topHalf, stemTopMm],
    [right - bottomHalf, 0],
    [right + bottomHalf, 0],
    [right + topHalf, stemTopMm],
    [flangeHalf, stemTopMm],
    [flangeHalf, section.depthMm],
    [-flangeHalf, section.depthMm],
    [-flangeHalf, stemTopMm],
    [left - topHalf, stemTopMm],
  ];
}

/** The overall depth of a section, soffit to highest point. */
export function sectionDepthMm(shape: SectionShape): number {
  switch (shape.shape) {
    case 'profile':
      return shape.widthsMm[shape.widthsMm.length - 1]![0];
    case 'polygon':
      return Math.max(...shape.pointsMm.map(([, y]) => y));
    default:
      return shape.depthMm;
  }
}

/**
 * The width of the flat top on which a deck and its haunch sit (engineering reference §2: the
 * deck sits on the girder's flat top plus the haunch), or null when the shape's highest points
 * form no horizontal edge. For a custom polygon, the total length of its outline's horizontal
 * edges at the highest y.
 */
export function flatTopWidthMm(shape: SectionShape): number | null {
  switch (shape.shape) {
    case 'rectangle':
    case 'box':
    case 'voided-slab':
      return shape.widthMm;
    case 'tee':
    case 'double-tee':
      return shape.flangeWidthMm;
    case 'i-girder':
      return shape.topFlangeWidthMm;
    case 'profile': {
      const topWidthMm = shape.widthsMm[shape.widthsMm.length - 1]![1];
      return topWidthMm > 0 ? topWidthMm : null;
    }
    case 'polygon':
      return polygonFlatTopWidthMm(shape.pointsMm);
  }
}

function polygonFlatTopWidthMm(pointsMm: readonly (readonly [number, number])[]): number | null {
  const topMm = Math.max(...pointsMm.map(([, y]) => y));
  const widthMm = pointsMm.reduce((sum, [x, y], i) => {
    const [xNext, yNext] = pointsMm[(i + 1) % pointsMm.length]!;
    return y === topMm && yNext === topMm ? sum + Math.abs(xNext - x) : sum;
  }, 0);
  return widthMm > 0 ? widthMm : null;
}
