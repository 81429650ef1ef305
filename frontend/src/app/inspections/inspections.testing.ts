import type { AlertItem, FindingDetail, GirderDetail, InspectionDetail, InspectionSummary, PhotoSummary, SignedInUser, StrandRow } from '@spanledger/shared';

/** The invented demo authority's people: an inspector and a rating engineer of North Plains, and people elsewhere. */
export const INSPECTOR: SignedInUser = { id: 3, email: 'i@example.org', displayName: 'Tomasz Reyes', role: 'inspector', districts: ['North Plains'], admin: false };
export const OTHER_INSPECTOR: SignedInUser = { id: 4, email: 'j@example.org', displayName: 'Ines Okafor', role: 'inspector', districts: ['North Plains'], admin: false };
export const INSPECTOR_ELSEWHERE: SignedInUser = { ...INSPECTOR, id: 5, districts: ['East Valley'] };
export const RATER: SignedInUser = { id: 7, email: 'r@example.org', displayName: 'Priya Halloran', role: 'rater', districts: ['North Plains'], admin: false };
export const RATER_ELSEWHERE: SignedInUser = { ...RATER, id: 8, districts: ['East Valley'] };

export function inspectionSummary(overrides: Partial<InspectionSummary> = {}): InspectionSummary {
  return {
    id: 77,
    structureId: 41,
    inspectedOn: '2025-03-04',
    kind: 'routine',
    state: 'draft',
    inspectorName: 'Tomasz Reyes',
    findingCount: 2,
    criticalCount: 1,
    ...overrides,
  };
}

/** A finding of lost strands on girder 2 of span 1 of NP-0041, 12.0–14.5 m along the span. */
export function findingDetail(overrides: Partial<FindingDetail> = {}): FindingDetail {
  return {
    id: 601,
    inspectionId: 77,
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
    registerState: 'draft',
    critical: true,
    damageEntry: null,
    photoIds: [],
    version: 1,
    ...overrides,
  };
}

/** A finding carried forward from the last inspection, not yet looked at. */
export function carriedFinding(overrides: Partial<FindingDetail> = {}): FindingDetail {
  return findingDetail({
    id: 602,
    kind: 'spall',
    strands: null,
    spall: { depthMm: 40, widthMm: 150 },
    fromM: 3,
    toM: 4.5,
    severity: 'moderate',
    disposition: 'to-review',
    carriedFromId: 540,
    critical: false,
    version: 1,
    ...overrides,
  });
}

/** Inspection 77 of NP-0041 by Tomasz Reyes, a draft. */
export function inspectionDetail(overrides: Partial<InspectionDetail> = {}): InspectionDetail {
  return {
    ...inspectionSummary(),
    structureNumber: 'NP-0041',
    district: 'North Plains',
    inspectorId: 3,
    conditions: { deck: 6, superstructure: 7, substructure: null },
    notes: 'Dry weather; access from the creek bank.',
    returnComment: null,
    submittedAt: null,
    reviewed: null,
    findings: [],
    photoIds: [],
    version: 4,
    ...overrides,
  };
}

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

/** Girder 2 of span 1: a hand-made I-girder (not a published shape) with rows r1 (10 strands) and r2 (6). */
export function girderDetail(overrides: Partial<GirderDetail> = {}): GirderDetail {
  const section = {
    shape: 'i-girder',
    topFlangeWidthMm: 500,
    topFlangeThicknessMm: 120,
    topTaperHeightMm: 80,
    webWidthMm: 180,
    bottomTaperHeightMm: 120,
    bottomFlangeWidthMm: 600,
    bottomFlangeThicknessMm: 160,
    depthMm: 1200,
  };
  return {
    id: 9002,
    spanId: 301,
    spanIndex: 1,
    structureId: 41,
    structureNumber: 'NP-0041',
    district: 'North Plains',
    girderNumber: 2,
    girderTypeName: 'Demo I-girder 1200',
    section,
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

export function photoSummary(overrides: Partial<PhotoSummary> = {}): PhotoSummary {
  return {
    id: 88,
    inspectionId: 77,
    findingId: null,
    contentType: 'image/jpeg',
    byteSize: 204_800,
    widthPx: 1600,
    heightPx: 1200,
    originalName: 'north-abutment.jpg',
    uploaded: { at: '2025-03-04T10:20:00.000Z', by: 'Tomasz Reyes' },
    ...overrides,
  };
}

export function alertItem(overrides: Partial<AlertItem> = {}): AlertItem {
  return {
    id: 12,
    kind: 'critical-finding',
    message: 'NP-0041 span 1 girder 2: 2 strands newly lost',
    structureId: 41,
    structureNumber: 'NP-0041',
    girderId: 9002,
    inspectionId: 77,
    findingId: 601,
    createdAt: '2025-03-04T15:00:00.000Z',
    readAt: null,
    ...overrides,
  };
}
