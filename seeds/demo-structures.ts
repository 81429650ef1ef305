import type { Knex } from 'knex';

/**
 * The demo scenario: the Bluestem Valley Regional Roads Authority, a fictional owner of
 * prestressed girder bridges in four districts. Every name, number and place here is invented;
 * the points lie on land inside the shipped basemap's state outlines.
 */

interface DistrictArea {
  readonly name: string;
  readonly code: string;
  /** West, south, east, north in degrees. */
  readonly area: readonly [number, number, number, number];
  readonly routes: readonly string[];
  /** Invented towns, for the bridge names an owner's staff would use. */
  readonly towns: readonly string[];
}

const DISTRICTS: readonly DistrictArea[] = [
  { name: 'North District', code: 'N', area: [-99.5, 38.9, -97.5, 39.5], routes: ['Route 9', 'Route 24', 'County Road 110', 'County Road 131'], towns: ['Harlow', 'Wendt', 'Osgood'] },
  { name: 'Central District', code: 'C', area: [-99.5, 38.2, -97.8, 38.85], routes: ['Route 4', 'Route 56', 'County Road 205', 'County Road 240'], towns: ['Marden', 'Tillby', 'Carrow'] },
  { name: 'South District', code: 'S', area: [-99.5, 37.55, -97.5, 38.15], routes: ['Route 61', 'Route 96', 'County Road 318', 'County Road 342'], towns: ['Fenwick', 'Aldis', 'Brisco'] },
  { name: 'East District', code: 'E', area: [-97.4, 37.6, -96.6, 39.4], routes: ['Route 15', 'Route 77', 'County Road 412', 'County Road 455'], towns: ['Quarry Hill', 'Lanning', 'Ostrow'] },
];

const CROSSINGS = [
  'Bluestem Creek', 'Sandy Fork', 'Little Otter Creek', 'Cottonwood Draw', 'Mill Run', 'Owl Creek',
  'Plains Short Line Railway', 'Route 50 Connector', 'Dry Willow Creek', 'Heron Slough', 'Kettle Branch', 'Flint Hollow',
];

export const STRUCTURES_PER_DISTRICT = CROSSINGS.length;

/** A small fixed-seed generator (mulberry32) so the demo is the same on every machine. */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface DemoStructure {
  structure_number: string;
  name: string;
  route_carried: string;
  feature_crossed: string;
  district: string;
  longitude: number;
  latitude: number;
  year_built: number;
  adt: number;
  adtt: number;
}

export function demoStructures(): DemoStructure[] {
  const random = seededRandom(20261201);
  const between = (low: number, high: number) => low + (high - low) * random();
  return DISTRICTS.flatMap((district) =>
    CROSSINGS.map((crossing, index) => {
      const route = district.routes[index % district.routes.length] as string;
      const [west, south, east, north] = district.area;
      const adt = Math.round(between(400, 18000) / 10) * 10;
      return {
        structure_number: `BV-${district.code}-${String(101 + index * 7).padStart(4, '0')}`,
        name: `${crossing} Bridge near ${district.towns[index % district.towns.length]}`,
        route_carried: route,
        feature_crossed: crossing,
        district: district.name,
        longitude: Number(between(west, east).toFixed(5)),
        latitude: Number(between(south, north).toFixed(5)),
        year_built: Math.round(between(1958, 2016)),
        adt,
        adtt: Math.round(adt * between(0.04, 0.22)),
      };
    }),
  );
}

/** Knex seed entry point: inserts the demo structures, leaving any that already exist untouched. */
export async function seed(knex: Knex): Promise<void> {
  const rows = demoStructures().map(({ longitude, latitude, ...row }) => ({
    ...row,
    location: knex.raw('ST_SetSRID(ST_MakePoint(?, ?), 4326)', [longitude, latitude]),
  }));
  await knex('structures').insert(rows).onConflict('structure_number').ignore();
}
