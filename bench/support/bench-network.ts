import type { BoundingBox } from '../../shared/src';
import type { Database } from '../../backend/src/db/database';
import { seededRandom } from '../../seeds/demo-structures';

/**
 * The benchmarks' network: 10 000 invented structures spread evenly over the Kansas area. Every
 * number, name and route is made up; the fixed seed gives the same network on every machine.
 */
export const BENCH_STRUCTURE_COUNT = 10_000;
export const BENCH_NETWORK_AREA: BoundingBox = { minLon: -102, minLat: 37, maxLon: -94.6, maxLat: 40 };

const DISTRICT_COUNT = 6;
const CROSSINGS = ['Tallgrass Draw', 'Quail Run', 'Sunflower Fork', 'Limestone Branch', 'Windmill Creek', 'Prairie Short Line Railway', 'Antelope Slough', 'Dry Sage Creek'];
const STATUSES = ['open', 'open', 'open', 'open', 'open', 'open', 'open', 'open', 'posted', 'closed'] as const;

/** One structure as columns of `structures`, with the location still in degrees. */
export interface BenchStructure {
  readonly structureNumber: string;
  readonly name: string;
  readonly routeCarried: string;
  readonly featureCrossed: string;
  readonly district: string;
  readonly longitude: number;
  readonly latitude: number;
  readonly yearBuilt: number;
  readonly adt: number;
  readonly adtt: number;
  readonly status: (typeof STATUSES)[number];
  readonly deckCondition: number;
  readonly superstructureCondition: number;
  readonly substructureCondition: number;
}

/** Districts are bands of longitude, west to east, as an owner's regions often are. */
function districtOf(longitude: number): string {
  const band = Math.floor(((longitude - BENCH_NETWORK_AREA.minLon) / (BENCH_NETWORK_AREA.maxLon - BENCH_NETWORK_AREA.minLon)) * DISTRICT_COUNT);
  return `District ${Math.min(band, DISTRICT_COUNT - 1) + 1}`;
}

/** The benchmark network's structures, the same on every call. */
export function benchStructures(count = BENCH_STRUCTURE_COUNT): BenchStructure[] {
  const random = seededRandom(20270115);
  const between = (low: number, high: number) => low + (high - low) * random();
  const whole = (low: number, high: number) => Math.floor(between(low, high + 1));
  const pick = <T>(items: readonly T[]) => items[Math.floor(random() * items.length)] as T;
  return Array.from({ length: count }, (_, index) => {
    const longitude = Number(between(BENCH_NETWORK_AREA.minLon, BENCH_NETWORK_AREA.maxLon).toFixed(5));
    const latitude = Number(between(BENCH_NETWORK_AREA.minLat, BENCH_NETWORK_AREA.maxLat).toFixed(5));
    const crossing = pick(CROSSINGS);
    const adt = whole(40, 2_000) * 10;
    return {
      structureNumber: `BN-${String(index + 1).padStart(5, '0')}`,
      name: `${crossing} Bridge ${index + 1}`,
      routeCarried: random() < 0.3 ? `Route ${whole(1, 199)}` : `County Road ${whole(100, 999)}`,
      featureCrossed: crossing,
      district: districtOf(longitude),
      longitude,
      latitude,
      yearBuilt: whole(1950, 2020),
      adt,
      adtt: Math.round(adt * between(0.03, 0.25)),
      status: pick(STATUSES),
      deckCondition: whole(3, 9),
      superstructureCondition: whole(3, 9),
      substructureCondition: whole(3, 9),
    };
  });
}

/** A column of `structures`, and its values for every structure as one PostgreSQL array. */
interface Column {
  readonly name: string;
  readonly arrayType: string;
  readonly values: (structures: readonly BenchStructure[]) => string[] | number[];
}

const textColumn = (name: string, pick: (s: BenchStructure) => string): Column => ({ name, arrayType: 'text[]', values: (all) => all.map(pick) });
const wholeNumberColumn = (name: string, sqlType: 'smallint' | 'integer', pick: (s: BenchStructure) => number): Column => ({
  name,
  arrayType: `${sqlType}[]`,
  values: (all) => all.map(pick),
});

const COLUMNS: readonly Column[] = [
  textColumn('structure_number', (s) => s.structureNumber),
  textColumn('name', (s) => s.name),
  textColumn('route_carried', (s) => s.routeCarried),
  textColumn('feature_crossed', (s) => s.featureCrossed),
  textColumn('district', (s) => s.district),
  wholeNumberColumn('year_built', 'smallint', (s) => s.yearBuilt),
  wholeNumberColumn('adt', 'integer', (s) => s.adt),
  wholeNumberColumn('adtt', 'integer', (s) => s.adtt),
  textColumn('status', (s) => s.status),
  wholeNumberColumn('deck_condition', 'smallint', (s) => s.deckCondition),
  wholeNumberColumn('superstructure_condition', 'smallint', (s) => s.superstructureCondition),
  wholeNumberColumn('substructure_condition', 'smallint', (s) => s.substructureCondition),
];

/**
 * Inserts the structures in one statement: one array per column, turned back into rows by
 * `unnest`, which is far faster than 10 000 row inserts. Then refreshes the planner's statistics
 * so the bounding-box query uses the GiST index as it would on a long-lived database.
 */
export async function seedBenchStructures(db: Database, structures: readonly BenchStructure[]): Promise<void> {
  const names = COLUMNS.map((column) => column.name);
  const identifiers = names.map(() => '??').join(', ');
  const arrays = COLUMNS.map((column) => `?::${column.arrayType}`).join(', ');
  await db.raw(
    `insert into structures (${identifiers}, location)
     select ${identifiers}, ST_SetSRID(ST_MakePoint(longitude, latitude), 4326)
       from unnest(${arrays}, ?::double precision[], ?::double precision[]) as given(${identifiers}, longitude, latitude)`,
    [
      ...names,
      ...names,
      ...COLUMNS.map((column) => column.values(structures)),
      structures.map((s) => s.longitude),
      structures.map((s) => s.latitude),
      ...names,
    ],
  );
  await db.raw('analyze structures');
}
