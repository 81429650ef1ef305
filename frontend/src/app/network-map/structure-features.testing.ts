import { StructureFeature, StructureFeatureCollection, StructureSummary } from '@spanledger/shared';

/** A structure in the invented demo district, with whatever the test cares about overridden. */
export function structureFeature(
  summary: Partial<StructureSummary> & Pick<StructureSummary, 'id' | 'structureNumber'>,
  lonLat: [number, number] = [-98.2, 38.4],
): StructureFeature {
  return {
    type: 'Feature',
    geometry: { type: 'Point', coordinates: lonLat },
    properties: {
      name: `Bridge ${summary.structureNumber}`,
      routeCarried: 'CR 12',
      featureCrossed: 'Plum Creek',
      district: 'North Plains',
      yearBuilt: 1978,
      adt: 1450,
      adtt: 120,
      status: 'open',
      lowestCondition: 6,
      legalRatingFactor: null,
      designInventoryRatingFactor: null,
      reratingDue: false,
      ...summary,
    },
  };
}

/** The server's answer: `total` counts every match, so it is larger than the page when truncated. */
export function structureAnswer(features: StructureFeature[], truncated = false, total = features.length): StructureFeatureCollection {
  return { type: 'FeatureCollection', features, truncated, total };
}
