import { StructureStatus } from '@spanledger/shared';

/** The outline of a structure's marker, which tells its status apart without relying on colour. */
export type MarkerShape = 'circle' | 'diamond' | 'crossed-square';

export const STATUS_MARKER_SHAPES: Readonly<Record<StructureStatus, MarkerShape>> = {
  open: 'circle',
  posted: 'diamond',
  closed: 'crossed-square',
};

/**
 * Each shape's size as a share of the circle's radius, so that all three cover the same area
 * (diamond: 2h² = πr², square: 4h² = πr²); a shape fills the box of its own radius.
 */
export const MARKER_SHAPE_SCALE: Readonly<Record<MarkerShape, number>> = {
  circle: 1,
  diamond: Math.sqrt(Math.PI / 2),
  'crossed-square': Math.sqrt(Math.PI) / 2,
};

/** How far the cross of a closed structure reaches towards the square's corners. */
const CROSS_REACH = 0.55;

/** The marks are drawn twice, a light halo under a line in the outline colour, to read on dark and light fills. */
export const MARK_HALO = { color: 'rgba(255, 255, 255, 0.9)', weight: 3 } as const;
export const MARK_LINE_WEIGHT = 1.5;

/** The drawing steps a shape needs; the canvas and the legend's SVG each provide them. */
export interface ShapePen {
  moveTo(x: number, y: number): void;
  lineTo(x: number, y: number): void;
  circle(x: number, y: number, radius: number): void;
  closePath(): void;
}

/** Traces the outline of a shape centred on (x, y) within the box of half-size `radius`. */
export function traceOutline(pen: ShapePen, shape: MarkerShape, x: number, y: number, radius: number): void {
  switch (shape) {
    case 'circle':
      pen.circle(x, y, radius);
      return;
    case 'diamond':
      pen.moveTo(x, y - radius);
      pen.lineTo(x + radius, y);
      pen.lineTo(x, y + radius);
      pen.lineTo(x - radius, y);
      pen.closePath();
      return;
    case 'crossed-square':
      pen.moveTo(x - radius, y - radius);
      pen.lineTo(x + radius, y - radius);
      pen.lineTo(x + radius, y + radius);
      pen.lineTo(x - radius, y + radius);
      pen.closePath();
      return;
  }
}

/**
 * Traces the lines drawn over the fill (the cross of a closed structure); answers false, having
 * traced nothing, for the shapes without any.
 */
export function traceMarks(pen: ShapePen, shape: MarkerShape, x: number, y: number, radius: number): boolean {
  if (shape !== 'crossed-square') return false;
  const reach = radius * CROSS_REACH;
  pen.moveTo(x - reach, y - reach);
  pen.lineTo(x + reach, y + reach);
  pen.moveTo(x + reach, y - reach);
  pen.lineTo(x - reach, y + reach);
  return true;
}

/** The SVG path data of what `trace` draws, for the legend and the filter chips. */
export function svgPathOf(trace: (pen: ShapePen) => void): string {
  const parts: string[] = [];
  const at = (x: number, y: number) => `${trim(x)} ${trim(y)}`;
  trace({
    moveTo: (x, y) => parts.push(`M${at(x, y)}`),
    lineTo: (x, y) => parts.push(`L${at(x, y)}`),
    // Two half-circle arcs: one arc cannot start and end at the same point.
    circle: (x, y, r) => parts.push(`M${at(x - r, y)}A${trim(r)} ${trim(r)} 0 1 0 ${at(x + r, y)}A${trim(r)} ${trim(r)} 0 1 0 ${at(x - r, y)}Z`),
    closePath: () => parts.push('Z'),
  });
  return parts.join('');
}

function trim(value: number): string {
  return String(Math.round(value * 1000) / 1000);
}
