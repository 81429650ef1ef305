import { shapeToPolygons, type PolygonMm, type SectionShape } from '@spanledger/shared';

import { strandPositionsMm, type DrawnStrandRow } from './strand-positions';

/** The deck slab over the girder, as the span gives it. */
export interface DeckOutline {
  readonly widthMm: number;
  readonly thicknessMm: number;
  readonly haunchMm: number;
}

/** A rectangle in drawing coordinates (mm, y downwards as SVG has it). */
export interface DrawnRect {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/** A strand placed on the drawing, y already flipped for SVG. */
export interface PlacedStrand {
  readonly rowId: string;
  readonly index: number;
  readonly x: number;
  readonly y: number;
  /** The circle drawn: true size, or larger where the spacing leaves room, so its state reads at a glance. */
  readonly radiusMm: number;
  /** The circle that takes a tap: up to half-way to the nearest strand. */
  readonly hitRadiusMm: number;
}

export interface SectionDrawingLayout {
  readonly viewBox: string;
  readonly widthMm: number;
  readonly heightMm: number;
  /** Outlines and voids of the concrete as one even–odd SVG path. */
  readonly concretePath: string;
  readonly deck: DrawnRect | null;
  readonly haunch: DrawnRect | null;
  readonly strands: readonly PlacedStrand[];
  /** Smallest tap circle of any strand; the drawing is shown large enough that this is a finger's width. */
  readonly smallestHitRadiusMm: number;
  /** Spacing of the hatching of strands with section loss. */
  readonly hatchSpacingMm: number;
}

/** A drawn strand grows to at most twice its true size, and to no more than this share of the way to its neighbour. */
const MAX_DRAWN_ENLARGEMENT = 2;
const DRAWN_SHARE_OF_SPACING = 0.35;
/** A lone strand's tap circle stops growing here. */
const MAX_HIT_RADIUS_MM = 60;
/** Margin round the drawing, as a share of its larger extent. */
const MARGIN_SHARE = 0.05;

/**
 * Lays out a section for drawing: its polygons as one path, the deck and haunch on its flat top,
 * and every strand of every row (x across, y up flipped to SVG's y down), in a viewBox in mm.
 * The view is cut to the girder's width and a wider deck runs off its edges, so the strands are
 * not shrunk to fit a whole deck.
 */
export function sectionDrawingLayout(section: SectionShape, rows: readonly DrawnStrandRow[], deck: DeckOutline | null): SectionDrawingLayout {
  const polygons = shapeToPolygons(section);
  const strands = placeStrands(polygons, rows);
  const top = flatTopOf(polygons);
  const haunch = deck && top && deck.haunchMm > 0 ? { x: top.leftMm, y: -(top.yMm + deck.haunchMm), width: top.rightMm - top.leftMm, height: deck.haunchMm } : null;
  const deckRect = deck && top ? { x: (top.leftMm + top.rightMm) / 2 - deck.widthMm / 2, y: -(top.yMm + deck.haunchMm + deck.thicknessMm), width: deck.widthMm, height: deck.thicknessMm } : null;

  const points = polygons.flatMap((polygon) => polygon.outer);
  const xs = [...points.map(([x]) => x), ...strands.flatMap((s) => [s.x - s.radiusMm, s.x + s.radiusMm])];
  const ys = [...points.map(([, y]) => -y), ...strands.flatMap((s) => [s.y - s.radiusMm, s.y + s.radiusMm])];
  if (deckRect) ys.push(deckRect.y);
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const margin = MARGIN_SHARE * Math.max(maxX - minX, maxY - minY);
  const widthMm = maxX - minX + 2 * margin;
  const heightMm = maxY - minY + 2 * margin;
  const largestDiameterMm = Math.max(0, ...rows.map((row) => row.strandDiameterMm));
  return {
    viewBox: [minX - margin, minY - margin, widthMm, heightMm].map(rounded).join(' '),
    widthMm,
    heightMm,
    concretePath: polygons.map(polygonPath).join(' '),
    deck: deckRect,
    haunch,
    strands,
    smallestHitRadiusMm: Math.min(...strands.map((strand) => strand.hitRadiusMm)),
    hatchSpacingMm: Math.max(largestDiameterMm / 4, 1),
  };
}

function placeStrands(polygons: readonly PolygonMm[], rows: readonly DrawnStrandRow[]): PlacedStrand[] {
  const centres = rows.flatMap((row) => strandPositionsMm(polygons, row).map((position, index) => ({ row, index, x: position.xMm, y: -position.yMm })));
  return centres.map(({ row, index, x, y }, self) => {
    const nearestMm = centres.reduce((nearest, other, i) => (i === self ? nearest : Math.min(nearest, Math.hypot(other.x - x, other.y - y))), Infinity);
    const trueRadiusMm = row.strandDiameterMm / 2;
    const radiusMm = Math.max(trueRadiusMm, Math.min(DRAWN_SHARE_OF_SPACING * nearestMm, MAX_DRAWN_ENLARGEMENT * trueRadiusMm));
    const hitRadiusMm = Math.max(radiusMm, Math.min(nearestMm / 2, MAX_HIT_RADIUS_MM));
    return { rowId: row.id, index, x, y, radiusMm, hitRadiusMm };
  });
}

/** The highest horizontal edge of the outline, where a deck sits; null for a shape that ends in a point. */
function flatTopOf(polygons: readonly PolygonMm[]): { leftMm: number; rightMm: number; yMm: number } | null {
  const points = polygons.flatMap((polygon) => polygon.outer);
  const yMm = Math.max(...points.map(([, y]) => y));
  const topXs = points.filter(([, y]) => y === yMm).map(([x]) => x);
  const [leftMm, rightMm] = [Math.min(...topXs), Math.max(...topXs)];
  return rightMm > leftMm ? { leftMm, rightMm, yMm } : null;
}

function polygonPath(polygon: PolygonMm): string {
  return [polygon.outer, ...polygon.holes].map((ring) => `M${ring.map(([x, y]) => `${rounded(x)},${rounded(-y)}`).join('L')}Z`).join(' ');
}

/** Hundredths of a millimetre are finer than any screen shows. */
function rounded(value: number): number {
  return Math.round(value * 100) / 100;
}
