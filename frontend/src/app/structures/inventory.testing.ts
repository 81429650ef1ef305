import type { GirderSummary, HistoryEvent, SpanDetail, StructureDetail } from '@spanledger/shared';

/** A structure of the invented demo authority, with whatever the test cares about overridden. */
export function structureDetail(overrides: Partial<StructureDetail> = {}): StructureDetail {
  return {
    id: 41,
    structureNumber: 'NP-0041',
    name: 'Willow Bend Overpass',
    routeCarried: 'SR 18',
    featureCrossed: 'Cottonwood Creek',
    district: 'North Plains',
    longitude: -98.214,
    latitude: 38.472,
    yearBuilt: 1984,
    yearLastMajorWork: 2009,
    adt: 6200,
    adtt: 740,
    skewDeg: 15,
    conditions: { deck: 6, superstructure: 7, substructure: 5, ratedOn: '2024-05-14' },
    status: 'open',
    notes: 'Joint seals replaced at both abutments.',
    ratingOfRecord: null,
    reratingDue: false,
    spans: [
      { id: 301, spanIndex: 1, lengthM: 30.48, girderCount: 5, girderSpacingMm: 2438.4 },
      { id: 302, spanIndex: 2, lengthM: 24, girderCount: 5, girderSpacingMm: 2438.4 },
    ],
    version: 3,
    created: { at: '2023-02-01T09:00:00.000Z', by: null },
    updated: { at: '2024-06-02T14:30:00.000Z', by: 'Priya Halloran' },
    ...overrides,
  };
}

/** A span of that structure; span 1 is 100 ft (30.48 m) long. */
export function spanDetail(overrides: Partial<SpanDetail> = {}): SpanDetail {
  return {
    id: 301,
    structureId: 41,
    spanIndex: 1,
    lengthM: 30.48,
    girderCount: 5,
    girderSpacingMm: 2438.4,
    overhangMm: 900,
    roadwayWidthMm: 10800,
    barrierFaceToGirderMm: 450,
    deckThicknessMm: 203.2,
    haunchMm: 25,
    wearingSurface: { thicknessMm: 50, measured: true, kind: 'overlay' },
    barriers: [{ loadKnM: 7.3 }, { loadKnM: 7.3 }],
    diaphragms: [{ xM: 15.24, loadKn: 12 }],
    supportType: 'simple',
    version: 2,
    updated: { at: '2024-06-02T14:30:00.000Z', by: 'Priya Halloran' },
    ...overrides,
  };
}

export function girderSummary(overrides: Partial<GirderSummary> = {}): GirderSummary {
  return {
    id: 9001,
    spanId: 301,
    girderNumber: 1,
    position: 'exterior',
    girderTypeName: 'I-girder 54 in',
    strandRowCount: 4,
    strandCount: 38,
    harped: true,
    debonded: false,
    concreteStrengthMpa: 55.158056,
    tensioning: 'pre',
    version: 1,
    ...overrides,
  };
}

export function historyEvent(overrides: Partial<HistoryEvent> = {}): HistoryEvent {
  return {
    id: '77',
    occurredAt: '2024-06-02T14:30:00.000Z',
    action: 'span.changed',
    entityType: 'span',
    entityId: '301',
    subject: 'Span 1',
    userName: 'Priya Halloran',
    changes: [{ field: 'lengthM', before: 30, after: 30.48 }],
    ...overrides,
  };
}
