import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { BoundingBox, MAX_STRUCTURES_PER_REQUEST, StructureFeatureCollection } from '@spanledger/shared';
import { Observable, of } from 'rxjs';

import { MapFilters, structureQueryOf } from './map-filters';

const COORDINATE_DECIMALS = 6;

const EMPTY_ANSWER: StructureFeatureCollection = { type: 'FeatureCollection', features: [], truncated: false, total: 0 };

/** Reads structures for the map from `GET /api/structures`, and the districts it can be filtered by. */
@Injectable({ providedIn: 'root' })
export class StructuresClient {
  private readonly http = inject(HttpClient);

  /** Every structure of the network, up to the largest page the server allows. */
  fetchNetwork(): Observable<StructureFeatureCollection> {
    return this.fetch(new HttpParams());
  }

  /**
   * The structures that match the filters, inside a map view when one is given (the server filters);
   * a view wholly outside the globe's range answers empty without asking.
   */
  fetchMatching(filters: MapFilters, view: BoundingBox | null): Observable<StructureFeatureCollection> {
    let params = new HttpParams();
    if (view !== null) {
      const bbox = bboxParameter(view);
      if (bbox === null) return of(EMPTY_ANSWER);
      params = params.set('bbox', bbox);
    }
    for (const [name, value] of Object.entries(structureQueryOf(filters))) params = params.set(name, value);
    return this.fetch(params);
  }

  /** The network's district names, for the district filter. */
  fetchDistricts(): Observable<string[]> {
    return this.http.get<string[]>('api/districts');
  }

  private fetch(params: HttpParams): Observable<StructureFeatureCollection> {
    return this.http.get<StructureFeatureCollection>('api/structures', {
      params: params.set('limit', MAX_STRUCTURES_PER_REQUEST),
    });
  }
}

/**
 * The `bbox` query value for a map view: clamped to the globe (a zoomed-out view reaches past ±180°),
 * rounded outward to 6 decimals (about 0.1 m) so it still covers the view; null when nothing is left.
 */
export function bboxParameter(view: BoundingBox): string | null {
  const minLon = roundDown(clamp(view.minLon, -180, 180));
  const minLat = roundDown(clamp(view.minLat, -90, 90));
  const maxLon = roundUp(clamp(view.maxLon, -180, 180));
  const maxLat = roundUp(clamp(view.maxLat, -90, 90));
  if (minLon >= maxLon || minLat >= maxLat) return null;
  return [minLon, minLat, maxLon, maxLat].join(',');
}

function clamp(value: number, min: number, max: number): number {
  return Math.min(max, Math.max(min, value));
}

const SCALE = 10 ** COORDINATE_DECIMALS;

function roundDown(degrees: number): number {
  return Math.floor(degrees * SCALE) / SCALE;
}

function roundUp(degrees: number): number {
  return Math.ceil(degrees * SCALE) / SCALE;
}
