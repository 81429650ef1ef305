import type { ImportProblem } from '../../../shared/src';
import { inFileOrder, withRefusedRows } from './import-check';

const problem = (sheet: string, row: number, column: string): ImportProblem => ({ sheet, row, column, value: null, message: 'wrong' });
const where = (problems: readonly ImportProblem[]) => problems.map((each) => `${each.sheet}!${each.row}:${each.column}`);

describe('inFileOrder', () => {
  it('lists problems sheet by sheet in the file’s order, row by row, keeping the order found within a row, the file’s own first', () => {
    const found = [
      problem('girders', 7, 'concrete_strength_mpa'),
      problem('structures', 3, 'adt'),
      problem('strand-rows', 2, 'y_mm'),
      problem('girders', 2, 'position'),
      problem('girders', 7, 'girder_type'),
      problem('', 0, ''),
      problem('notes', 4, 'x'),
    ];
    expect(where(inFileOrder(found, ['structures', 'girders', 'strand-rows']))).toEqual([
      '!0:',
      'structures!3:adt',
      'girders!2:position',
      'girders!7:concrete_strength_mpa',
      'girders!7:girder_type',
      'strand-rows!2:y_mm',
      'notes!4:x',
    ]);
  });
});

describe('withRefusedRows', () => {
  it('counts each data row with a problem once, in its template, beside its rows in the file; header rows, whole sheets and the file are no data row', () => {
    const counts = { structures: { rows: 3, create: 2, update: 0, unchanged: 0 } };
    const found = [
      problem('structures', 3, 'adt'),
      problem('structures', 3, 'adtt'),
      problem('structures', 5, 'name'),
      problem('Strand rows', 2, 'y_mm'),
      problem('girders', 1, 'concrete_strength'),
      problem('notes', 4, 'x'),
      problem('', 0, ''),
    ];
    const fileRows = new Map([
      ['structures', 4],
      ['strand-rows', 1],
    ] as const);
    expect(withRefusedRows(counts, found, fileRows)).toEqual({
      // Four rows: one refused at its cells, three judged against the register, one of them refused there.
      structures: { rows: 3, create: 2, update: 0, unchanged: 0, refused: 2, fileRows: 4 },
      // Every strand row refused at its cells: none was judged, yet the template has its counts.
      'strand-rows': { rows: 0, create: 0, update: 0, unchanged: 0, refused: 1, fileRows: 1 },
    });
    // A file read no further than a row has no rows in the file to say.
    expect(withRefusedRows({}, [problem('girders', 40, 'x')], new Map())).toEqual({ girders: { rows: 0, create: 0, update: 0, unchanged: 0, refused: 1 } });
  });
});
