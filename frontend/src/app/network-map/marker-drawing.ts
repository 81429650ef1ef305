import { MarkerLook, MarkerStyle, markerLookKey, markerStyle } from './marker-look';
import { MARK_HALO, MARK_LINE_WEIGHT, ShapePen, traceMarks, traceOutline } from './marker-shapes';

/** Markers that look alike: the look is drawn once, as a stamp, and stamped at each of them. */
export interface MarkerBatch {
  readonly look: MarkerLook;
  readonly style: MarkerStyle;
}

/** Markers grouped by look, and the order they are drawn in. */
export interface MarkerDrawing {
  readonly batches: readonly MarkerBatch[];
  /** The batch of each marker, by its position in the list the drawing was made from. */
  readonly batchOf: Int32Array;
  /** Positions of the markers in drawing order. */
  readonly order: Int32Array;
}

/** Where markers sit on the canvas, in CSS pixels; marker `i` is at (x[i], y[i]). */
export interface MarkerPositions {
  readonly x: Float64Array;
  readonly y: Float64Array;
}

/** The part of a canvas' 2D context that draws one look, so that drawing can be checked without a canvas. */
export type ShapeContext = Pick<
  CanvasRenderingContext2D,
  'beginPath' | 'moveTo' | 'lineTo' | 'arc' | 'closePath' | 'fill' | 'stroke' | 'fillStyle' | 'strokeStyle' | 'lineWidth' | 'globalAlpha' | 'lineCap' | 'lineJoin'
>;

/** One look drawn once, centred in a square `size` CSS pixels wide, ready to be stamped. */
export interface MarkerStamp {
  readonly image: CanvasImageSource;
  readonly size: number;
}

/** How far outside its outline a click or the pointer still picks a marker, in pixels. */
export const MARKER_HIT_TOLERANCE_PX = 4;

/**
 * Groups markers by look and orders them for drawing: plain ones first, then those below 1.00, then
 * the selected one, so that neighbours never hide a low rating or the structure picked; within
 * each of these as listed.
 */
export function markerDrawing(looks: readonly MarkerLook[]): MarkerDrawing {
  const batchByKey = new Map<string, number>();
  const batches: MarkerBatch[] = [];
  const batchOf = new Int32Array(looks.length);
  const rankCounts = [0, 0, 0];
  looks.forEach((look, index) => {
    const key = markerLookKey(look);
    let batch = batchByKey.get(key);
    if (batch === undefined) {
      batch = batches.push({ look, style: markerStyle(look) }) - 1;
      batchByKey.set(key, batch);
    }
    batchOf[index] = batch;
    rankCounts[drawingRank(look)]! += 1;
  });
  // A counting sort by rank keeps the listed order within each rank.
  const next = [0, rankCounts[0]!, rankCounts[0]! + rankCounts[1]!];
  const order = new Int32Array(looks.length);
  looks.forEach((look, index) => {
    order[next[drawingRank(look)]!++] = index;
  });
  return { batches, batchOf, order };
}

function drawingRank(look: MarkerLook): 0 | 1 | 2 {
  if (look.selected) return 2;
  return look.belowOne ? 1 : 0;
}

/** The width of the square a look's stamp needs: its outline, the outer half of its stroke, and a pixel for smoothing. */
export function stampSize(style: MarkerStyle): number {
  return 2 * Math.ceil(style.radius + Math.max(style.weight, MARK_HALO.weight) / 2 + 1);
}

/** Draws one marker of a look centred on (x, y), as the legend's SVG does: the outline filled and stroked, then the marks. */
export function drawMarker(ctx: ShapeContext, look: MarkerLook, style: MarkerStyle, x: number, y: number): void {
  const pen = canvasPen(ctx);
  ctx.lineCap = 'round';
  ctx.lineJoin = 'round';
  ctx.beginPath();
  traceOutline(pen, look.shape, x, y, style.radius);
  ctx.globalAlpha = style.fillOpacity;
  ctx.fillStyle = style.fillColor;
  ctx.fill();
  ctx.globalAlpha = 1;
  ctx.strokeStyle = style.color;
  ctx.lineWidth = style.weight;
  ctx.stroke();

  ctx.beginPath();
  if (!traceMarks(pen, look.shape, x, y, style.radius)) return;
  ctx.strokeStyle = MARK_HALO.color;
  ctx.lineWidth = MARK_HALO.weight;
  ctx.stroke();
  ctx.strokeStyle = style.color;
  ctx.lineWidth = MARK_LINE_WEIGHT;
  ctx.stroke();
}

/**
 * Stamps the markers in drawing order, each with its batch's stamp, skipping those wholly outside the
 * canvas (`width` × `height` CSS pixels). Stamps land on whole device pixels (`pixelRatio` of them
 * to a CSS pixel) so that they are copied, not resampled.
 */
export function stampMarkers(
  ctx: Pick<CanvasRenderingContext2D, 'drawImage'>,
  drawing: MarkerDrawing,
  stamps: readonly MarkerStamp[],
  positions: MarkerPositions,
  canvas: { readonly width: number; readonly height: number; readonly pixelRatio: number },
): void {
  const { width, height, pixelRatio } = canvas;
  for (const index of drawing.order) {
    const { image, size } = stamps[drawing.batchOf[index]!]!;
    const half = size / 2;
    const x = positions.x[index]!;
    const y = positions.y[index]!;
    if (x <= -half || y <= -half || x >= width + half || y >= height + half) continue;
    ctx.drawImage(image, Math.round((x - half) * pixelRatio) / pixelRatio, Math.round((y - half) * pixelRatio) / pixelRatio, size, size);
  }
}

/**
 * The marker under a point of the canvas: of those whose outline (plus the hit tolerance) reaches
 * it, the nearest; between equally near ones, the one drawn last. Answers its index, or null.
 */
export function markerAt(drawing: MarkerDrawing, positions: MarkerPositions, x: number, y: number): number | null {
  const reaches = drawing.batches.map(({ style }) => (style.radius + style.weight / 2 + MARKER_HIT_TOLERANCE_PX) ** 2);
  let found: number | null = null;
  let nearest = Infinity;
  for (const index of drawing.order) {
    const dx = positions.x[index]! - x;
    const dy = positions.y[index]! - y;
    const distanceSquared = dx * dx + dy * dy;
    if (distanceSquared <= reaches[drawing.batchOf[index]!]! && distanceSquared <= nearest) {
      nearest = distanceSquared;
      found = index;
    }
  }
  return found;
}

function canvasPen(ctx: ShapeContext): ShapePen {
  return {
    moveTo: (x, y) => ctx.moveTo(x, y),
    lineTo: (x, y) => ctx.lineTo(x, y),
    circle: (x, y, radius) => {
      ctx.moveTo(x + radius, y);
      ctx.arc(x, y, radius, 0, Math.PI * 2);
    },
    closePath: () => ctx.closePath(),
  };
}
