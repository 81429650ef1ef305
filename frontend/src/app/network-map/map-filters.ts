import { ParamMap, Params } from '@angular/router';
import { RatingBandKey, RatingBasis, StructureStatus, structureListQuery } from '@spanledger/shared';

/** Which structures the map and its list show, and which rating factor colours them; kept in the URL. */
export interface MapFilters {
  readonly districts: readonly string[];
  readonly ratingBands: readonly RatingBandKey[];
  /** Only structures whose lowest condition rating is at most this (0–9); null for any. */
  readonly conditionAtMost: number | null;
  readonly statuses: readonly StructureStatus[];
  /** Only structures with a span due for re-rating. */
  readonly reratingDue: boolean;
  /** Part of the structure number or name; '' for none. */
  readonly search: string;
  /** The rating factor of record the markers are coloured by and the rating bands refer to. */
  readonly ratingBasis: RatingBasis;
}

export const NO_FILTERS: MapFilters = {
  districts: [],
  ratingBands: [],
  conditionAtMost: null,
  statuses: [],
  reratingDue: false,
  search: '',
  ratingBasis: 'legal',
};

/** The query parameters filters use, in the URL and towards the server alike. */
const FILTER_PARAMETERS = ['district', 'status', 'ratingBand', 'ratingBasis', 'conditionAtMost', 'reratingDue', 'search'] as const;
type FilterParameter = (typeof FILTER_PARAMETERS)[number];

const query = structureListQuery.shape;

/** True when anything narrows the structures shown; the colouring basis alone does not. */
export function hasActiveFilters(filters: MapFilters): boolean {
  return (
    filters.districts.length > 0 ||
    filters.ratingBands.length > 0 ||
    filters.conditionAtMost !== null ||
    filters.statuses.length > 0 ||
    filters.reratingDue ||
    filters.search !== ''
  );
}

/** What "Clear filters" leaves: every structure, still coloured as before. */
export function clearedFilters(filters: MapFilters): MapFilters {
  return { ...NO_FILTERS, ratingBasis: filters.ratingBasis };
}

/**
 * Reads filters from the page URL with the server's own query rules; a value the server would
 * refuse (a hand-edited or outdated link) is dropped rather than breaking the page.
 */
export function filtersFromQueryParams(params: ParamMap): MapFilters {
  const read = <T>(name: FilterParameter, rule: QueryRule<T>, fallback: T): T => parsedOr(rule, params.get(name), fallback);
  return {
    districts: read('district', query.district, NO_FILTERS.districts),
    ratingBands: read('ratingBand', query.ratingBand, NO_FILTERS.ratingBands),
    conditionAtMost: read('conditionAtMost', query.conditionAtMost, NO_FILTERS.conditionAtMost),
    statuses: read('status', query.status, NO_FILTERS.statuses),
    reratingDue: read('reratingDue', query.reratingDue, NO_FILTERS.reratingDue),
    search: read('search', query.search, NO_FILTERS.search),
    ratingBasis: read('ratingBasis', query.ratingBasis, NO_FILTERS.ratingBasis),
  };
}

/**
 * The query parameters of `GET /api/structures` for these filters, in a fixed order. The basis
 * goes only with rating bands: without them it changes the colours, not which structures match.
 */
export function structureQueryOf(filters: MapFilters): Partial<Record<FilterParameter, string>> {
  const parameters: Partial<Record<FilterParameter, string>> = {};
  if (filters.districts.length > 0) parameters.district = filters.districts.join(',');
  if (filters.statuses.length > 0) parameters.status = filters.statuses.join(',');
  if (filters.ratingBands.length > 0) {
    parameters.ratingBand = filters.ratingBands.join(',');
    parameters.ratingBasis = filters.ratingBasis;
  }
  if (filters.conditionAtMost !== null) parameters.conditionAtMost = String(filters.conditionAtMost);
  if (filters.reratingDue) parameters.reratingDue = 'true';
  const search = filters.search.trim();
  if (search !== '') parameters.search = search;
  return parameters;
}

/** True when both filters ask the server for the same structures. */
export function sameStructureQuery(a: MapFilters, b: MapFilters): boolean {
  return queryText(structureQueryOf(a)) === queryText(structureQueryOf(b));
}

/** True when both filters show the same map, colours included. */
export function sameFilters(a: MapFilters, b: MapFilters): boolean {
  return sameStructureQuery(a, b) && a.ratingBasis === b.ratingBasis;
}

/**
 * The page URL's query parameters for these filters, to merge into the current ones: every filter
 * parameter is named, null where it is unset, so that the router removes it.
 */
export function filtersQueryParams(filters: MapFilters): Params {
  const unset = Object.fromEntries(FILTER_PARAMETERS.map((name) => [name, null]));
  const basis = filters.ratingBasis === NO_FILTERS.ratingBasis ? {} : { ratingBasis: filters.ratingBasis };
  return { ...unset, ...structureQueryOf(filters), ...basis };
}

/** A query parameter's schema in the shared contract (zod), as far as reading a value needs it. */
interface QueryRule<T> {
  safeParse(value: unknown): { readonly success: boolean; readonly data?: T };
}

function parsedOr<T>(rule: QueryRule<T>, text: string | null, fallback: T): T {
  if (text === null) return fallback;
  const parsed = rule.safeParse(text);
  return parsed.success ? (parsed.data ?? fallback) : fallback;
}

function queryText(parameters: Partial<Record<FilterParameter, string>>): string {
  return new URLSearchParams(parameters).toString();
}
