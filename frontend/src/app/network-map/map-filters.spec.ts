import { convertToParamMap } from '@angular/router';

import {
  MapFilters,
  NO_FILTERS,
  clearedFilters,
  filtersFromQueryParams,
  filtersQueryParams,
  hasActiveFilters,
  sameStructureQuery,
  structureQueryOf,
} from './map-filters';

const EVERY_FILTER: MapFilters = {
  districts: ['North Plains', 'East Valley'],
  ratingBands: ['below-1', 'not-rated'],
  conditionAtMost: 4,
  statuses: ['posted', 'closed'],
  reratingDue: true,
  search: 'plum creek',
  ratingBasis: 'design-inventory',
};

describe('structureQueryOf', () => {
  it('sends nothing when nothing filters', () => {
    expect(structureQueryOf(NO_FILTERS)).toEqual({});
  });

  it('sends every filter as the query parameter the server reads, lists joined by commas', () => {
    expect(structureQueryOf(EVERY_FILTER)).toEqual({
      district: 'North Plains,East Valley',
      status: 'posted,closed',
      ratingBand: 'below-1,not-rated',
      ratingBasis: 'design-inventory',
      conditionAtMost: '4',
      reratingDue: 'true',
      search: 'plum creek',
    });
  });

  it('sends condition 0 (a failed rating is a real filter, not "any")', () => {
    expect(structureQueryOf({ ...NO_FILTERS, conditionAtMost: 0 })).toEqual({ conditionAtMost: '0' });
  });

  it('sends the rating basis only with rating bands, and trims the search', () => {
    expect(structureQueryOf({ ...NO_FILTERS, ratingBasis: 'design-inventory', search: '  NP-00 ' })).toEqual({ search: 'NP-00' });
    expect(structureQueryOf({ ...NO_FILTERS, ratingBands: ['1.5-up'] })).toEqual({ ratingBand: '1.5-up', ratingBasis: 'legal' });
  });
});

describe('sameStructureQuery', () => {
  it('treats a change of colouring alone as the same question to the server', () => {
    expect(sameStructureQuery(NO_FILTERS, { ...NO_FILTERS, ratingBasis: 'design-inventory' })).toBe(true);
    expect(sameStructureQuery({ ...NO_FILTERS, ratingBands: ['below-1'] }, { ...NO_FILTERS, ratingBands: ['below-1'], ratingBasis: 'design-inventory' })).toBe(false);
    expect(sameStructureQuery(NO_FILTERS, { ...NO_FILTERS, statuses: ['open'] })).toBe(false);
  });
});

describe('filters in the URL', () => {
  function roundTrip(filters: MapFilters): MapFilters {
    const params = Object.fromEntries(Object.entries(filtersQueryParams(filters)).filter(([, value]) => value !== null));
    return filtersFromQueryParams(convertToParamMap(params));
  }

  it('comes back from the URL as it went in', () => {
    expect(roundTrip(EVERY_FILTER)).toEqual(EVERY_FILTER);
    expect(roundTrip(NO_FILTERS)).toEqual(NO_FILTERS);
    expect(roundTrip({ ...NO_FILTERS, ratingBasis: 'design-inventory' })).toEqual({ ...NO_FILTERS, ratingBasis: 'design-inventory' });
  });

  it('names every filter parameter, null when unset, so merging into the URL removes the old ones', () => {
    expect(filtersQueryParams(NO_FILTERS)).toEqual({
      district: null,
      status: null,
      ratingBand: null,
      ratingBasis: null,
      conditionAtMost: null,
      reratingDue: null,
      search: null,
    });
  });

  it('reads an empty URL as no filters', () => {
    expect(filtersFromQueryParams(convertToParamMap({}))).toEqual(NO_FILTERS);
  });

  it('drops what the server would refuse, keeping the rest of the link', () => {
    const filters = filtersFromQueryParams(
      convertToParamMap({ status: 'open,demolished', conditionAtMost: '12', ratingBasis: 'operating', ratingBand: 'below-1', district: 'East Valley' }),
    );
    expect(filters).toEqual({ ...NO_FILTERS, ratingBands: ['below-1'], districts: ['East Valley'] });
  });
});

describe('hasActiveFilters and clearedFilters', () => {
  it('counts every filter but not the colouring', () => {
    expect(hasActiveFilters(NO_FILTERS)).toBe(false);
    expect(hasActiveFilters({ ...NO_FILTERS, ratingBasis: 'design-inventory' })).toBe(false);
    expect(hasActiveFilters({ ...NO_FILTERS, conditionAtMost: 0 })).toBe(true);
    expect(hasActiveFilters({ ...NO_FILTERS, search: 'x' })).toBe(true);
    expect(hasActiveFilters({ ...NO_FILTERS, districts: ['East Valley'] })).toBe(true);
  });

  it('clears every filter and keeps the colouring', () => {
    expect(clearedFilters(EVERY_FILTER)).toEqual({ ...NO_FILTERS, ratingBasis: 'design-inventory' });
  });
});
