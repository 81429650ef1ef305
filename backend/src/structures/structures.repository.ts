import type { BoundingBox } from '../../../shared/src';
import { postgis, type Database } from '../db/database';

/** One row of `structures` as the map needs it, with the location split into degrees. */
export interface StructureMapRow {
  id: number;
  structure_number: string;
  name: string;
  route_carried: string;
  feature_crossed: string;
  district: string;
  year_built: number | null;
  adt: number | null;
  adtt: number | null;
  longitude: number;
  latitude: number;
}

export interface StructureMapFilter {
  readonly bbox?: BoundingBox;
  /** Rows to read (all when unset); the map asks for one more than it returns to learn whether the list was cut. */
  readonly limit?: number;
}

/** Structures (inside a bounding box when given, through the GiST index and `&&`), in structure-number order. */
export async function findStructuresForMap(db: Database, { bbox, limit }: StructureMapFilter): Promise<StructureMapRow[]> {
  const st = postgis(db);
  const query = db('structures')
    .select(
      'id',
      'structure_number',
      'name',
      'route_carried',
      'feature_crossed',
      'district',
      'year_built',
      'adt',
      'adtt',
      st.x('location').as('longitude'),
      st.y('location').as('latitude'),
    )
    .orderBy('structure_number');
  if (limit !== undefined) query.limit(limit);
  if (bbox) {
    query.where(st.boundingBoxIntersects('location', st.makeEnvelope(bbox.minLon, bbox.minLat, bbox.maxLon, bbox.maxLat, 4326)));
  }
  return query;
}
