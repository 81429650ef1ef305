import type { ImportProblem } from '../../../shared/src';
import { inFileOrder } from './import-check';

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
