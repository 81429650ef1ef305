import type { StructureFeature, StructureFeatureCollection, StructureMapQuery } from '../../../shared/src';
import type { Database } from '../db/database';
import { findStructuresForMap, type StructureMapRow } from './structures.repository';

function toFeature(row: StructureMapRow): StructureFeature {
  return {
    type: 'Feature',
    id: row.id,
    geometry: { type: 'Point', coordinates: [row.longitude, row.latitude] },
    properties: {
      id: row.id,
      structureNumber: row.structure_number,
      name: row.name,
      routeCarried: row.route_carried,
      featureCrossed: row.feature_crossed,
      district: row.district,
      yearBuilt: row.year_built,
      adt: row.adt,
      adtt: row.adtt,
    },
  };
}

/** The structures for the network map as GeoJSON (RFC 7946), saying whether the limit cut the list. */
export async function listStructuresForMap({ db }: { db: Database }, query: StructureMapQuery): Promise<StructureFeatureCollection> {
  const rows = await findStructuresForMap(db, { bbox: query.bbox, limit: query.limit + 1 });
  const truncated = rows.length > query.limit;
  return { type: 'FeatureCollection', truncated, features: rows.slice(0, query.limit).map(toFeature) };
}
