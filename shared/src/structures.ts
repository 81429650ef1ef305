import { z } from 'zod';
import type { Feature, FeatureCollection, Point } from 'geojson';

/** Most structures one request may return: the map of a large owner's whole network in one answer. */
export const MAX_STRUCTURES_PER_REQUEST = 20_000;
export const DEFAULT_STRUCTURES_PER_REQUEST = 1000;

/** A geographic bounding box in WGS 84 degrees, west/south/east/north (GeoJSON RFC 7946 §5 order). */
export interface BoundingBox {
  readonly minLon: number;
  readonly minLat: number;
  readonly maxLon: number;
  readonly maxLat: number;
}

const BBOX_FORMAT = 'expected four numbers "minLon,minLat,maxLon,maxLat"';

/**
 * Parses the `bbox` query parameter. Longitudes lie in [-180, 180], latitudes in [-90, 90], and
 * each minimum must be below its maximum: a box across the antimeridian is two requests.
 */
export const bboxParameter = z.string().transform((text, ctx): BoundingBox => {
  const parts = text.split(',');
  const numbers = parts.map((part) => (part.trim() === '' ? Number.NaN : Number(part)));
  if (parts.length !== 4 || numbers.some((n) => !Number.isFinite(n))) {
    ctx.addIssue({ code: 'custom', message: BBOX_FORMAT });
    return z.NEVER;
  }
  const [minLon, minLat, maxLon, maxLat] = numbers as [number, number, number, number];
  const problems: string[] = [];
  if ([minLon, maxLon].some((lon) => lon < -180 || lon > 180)) problems.push('longitudes must lie between -180 and 180');
  if ([minLat, maxLat].some((lat) => lat < -90 || lat > 90)) problems.push('latitudes must lie between -90 and 90');
  if (minLon >= maxLon) problems.push('minLon must be less than maxLon');
  if (minLat >= maxLat) problems.push('minLat must be less than maxLat');
  if (problems.length > 0) {
    ctx.addIssue({ code: 'custom', message: problems.join('; ') });
    return z.NEVER;
  }
  return { minLon, minLat, maxLon, maxLat };
});


/** What the map and its side list know of one structure. */
export interface StructureSummary {
  readonly id: number;
  /** The owner's own structure number, unique across the network. */
  readonly structureNumber: string;
  readonly name: string;
  readonly routeCarried: string;
  readonly featureCrossed: string;
  readonly district: string;
  readonly yearBuilt: number | null;
  /** Average daily traffic, vehicles per day. */
  readonly adt: number | null;
  /** Average daily truck traffic, trucks per day. */
  readonly adtt: number | null;
  readonly status: 'open' | 'posted' | 'closed';
  /** The lowest of the deck, superstructure and substructure condition ratings (0–9), or null. */
  readonly lowestCondition: number | null;
  /** Lowest legal-load rating factor of the rating of record; null when not rated. */
  readonly legalRatingFactor: number | null;
  /** Design-load inventory rating factor of the rating of record; null when not rated. */
  readonly designInventoryRatingFactor: number | null;
  /** A span's damage or inventory changed after its rating of record was run (or it has none yet). */
  readonly reratingDue: boolean;
}

export type StructureFeature = Feature<Point, StructureSummary>;

/**
 * `GET /api/structures` answers a GeoJSON FeatureCollection (RFC 7946 allows foreign members):
 * `total` counts every structure that matches, `truncated` says the page holds fewer.
 */
export interface StructureFeatureCollection extends FeatureCollection<Point, StructureSummary> {
  readonly truncated: boolean;
  readonly total: number;
}
