import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, afterNextRender, effect, inject, input, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type * as GeoJSON from 'geojson';
import * as L from 'leaflet';
import { EMPTY, catchError } from 'rxjs';

import { ClientConfigClient } from '../client-config/client-config.client';
import { BasemapClient } from '../network-map/basemap.client';

/** Close enough to pick out the county, far enough to see where in the state it is. */
const LOCATION_ZOOM = 8;
const MIN_ZOOM = 3;
const MAX_ZOOM = 12;

/** The same layering and look as the network map, so the two read as one basemap. */
const BASEMAP_PANES = { land: 150, countyBorders: 160, stateBorders: 170 } as const;
type BasemapPane = keyof typeof BASEMAP_PANES;
const BASEMAP_ATTRIBUTION = 'Boundaries: U.S. Census Bureau';
const LAND_STYLE: L.PathOptions = { stroke: false, fillColor: '#eef0ea', fillOpacity: 1 };
const STATE_BORDER_STYLE: L.PathOptions = { color: '#7d8a90', weight: 1.2, fill: false };
const COUNTY_BORDER_STYLE: L.PathOptions = { color: '#c3cbcd', weight: 0.6, fill: false };
const LOCATION_MARKER: L.CircleMarkerOptions = { radius: 9, color: '#00474a', weight: 3, fillColor: '#9ea7ab', fillOpacity: 0.95 };

/** A small map of where one structure stands, over the vector basemap shipped with the app. */
@Component({
  selector: 'sl-location-map',
  template: `<div #mapContainer class="map" data-testid="location-map" role="img" [attr.aria-label]="'Map of ' + label()"></div>`,
  styles: `
    :host { display: block; position: relative; min-height: 220px; }
    .map { position: absolute; inset: 0; border-radius: 12px; background: #d5e1e6; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LocationMapComponent {
  readonly longitude = input.required<number>();
  readonly latitude = input.required<number>();
  /** What the marker stands for, e.g. the structure number. */
  readonly label = input.required<string>();

  private readonly mapContainer = viewChild.required<ElementRef<HTMLElement>>('mapContainer');
  private readonly basemapClient = inject(BasemapClient);
  private readonly clientConfigClient = inject(ClientConfigClient);
  private readonly destroyRef = inject(DestroyRef);
  private readonly map = signal<L.Map | null>(null);
  private readonly marker = L.circleMarker([0, 0], LOCATION_MARKER);

  constructor() {
    afterNextRender(() => this.createMap());
    // A saved change may move the structure: follow it.
    effect(() => {
      const map = this.map();
      const position = L.latLng(this.latitude(), this.longitude());
      this.marker.setLatLng(position).unbindTooltip().bindTooltip(this.label());
      map?.setView(position, map.getZoom() || LOCATION_ZOOM);
    });
  }

  private createMap(): void {
    const container = this.mapContainer().nativeElement;
    const map = L.map(container, { minZoom: MIN_ZOOM, maxZoom: MAX_ZOOM, scrollWheelZoom: false });
    for (const [pane, zIndex] of Object.entries(BASEMAP_PANES)) map.createPane(pane).style.zIndex = String(zIndex);
    map.setView([this.latitude(), this.longitude()], LOCATION_ZOOM);
    this.marker.addTo(map);
    this.addVectorBasemap(map);
    this.addConfiguredTiles(map);

    // The page reflows between tablet and desktop widths: keep Leaflet's idea of the map size current.
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
      .subscribe((config) => {
        if (config.basemapTileUrl === null) return;
        L.tileLayer(config.basemapTileUrl, { maxZoom: MAX_ZOOM, attribution: config.basemapAttribution ?? undefined }).addTo(map);
      });
  }
}

function basemapLayer(shapes: GeoJSON.GeoJsonObject, pane: BasemapPane, style: L.PathOptions): L.GeoJSON {
  return L.geoJSON(shapes, { interactive: false, attribution: BASEMAP_ATTRIBUTION, style: { ...style, renderer: L.canvas({ pane }) } });
}
