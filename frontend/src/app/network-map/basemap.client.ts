import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { FeatureCollection, MultiLineString } from 'geojson';
import { feature, mesh } from 'topojson-client';
import type { GeometryCollection, GeometryObject, Topology } from 'topojson-specification';
import { Observable, map } from 'rxjs';

/** Land and state lines, from the U.S. Census Bureau boundaries packaged by us-atlas. */
export interface StateShapes {
  readonly land: FeatureCollection;
  readonly stateBorders: MultiLineString;
}

type StatesTopology = Topology<{ states: GeometryCollection; nation: GeometryCollection }>;
type CountiesTopology = Topology<{ counties: GeometryCollection }>;

/** Loads the vector basemap shipped with the app, so the map works with no internet. */
@Injectable({ providedIn: 'root' })
export class BasemapClient {
  private readonly http = inject(HttpClient);

  loadStates(): Observable<StateShapes> {
    return this.http.get<StatesTopology>('basemap/states-10m.json').pipe(
      map((topology) => ({
        land: feature(topology, topology.objects.nation),
        stateBorders: mesh(topology, topology.objects.states, (a, b) => a !== b),
      })),
    );
  }

  /** County lines inside each state; the state lines are drawn separately, heavier. */
  loadCountyBorders(): Observable<MultiLineString> {
    return this.http
      .get<CountiesTopology>('basemap/counties-10m.json')
      .pipe(map((topology) => mesh(topology, topology.objects.counties, sameStateNeighbours)));
  }
}

/** County ids are five-digit FIPS codes whose first two digits name the state. */
function sameStateNeighbours(a: GeometryObject, b: GeometryObject): boolean {
  return a !== b && String(a.id).slice(0, 2) === String(b.id).slice(0, 2);
}
