import type { ImportDetail, ImportProblem, ImportSummary, SignedInUser } from '@spanledger/shared';

import { RATER } from '../inspections/inspections.testing';

export { INSPECTOR, RATER } from '../inspections/inspections.testing';

/** A manager of the whole network of the invented demo authority. */
export const MANAGER: SignedInUser = { id: 11, email: 'm@example.org', displayName: 'Greer Ashdown', role: 'manager', districts: [], admin: true };

/** Import 12: west-district.xlsx, uploaded by the rater, checked clean: 3 new structures and 2 changed, 8 new spans. */
export function importSummary(overrides: Partial<ImportSummary> = {}): ImportSummary {
  return {
    id: 12,
    fileName: 'west-district.xlsx',
    fileKind: 'xlsx',
    byteSize: 48_213,
    contentSha256: '3f1c0b6e9a1d4e7c8b2a5f6d0e9c8b7a6f5e4d3c2b1a0f9e8d7c6b5a4f3e2d1c',
    state: 'checked',
    counts: { structures: { rows: 5, create: 3, update: 2, unchanged: 0, refused: 0, fileRows: 5 }, spans: { rows: 8, create: 8, update: 0, unchanged: 0, refused: 0, fileRows: 8 } },
    problemCount: 0,
    uploaded: { at: '2026-11-02T12:00:00.000Z', by: RATER.displayName },
    committed: null,
    progress: null,
    version: 1,
    ...overrides,
  };
}

/** Import 12 as `GET /api/imports/12` answers it to its uploader. */
export function importDetail(overrides: Partial<ImportDetail> = {}): ImportDetail {
  return {
    ...importSummary(),
    problems: [],
    problemsTruncated: false,
    allowed: { commit: true, discard: true },
    ...overrides,
  };
}

/** Two problems of a girders sheet, to be shown as given: a typing slip (520 for 52 MPa, no source needed) and a row naming a span the register lacks. The messages are stand-ins; the server's own wording is its tests' business. */
export const GIRDER_PROBLEMS: readonly ImportProblem[] = [
  { sheet: 'girders', row: 4, column: 'concrete_strength_mpa', value: 520, message: 'must be at most 150 MPa' },
  { sheet: 'girders', row: 7, column: '', value: null, message: 'structure WD-0107 has no span 3' },
];

/** Import 13, checked with the two girder problems: its uploader may only set it aside. */
export function importWithProblems(overrides: Partial<ImportDetail> = {}): ImportDetail {
  return importDetail({
    id: 13,
    fileName: 'girders.csv',
    fileKind: 'csv',
    // Nine rows: one refused at its cell, eight judged against the register, one of them refused there.
    counts: { girders: { rows: 8, create: 5, update: 1, unchanged: 1, refused: 2, fileRows: 9 } },
    problemCount: GIRDER_PROBLEMS.length,
    problems: GIRDER_PROBLEMS,
    allowed: { commit: false, discard: true },
    ...overrides,
  });
}

/** The server's error body, as every failed request carries it. */
export function serverError(code: string, message: string, details: Record<string, unknown> = {}) {
  return { error: { code, message, details }, requestId: 'r-42' };
}
