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
import { EMPTY, catchError } from 'rxjs';

import { ClientConfig, ClientConfigClient } from '../client-config/client-config.client';
import { BasemapClient } from './basemap.client';
import { MarkerLook, markerLook } from './marker-look';
import { StructureMarker } from './structure-marker';

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
  private readonly markerRenderer = L.canvas({ padding: 0.5, tolerance: 4 });
  private readonly markerLayer = L.layerGroup();
  private readonly markersById = new Map<number, StructureMarker>();
  /** The structure last brought into view, so a marker click does not pan the map under the pointer. */
  private focusedId: number | null = null;

  constructor() {
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
    this.markerLayer.addTo(map);
    map.on('moveend', () => this.viewChanged.emit(boundingBoxOf(map.getBounds())));

    this.addVectorBasemap(map);
    this.addConfiguredTiles(map);

    // The panel beside the map opens and closes: keep Leaflet's idea of the map size current.
    const resizeObserver = new ResizeObserver(() => map.invalidateSize());
    resizeObserver.observe(container);
    this.destroyRef.onDestroy(() => {
      resizeObserver.disconnect();
      map.remove();
    });
    this.map.set(map);
  }

  private addVectorBasemap(map: L.Map): void {
    this.basemapClient
      .loadStates()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(({ land, stateBorders }) => {
        basemapLayer(land, 'land', LAND_STYLE).addTo(map);
        basemapLayer(stateBorders, 'stateBorders', STATE_BORDER_STYLE).addTo(map);
      });
    this.basemapClient
      .loadCountyBorders()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((countyBorders) => basemapLayer(countyBorders, 'countyBorders', COUNTY_BORDER_STYLE).addTo(map));
  }

  private addConfiguredTiles(map: L.Map): void {
    this.clientConfigClient
      .load()
      .pipe(
        // Without the settings the shipped vector basemap is all the map needs.
        catchError(() => EMPTY),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((config: ClientConfig) => {
        if (config.basemapTileUrl === null) return;
        L.tileLayer(config.basemapTileUrl, {
          maxZoom: MAX_ZOOM,
          attribution: config.basemapAttribution ?? undefined,
        }).addTo(map);
      });
  }

  /** Brings the markers in step with the structures given, keeping (and restyling only as needed) those still in view. */
  private showStructures(map: L.Map, structures: readonly StructureFeature[], selectedId: number | null, basis: RatingBasis): void {
    const wanted = new Map(structures.map((structure) => [structure.properties.id, structure]));
    for (const [id, marker] of this.markersById) {
      if (!wanted.has(id)) {
        this.markerLayer.removeLayer(marker);
        this.markersById.delete(id);
      }
    }
    for (const [id, structure] of wanted) {
      const latLng = latLngOf(structure);
      const look = markerLook(structure.properties, basis, id === selectedId);
      const existing = this.markersById.get(id);
      if (!existing) {
        this.addMarker(id, latLng, look);
        continue;
      }
      if (!existing.getLatLng().equals(latLng)) existing.setLatLng(latLng);
      // Low ratings and the picked structure are drawn last, so that neighbours do not hide them; new markers already are.
      if (existing.show(look) && (look.belowOne || look.selected)) existing.bringToFront();
    }
    if (selectedId !== this.focusedId) this.focus(map, selectedId);
    this.markerCount.set(this.markerLayer.getLayers().length);
  }

  private addMarker(id: number, latLng: L.LatLng, look: MarkerLook): void {
    const marker = new StructureMarker(latLng, { renderer: this.markerRenderer }).on('click', () => {
      this.focusedId = id;
      this.structureClicked.emit(id);
    });
    // Styled before it joins the map, so it is drawn once.
    marker.show(look);
    this.markersById.set(id, marker);
    this.markerLayer.addLayer(marker);
  }

  private focus(map: L.Map, selectedId: number | null): void {
    this.focusedId = selectedId;
    const marker = selectedId === null ? undefined : this.markersById.get(selectedId);
    if (marker) map.panTo(marker.getLatLng());
  }

  private fitView(map: L.Map, structures: readonly StructureFeature[]): void {
    const bounds = L.latLngBounds(structures.map(latLngOf));
    map.fitBounds(bounds, { padding: FIT_PADDING, maxZoom: MAX_FIT_ZOOM });
  }
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
