import type { FindingDetail, GirderDetail, GirderTypeSummary, StrandRow } from '@spanledger/shared';

/** A catalogue I-girder of the invented demo authority (a hand-made shape, not a published one). */
export const DEMO_I_GIRDER_SECTION = {
  shape: 'i-girder',
  topFlangeWidthMm: 500,
  topFlangeThicknessMm: 120,
  topTaperHeightMm: 80,
  webWidthMm: 180,
  bottomTaperHeightMm: 120,
  bottomFlangeWidthMm: 600,
  bottomFlangeThicknessMm: 160,
  depthMm: 1200,
} as const;

export function strandRow(overrides: Partial<StrandRow> = {}): StrandRow {
  return {
    id: 'r1',
    yMm: 60,
    count: 10,
    strandAreaMm2: 140,
    strandDiameterMm: 15.2,
    fpuMpa: 1860,
    fpyMpa: 1674,
    epsMpa: 196500,
    fpeMpa: 1100,
    bonded: true,
    ...overrides,
  };
}

export function girderType(overrides: Partial<GirderTypeSummary> = {}): GirderTypeSummary {
  return {
    id: 4,
    name: 'Demo I-girder 1200',
    shape: 'i-girder',
    depthMm: 1200,
    source: "The owner's standard drawing SD-12 (invented for the demo)",
    section: { ...DEMO_I_GIRDER_SECTION },
    girderCount: 12,
    version: 1,
    ...overrides,
  };
}

/** Girder 2 of span 1 of structure NP-0041, of the demo catalogue type, with two strand rows. */
export function girderDetail(overrides: Partial<GirderDetail> = {}): GirderDetail {
  return {
    id: 9002,
    spanId: 301,
    spanIndex: 1,
    structureId: 41,
    structureNumber: 'NP-0041',
    district: 'North Plains',
    girderNumber: 2,
    girderTypeName: 'Demo I-girder 1200',
    section: { ...DEMO_I_GIRDER_SECTION },
    position: 'interior',
    girderTypeId: 4,
    sectionOverrides: {},
    customSection: null,
    concrete: { strengthMpa: 55, basis: 'cylinder', unitWeightKnM3: 24.5 },
    deckConcrete: { strengthMpa: 32, basis: 'cylinder', unitWeightKnM3: 24 },
    strandRows: [strandRow(), strandRow({ id: 'r2', yMm: 110, count: 6 })],
    bars: [],
    tensioning: 'pre',
    profiles: [],
    debonding: [],
    losses: { method: 'given' },
    version: 3,
    updated: { at: '2024-06-02T14:30:00.000Z', by: 'Priya Halloran' },
    ...overrides,
  };
}

/** An open finding of lost strands on girder 9002, 12.0–14.5 m along span 1. */
export function findingDetail(overrides: Partial<FindingDetail> = {}): FindingDetail {
  return {
    id: 501,
    inspectionId: 71,
    girderId: 9002,
    girderNumber: 2,
    spanId: 301,
    spanIndex: 1,
    kind: 'lost-strands',
    strands: { rowId: 'r1', strands: [0, 9] },
    lossFraction: null,
    brokenWires: null,
    spall: null,
    deckLossMm: null,
    crackWidthMm: null,
    fromM: 12,
    toM: 14.5,
    severity: 'severe',
    notes: '',
    disposition: 'new',
    carriedFromId: null,
    registerState: 'open',
    critical: true,
    damageEntry: null,
    photoIds: [],
    version: 1,
    ...overrides,
  };
}
