import { girderRecord, type GirderRecord } from '../../../shared/src/girder-record';
import type { StoredSpan } from './girder-calc-file';
import type { GirderTypeRow } from './girders.repository';
import { girderRatingProblems, girderRecordDigest } from './girders.service';

// A plain rectangular girder of the kind the inventory holds; the figures are common practice, no source.
const record: GirderRecord = girderRecord.parse({
  position: 'interior',
  girderTypeId: null,
  customSection: { shape: 'rectangle', widthMm: 500, depthMm: 1000 },
  concrete: { strengthMpa: 41.4, basis: 'cylinder' },
  deckConcrete: { strengthMpa: 27.6, basis: 'cylinder' },
  strandRows: [{ id: 'r1', yMm: 60, count: 10, strandAreaMm2: 98.7, strandDiameterMm: 12.7, fpuMpa: 1860, fpyMpa: 1674, epsMpa: 196500, fpeMpa: 1100 }],
});

const span: StoredSpan = {
  length_m: 20,
  girder_count: 4,
  girder_spacing_mm: 2400,
  overhang_mm: 900,
  roadway_width_mm: 8400,
  barrier_face_to_girder_mm: 450,
  deck_thickness_mm: 200,
  haunch_mm: 25,
  wearing_surface: null,
  barriers: [],
  diaphragms: [],
};

describe('girderRatingProblems', () => {
  it('passes a girder the engine can rate, and names what it cannot at its place in the record', () => {
    expect(girderRatingProblems(record, undefined, span, 2, 0, new Set())).toEqual([]);
    const tooHigh = { ...record, strandRows: [{ ...record.strandRows[0]!, yMm: 5000 }] };
    expect(girderRatingProblems(tooHigh, undefined, span, 2, 0, new Set())).toEqual([{ field: 'strandRows.0.yMm', message: expect.any(String) }]);
  });

  it('remembers a girder it passed by all it is made of, so that a change to any of it is checked again', () => {
    const passed = new Set<string>();
    girderRatingProblems(record, undefined, span, 2, 0, passed);
    expect(passed.size).toBe(1);
    // The same girder again, even as other objects, is known.
    girderRatingProblems(structuredClone(record), undefined, { ...span }, 2, 0, passed);
    expect(passed.size).toBe(1);
    // Each input on its own makes another girder: the record, the span the engine reads, the girder's number, the skew.
    girderRatingProblems({ ...record, concrete: { ...record.concrete, strengthMpa: 50 } }, undefined, span, 2, 0, passed);
    girderRatingProblems(record, undefined, { ...span, length_m: 21 }, 2, 0, passed);
    girderRatingProblems(record, undefined, span, 3, 0, passed);
    girderRatingProblems(record, undefined, span, 2, 15, passed);
    expect(passed.size).toBe(5);
  });

  it('knows a span read back from the database by its fields, whatever order its objects keep their keys in', () => {
    const passed = new Set<string>();
    const asFiled = { ...span, wearing_surface: { thicknessMm: 60, unitWeightKnM3: 23, measured: false, kind: 'overlay' as const } };
    const asStored = { ...span, wearing_surface: { kind: 'overlay' as const, measured: false, thicknessMm: 60, unitWeightKnM3: 23 } };
    expect(girderRatingProblems(record, undefined, asFiled, 2, 0, passed)).toEqual([]);
    girderRatingProblems(record, undefined, asStored, 2, 0, passed);
    expect(passed.size).toBe(1);
  });

  it('never remembers a refused girder: it is refused again', () => {
    const passed = new Set<string>();
    const tooHigh = { ...record, strandRows: [{ ...record.strandRows[0]!, yMm: 5000 }] };
    expect(girderRatingProblems(tooHigh, undefined, span, 2, 0, passed)).toHaveLength(1);
    expect(passed.size).toBe(0);
    expect(girderRatingProblems(tooHigh, undefined, span, 2, 0, passed)).toHaveLength(1);
  });

  it('knows a girder by the digest of its record kept from an earlier check, and only with the catalogue type that record named', () => {
    // Two catalogue types of one section: a girder of either rates alike, yet each is its own record.
    const typeOf = (id: number): GirderTypeRow => ({ id, name: `Type ${id}`, section: { shape: 'rectangle', widthMm: 500, depthMm: 1000 }, source: 'common practice, no source', version: 1, girder_count: '0' });
    const ofType = (id: number): GirderRecord => ({ ...record, girderTypeId: id, customSection: null });
    const passed = new Set<string>();
    const keptByCheck = girderRecordDigest(ofType(1));
    expect(girderRatingProblems(ofType(1), typeOf(1), span, 2, 0, passed)).toEqual([]);
    expect(passed.size).toBe(1);
    // The commit, with the record's digest kept by the check: known.
    girderRatingProblems(ofType(1), typeOf(1), span, 2, 0, passed, keptByCheck);
    expect(passed.size).toBe(1);
    // The catalogue now resolves the row's type name to another type: the kept digest does not stand for this record.
    girderRatingProblems(ofType(2), typeOf(2), span, 2, 0, passed, keptByCheck);
    expect(passed.size).toBe(2);
  });
});
