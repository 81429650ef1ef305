import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  afterNextRender,
  effect,
  inject,
  input,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { BoundingBox, RatingBasis, StructureFeature } from '@spanledger/shared';
import type * as GeoJSON from 'geojson';
import * as L from 'leaflet';
import { EMPTY, ReplaySubject, catchError, combineLatest, first, race, switchMap, timer } from 'rxjs';

import { ClientConfig, ClientConfigClient } from '../client-config/client-config.client';
import { BasemapClient } from './basemap.client';
import { markerLook } from './marker-look';
import { StructureMarker, StructureMarkersLayer } from './structure-markers-layer';

const INITIAL_CENTER: L.LatLngTuple = [39.5, -98.35];
const INITIAL_ZOOM = 4;
const MIN_ZOOM = 3;
const MAX_ZOOM = 12;
/** Fitting to a handful of nearby structures should still show the country roads around them. */
const MAX_FIT_ZOOM = 10;
const FIT_PADDING: L.PointTuple = [40, 40];

/** Basemap panes sit below Leaflet's tile pane (200), so configured raster tiles draw over them. */
const BASEMAP_PANES = { land: 150, countyBorders: 160, stateBorders: 170 } as const;
type BasemapPane = keyof typeof BASEMAP_PANES;
const BASEMAP_ATTRIBUTION = 'Boundaries: U.S. Census Bureau';
/** When no markers have been painted by then (an empty network, a slow or failed request), the county lines are drawn anyway. */
const COUNTY_LINES_AT_LATEST_MS = 5000;

const LAND_STYLE: L.PathOptions = { stroke: false, fillColor: '#eef0ea', fillOpacity: 1 };
const STATE_BORDER_STYLE: L.PathOptions = { color: '#7d8a90', weight: 1.2, fill: false };
const COUNTY_BORDER_STYLE: L.PathOptions = { color: '#c3cbcd', weight: 0.6, fill: false };

/**
 * The Leaflet map of structures over the shipped vector basemap, one canvas for all markers: each
 * is coloured by its rating factor of record and shaped by its status. Kept apart from the page so
 * that the page can be tested where there is no canvas.
 */
@Component({
  selector: 'sl-structure-map',
  template: `<div
    #mapContainer
    class="map"
    data-testid="network-map"
    [attr.data-marker-count]="markerCount()"
  ></div>`,
  styles: `
    :host { display: block; position: relative; }
    .map { position: absolute; inset: 0; background: #d5e1e6; }
    .map:focus:not(:focus-visible) { outline: none; }
    .map:focus-visible { outline: 2px solid var(--mat-sys-primary); outline-offset: -2px; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructureMapComponent {
  readonly structures = input.required<readonly StructureFeature[]>();
  readonly selectedId = input<number | null>(null);
  /** Which rating factor of record colours the markers. */
  readonly ratingBasis = input<RatingBasis>('legal');
  /** Structures to frame the view around once, when they arrive. */
  readonly fitTo = input<readonly StructureFeature[] | null>(null);
  readonly viewChanged = output<BoundingBox>();
  readonly structureClicked = output<number>();

  protected readonly markerCount = signal(0);

  private readonly mapContainer = viewChild.required<ElementRef<HTMLElement>>('mapContainer');
  private readonly basemapClient = inject(BasemapClient);
  private readonly clientConfigClient = inject(ClientConfigClient);
  private readonly destroyRef = inject(DestroyRef);

  private readonly map = signal<L.Map | null>(null);
  private readonly markersLayer = new StructureMarkersLayer((id) => {
    this.focusedId = id;
    this.structureClicked.emit(id);
  });
  /** The structure last brought into view, so a marker click does not pan the map under the pointer. */
  private focusedId: number | null = null;

  /** The map once created: the basemap, asked for at once, waits for it. */
  private readonly createdMap = new ReplaySubject<L.Map>(1);
  /** Emits after the frame that first showed markers. */
  private readonly markersPainted = new ReplaySubject<void>(1);
  private markersShown = false;

  constructor() {
    // Asked for beside the page's structures rather than once the map exists; the county lines wait for the markers.
    this.addVectorBasemap();
    this.addConfiguredTiles();
    afterNextRender(() => this.createMap());
    effect(() => {
      const map = this.map();
      if (map) this.showStructures(map, this.structures(), this.selectedId(), this.ratingBasis());
    });
    effect(() => {
      const map = this.map();
      const structures = this.fitTo();
      if (map && structures && structures.length > 0) this.fitView(map, structures);
    });
  }

  private createMap(): void {
    L.Icon.Default.imagePath = 'leaflet-images/';
    const container = this.mapContainer().nativeElement;
    const map = L.map(container, { minZoom: MIN_ZOOM, maxZoom: MAX_ZOOM });
    for (const [pane, zIndex] of Object.entries(BASEMAP_PANES)) map.createPane(pane).style.zIndex = String(zIndex);
    map.setView(INITIAL_CENTER, INITIAL_ZOOM);
    this.markersLayer.addTo(map);
    const reportView = () => this.viewChanged.emit(boundingBoxOf(map.getBounds()));
    map.on('moveend', reportView);
    const removeMap = removerOnceSettled(map);

    // The panel beside the map opens and closes: keep Leaflet's idea of the map size current.
    const resizeObserver = new ResizeObserver(() => map.invalidateSize());
    resizeObserver.observe(container);
    this.destroyRef.onDestroy(() => {
      resizeObserver.disconnect();
      map.off('moveend', reportView);
      removeMap();
    });
    this.map.set(map);
    this.createdMap.next(map);
  }

  private addVectorBasemap(): void {
    combineLatest([this.createdMap, this.basemapClient.loadStates()])
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(([map, { land, stateBorders }]) => {
        basemapLayer(land, 'land', LAND_STYLE).addTo(map);
        basemapLayer(stateBorders, 'stateBorders', STATE_BORDER_STYLE).addTo(map);
      });
    // County lines are detail: asked for once the markers have been painted (or the map has waited long enough), so
    // that their 0.8 MB and thousands of lines do not hold up the markers' first paint.
    const countyBorders$ = race(this.markersPainted, timer(COUNTY_LINES_AT_LATEST_MS)).pipe(
      first(),
      switchMap(() => this.basemapClient.loadCountyBorders()),
    );
    combineLatest([this.createdMap, countyBorders$])
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(([map, countyBorders]) => basemapLayer(countyBorders, 'countyBorders', COUNTY_BORDER_STYLE).addTo(map));
  }

  private addConfiguredTiles(): void {
    const config$ = this.clientConfigClient.load().pipe(
      // Without the settings the shipped vector basemap is all the map needs.
      catchError(() => EMPTY),
    );
    combineLatest([this.createdMap, config$])
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(([map, config]: [L.Map, ClientConfig]) => {
        if (config.basemapTileUrl === null) return;
        L.tileLayer(config.basemapTileUrl, {
          maxZoom: MAX_ZOOM,
          attribution: config.basemapAttribution ?? undefined,
        }).addTo(map);
      });
  }

  /** Shows the structures given, coloured by `basis`, with the picked one highlighted, and brings a newly picked one into view. */
  private showStructures(map: L.Map, structures: readonly StructureFeature[], selectedId: number | null, basis: RatingBasis): void {
    const markers = structures.map((structure) => ({
      id: structure.properties.id,
      latLng: latLngOf(structure),
      look: markerLook(structure.properties, basis, structure.properties.id === selectedId),
    }));
    this.markersLayer.show(markers);
    if (markers.length > 0 && !this.markersShown) {
      this.markersShown = true;
      afterNextPaint(() => this.markersPainted.next());
    }
    if (selectedId !== this.focusedId) this.focus(map, selectedId, markers);
    this.markerCount.set(markers.length);
  }

  private focus(map: L.Map, selectedId: number | null, markers: readonly StructureMarker[]): void {
    this.focusedId = selectedId;
    const marker = markers.find(({ id }) => id === selectedId);
    if (marker) map.panTo(marker.latLng);
  }

  private fitView(map: L.Map, structures: readonly StructureFeature[]): void {
    const bounds = L.latLngBounds(structures.map(latLngOf));
    map.fitBounds(bounds, { padding: FIT_PADDING, maxZoom: MAX_FIT_ZOOM });
  }
}

/**
 * How to remove the map without breaking a zoom animation: Leaflet 1.9 starts one in the next frame
 * and ends it from a timer, neither cancelled by `remove()`, so a map left mid-zoom (the framing at
 * load, a wheel zoom) would throw. Removal waits for that frame, then for the zoom to end.
 */
function removerOnceSettled(map: L.Map): () => void {
  let zooming = false;
  map.on('zoomanim', () => (zooming = true)).on('zoomend', () => (zooming = false));
  return () =>
    requestAnimationFrame(() => {
      if (zooming) map.once('zoomend', () => map.remove());
      else map.remove();
    });
}

/** Runs `task` once the next frame has been painted: a new task queued from that frame's animation callback. */
function afterNextPaint(task: () => void): void {
  requestAnimationFrame(() => setTimeout(task));
}

/** GeoJSON positions are [longitude, latitude]; Leaflet wants latitude first. */
function latLngOf(structure: StructureFeature): L.LatLng {
  const [lon, lat] = structure.geometry.coordinates;
  return L.latLng(lat, lon);
}

function boundingBoxOf(bounds: L.LatLngBounds): BoundingBox {
  return { minLon: bounds.getWest(), minLat: bounds.getSouth(), maxLon: bounds.getEast(), maxLat: bounds.getNorth() };
}

function basemapLayer(shapes: GeoJSON.GeoJsonObject, pane: BasemapPane, style: L.PathOptions): L.GeoJSON {
  const renderer = L.canvas({ pane });
  return L.geoJSON(shapes, { interactive: false, attribution: BASEMAP_ATTRIBUTION, style: { ...style, renderer } });
}
