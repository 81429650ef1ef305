import * as L from 'leaflet';

import { MarkerBatch, MarkerDrawing, MarkerPositions, MarkerStamp, drawMarker, markerAt, markerDrawing, stampMarkers, stampSize } from './marker-drawing';
import { MarkerLook, markerLookKey } from './marker-look';

/** A structure as the map layer draws it. */
export interface StructureMarker {
  readonly id: number;
  readonly latLng: L.LatLng;
  readonly look: MarkerLook;
}

/** Drawn beyond the view on every side, as a share of its size, so that a short pan shows markers before the redraw. */
const CANVAS_PADDING = 0.5;

/** The parts of Leaflet's renderer base this layer builds on (private in Leaflet 1.9, stable since 1.0). */
interface RendererInternals {
  readonly _bounds: L.Bounds | undefined;
  /** What the renderer base places, pads and scales over the view. */
  _container: HTMLElement | undefined;
  _update(): void;
}

interface MapInternals {
  readonly _animatingZoom: boolean;
}

const rendererBase = L.Renderer.prototype as unknown as RendererInternals;

/**
 * Every structure's marker on one canvas, in batches of markers that look alike rather than as a
 * Leaflet path apiece: each look is drawn once (one path, one fill, one stroke) and stamped at each
 * of its markers. On two cores headless Chromium stamps 10 000 markers in about 60 ms; one path per
 * look took 300–500 ms to stroke, a path per marker about 200 ms.
 *
 * Leaflet's renderer base keeps the canvas placed over the view, padded, and scales it during zoom
 * animations; the markers are projected once per zoom level and redrawn when the map settles.
 * Clicks and the pointer cursor find the nearest marker on screen.
 */
export class StructureMarkersLayer extends L.Renderer {
  private markers: readonly StructureMarker[] = [];
  private drawing: MarkerDrawing = markerDrawing([]);
  /** The stamp of each of the drawing's batches. */
  private batchStamps: readonly MarkerStamp[] = [];
  /** Each look drawn once, by look key; kept across changes of selection or colouring. */
  private readonly stamps = new Map<string, MarkerStamp>();
  /** Device pixels per CSS pixel, as Leaflet's own canvas renderer chooses them. */
  private readonly pixelRatio = L.Browser.retina ? 2 : 1;
  /** Pixel positions of the markers at each zoom level seen since the structures last changed. */
  private readonly projected = new Map<number, MarkerPositions>();
  /** Where each marker was last drawn on the canvas, for hit-testing. */
  private onCanvas: MarkerPositions = { x: new Float64Array(0), y: new Float64Array(0) };
  /** The view the canvas was last sized and drawn for, so that Leaflet's 'viewreset' then 'moveend' draw once. */
  private drawnView: string | null = null;
  private canvas: HTMLCanvasElement | null = null;
  private ctx: CanvasRenderingContext2D | null = null;

  constructor(private readonly markerClicked: (id: number) => void) {
    super({ padding: CANVAS_PADDING });
  }

  /** Shows these markers in place of the ones shown before, and redraws. */
  show(markers: readonly StructureMarker[]): void {
    if (!samePlaces(markers, this.markers)) {
      this.projected.clear();
      this.onCanvas = { x: new Float64Array(markers.length), y: new Float64Array(markers.length) };
    }
    this.markers = markers;
    this.drawing = markerDrawing(markers.map((marker) => marker.look));
    this.batchStamps = this.drawing.batches.map((batch) => this.stampOf(batch));
    this.draw();
  }

  /** The renderer base's map events and the pointer's; Leaflet calls these as methods of the layer, and unbinds them by identity. */
  override getEvents(): Record<string, L.LeafletEventHandlerFn> {
    return {
      ...L.Renderer.prototype.getEvents?.call(this),
      click: this.onClick as L.LeafletEventHandlerFn,
      mousemove: this.onPointerMove as L.LeafletEventHandlerFn,
      mouseout: this.onPointerOut,
    };
  }

  /** Called by Leaflet's renderer base when the layer joins a map. */
  _initContainer(): void {
    this.canvas = document.createElement('canvas');
    this.ctx = this.canvas.getContext('2d');
    (this as unknown as RendererInternals)._container = this.canvas;
  }

  /** Called by Leaflet's renderer base when the layer leaves the map. */
  _destroyContainer(): void {
    this.canvas?.remove();
    this.canvas = null;
    this.ctx = null;
    this.drawnView = null;
    (this as unknown as RendererInternals)._container = undefined;
  }

  /** Called by Leaflet's renderer base when the map has moved: resizes the canvas over the new view and redraws. */
  _update(): void {
    // As Leaflet's own canvas does: mid-animation the canvas is scaled, and redrawn once the zoom ends.
    if ((this._map as unknown as MapInternals)._animatingZoom && this.bounds()) return;
    rendererBase._update.call(this);
    const area = this.canvasArea();
    if (!this.canvas || !area) return;
    const { topLeft, size } = area;
    const view = `${this._map.getZoom()}:${topLeft.x},${topLeft.y}:${size.x}x${size.y}`;
    if (view === this.drawnView) return;
    this.drawnView = view;
    const pixelRatio = this.pixelRatio;
    L.DomUtil.setPosition(this.canvas, topLeft);
    // Setting the size clears the canvas.
    this.canvas.width = pixelRatio * size.x;
    this.canvas.height = pixelRatio * size.y;
    this.canvas.style.width = `${size.x}px`;
    this.canvas.style.height = `${size.y}px`;
    this.ctx?.setTransform(pixelRatio, 0, 0, pixelRatio, 0, 0);
    this.draw();
  }

  private bounds(): L.Bounds | undefined {
    return (this as unknown as RendererInternals)._bounds;
  }

  /** The canvas' place among the map's layer points and its size, once the renderer base has placed it. */
  private canvasArea(): { readonly topLeft: L.Point; readonly size: L.Point } | null {
    const bounds = this.bounds();
    return bounds?.min ? { topLeft: bounds.min, size: bounds.getSize() } : null;
  }

  private draw(): void {
    const area = this.canvasArea();
    if (!this.ctx || !this._map || !area) return;
    const { topLeft, size } = area;
    this.ctx.clearRect(0, 0, size.x, size.y);
    const projected = this.projectedAt(this._map.getZoom());
    const offset = this._map.getPixelOrigin().add(topLeft);
    for (let index = 0; index < this.markers.length; index += 1) {
      this.onCanvas.x[index] = projected.x[index]! - offset.x;
      this.onCanvas.y[index] = projected.y[index]! - offset.y;
    }
    stampMarkers(this.ctx, this.drawing, this.batchStamps, this.onCanvas, { width: size.x, height: size.y, pixelRatio: this.pixelRatio });
  }

  private stampOf({ look, style }: MarkerBatch): MarkerStamp {
    const key = markerLookKey(look);
    let stamp = this.stamps.get(key);
    if (!stamp) {
      const size = stampSize(style);
      const image = document.createElement('canvas');
      image.width = image.height = size * this.pixelRatio;
      const ctx = image.getContext('2d');
      ctx?.scale(this.pixelRatio, this.pixelRatio);
      if (ctx) drawMarker(ctx, look, style, size / 2, size / 2);
      stamp = { image, size };
      this.stamps.set(key, stamp);
    }
    return stamp;
  }

  private projectedAt(zoom: number): MarkerPositions {
    let positions = this.projected.get(zoom);
    if (!positions) {
      positions = { x: new Float64Array(this.markers.length), y: new Float64Array(this.markers.length) };
      this.markers.forEach((marker, index) => {
        const point = this._map.project(marker.latLng, zoom);
        positions!.x[index] = point.x;
        positions!.y[index] = point.y;
      });
      this.projected.set(zoom, positions);
    }
    return positions;
  }

  private markerUnder(containerPoint: L.Point): StructureMarker | null {
    const area = this.canvasArea();
    if (!area || (this._map as unknown as MapInternals)._animatingZoom) return null;
    const point = this._map.containerPointToLayerPoint(containerPoint).subtract(area.topLeft);
    const index = markerAt(this.drawing, this.onCanvas, point.x, point.y);
    return index === null ? null : (this.markers[index] ?? null);
  }

  private onClick(event: L.LeafletMouseEvent): void {
    const marker = this.markerUnder(event.containerPoint);
    if (marker) this.markerClicked(marker.id);
  }

  private onPointerMove(event: L.LeafletMouseEvent): void {
    this.showPointer(this.markerUnder(event.containerPoint) !== null);
  }

  private onPointerOut(): void {
    this.showPointer(false);
  }

  /** Leaflet's own class for things that can be clicked: a pointer cursor, and the grab cursor while dragging. */
  private showPointer(overMarker: boolean): void {
    this.canvas?.classList.toggle('leaflet-interactive', overMarker);
  }
}

/** Whether two marker lists put the same structures in the same places, so their projections can be kept. */
function samePlaces(a: readonly StructureMarker[], b: readonly StructureMarker[]): boolean {
  return a.length === b.length && a.every((marker, index) => marker.latLng.equals(b[index]!.latLng));
}
