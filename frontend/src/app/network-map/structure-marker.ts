import * as L from 'leaflet';

import { MarkerLook, MarkerStyle, markerLookKey, markerStyle } from './marker-look';
import { MARK_HALO, MARK_LINE_WEIGHT, ShapePen, traceMarks, traceOutline } from './marker-shapes';

/** The parts of Leaflet's canvas renderer a marker draws with (private in Leaflet 1.9, stable since 1.0). */
interface CanvasRendererInternals {
  readonly _drawing: boolean;
  readonly _ctx: CanvasRenderingContext2D;
  _fillStroke(ctx: CanvasRenderingContext2D, layer: L.Path): void;
}

/** The parts of a circle marker that say where and how big it is on the canvas. */
interface CircleMarkerInternals {
  readonly _renderer: CanvasRendererInternals;
  readonly _point: L.Point;
  readonly _radius: number;
  _empty(): boolean;
}

const pens = new WeakMap<CanvasRenderingContext2D, ShapePen>();

/** One pen per canvas: markers draw thousands of times a frame, so it is not rebuilt each time. */
function penFor(ctx: CanvasRenderingContext2D): ShapePen {
  let pen = pens.get(ctx);
  if (!pen) {
    pen = {
      moveTo: (x, y) => ctx.moveTo(x, y),
      lineTo: (x, y) => ctx.lineTo(x, y),
      circle: (x, y, radius) => {
        ctx.moveTo(x + radius, y);
        ctx.arc(x, y, radius, 0, Math.PI * 2);
      },
      closePath: () => ctx.closePath(),
    };
    pens.set(ctx, pen);
  }
  return pen;
}

/**
 * A structure's marker on Leaflet's canvas renderer: a circle marker (so hit-testing, bounds and
 * redraws stay Leaflet's) that draws its status shape instead of the circle. Canvas only.
 */
export class StructureMarker extends L.CircleMarker {
  private drawn: { readonly key: string; readonly look: MarkerLook; readonly style: MarkerStyle } | null = null;

  /** Restyles the marker when its look changed; answers whether it did. */
  show(look: MarkerLook): boolean {
    const key = markerLookKey(look);
    if (key === this.drawn?.key) return false;
    const style = markerStyle(look);
    this.drawn = { key, look, style };
    this.setStyle(style);
    return true;
  }

  /** Called by the canvas renderer while it draws, in place of Leaflet's own circle. */
  _updatePath(): void {
    const marker = this as unknown as CircleMarkerInternals;
    const renderer = marker._renderer;
    if (!renderer._drawing || marker._empty() || !this.drawn) return;
    const { look, style } = this.drawn;
    const ctx = renderer._ctx;
    const pen = penFor(ctx);
    const { x, y } = marker._point;
    const radius = Math.max(marker._radius, 1);

    ctx.beginPath();
    traceOutline(pen, look.shape, x, y, radius);
    renderer._fillStroke(ctx, this);

    ctx.beginPath();
    if (!traceMarks(pen, look.shape, x, y, radius)) return;
    ctx.globalAlpha = 1;
    ctx.lineCap = 'round';
    ctx.strokeStyle = MARK_HALO.color;
    ctx.lineWidth = MARK_HALO.weight;
    ctx.stroke();
    ctx.strokeStyle = style.color;
    ctx.lineWidth = MARK_LINE_WEIGHT;
    ctx.stroke();
  }
}
