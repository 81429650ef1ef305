import { IMPORT_TEMPLATES, type ImportTemplateName } from './columns';
import { convertRow, readHeaders } from './rows';
import { checkUpload, girderKey, type AnyConvertedRow } from './upload-checks';

/** Converts the template's example row with some cells changed; the row must pass. */
function row(name: ImportTemplateName, rowNumber: number, changes: Record<string, string | number> = {}, sheet: string = name): AnyConvertedRow {
  const cells: Record<string, string | number> = Object.fromEntries(IMPORT_TEMPLATES[name].columns.map((column) => [column.header, column.example]));
  Object.assign(cells, changes);
  const result = convertRow(name, readHeaders(name, sheet, Object.keys(cells)), { sheet, rowNumber, cells });
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.row as AnyConvertedRow;
}

describe('checkUpload', () => {
  it('reports a key given twice in a file, naming the first row and the key columns', () => {
    const check = checkUpload([row('spans', 2), row('spans', 3, { span_index: 2 }), row('spans', 4)]);
    expect(check.problems).toEqual([
      { sheet: 'spans', row: 4, column: 'structure_number, span_index', value: 'BV-S-0201 / 1', message: 'the same structure_number, span_index as row 2; each may appear once in a file' },
    ]);
  });

  it('names the other sheet when the first row is on another one', () => {
    const check = checkUpload([row('structures', 2, {}, 'North'), row('structures', 5, {}, 'South')]);
    expect(check.problems).toEqual([expect.objectContaining({ sheet: 'South', row: 5, column: 'structure_number', message: 'the same structure_number as row 2 of sheet North; each may appear once in a file' })]);
  });

  it('a strand row id may repeat across girders but not within one', () => {
    const check = checkUpload([row('strand-rows', 2), row('strand-rows', 3, { girder_number: 4 }), row('strand-rows', 4, { y_mm: 100 })]);
    expect(check.problems).toEqual([expect.objectContaining({ row: 4, column: 'structure_number, span_index, girder_number, row_id', value: 'BV-S-0201 / 1 / 3 / R1' })]);
  });

  it('findings of one girder differ by kind and place; the same kind at the same place twice is a duplicate', () => {
    const check = checkUpload([row('findings', 2), row('findings', 3, { kind: 'crack', strand_row_id: '', strand_indices: '' }), row('findings', 4, { notes: 'again' })]);
    expect(check.problems).toEqual([expect.objectContaining({ row: 4, value: 'BV-S-0201 / 1 / 3 / 2025-06-12 / exposed-strands / 3.2 / 4.1' })]);
  });

  it('flags what rows refer to that the upload does not hold, for the server to find on file', () => {
    const check = checkUpload([
      row('spans', 2),
      row('spans', 3, { structure_number: 'BV-S-0999' }),
      row('structures', 2),
      row('girders', 2),
      row('girders', 3, { span_index: 2 }),
      row('findings', 2, { girder_number: 5, strand_row_id: '', strand_indices: '', kind: 'crack' }),
      row('strand-rows', 2),
      row('prior-ratings', 2, { span_index: '' , structure_number: 'BV-S-0777' }),
    ]);
    expect(check.problems).toEqual([]);
    expect(check.mustExist).toEqual({
      structures: ['BV-S-0999', 'BV-S-0777'],
      spans: [{ structureNumber: 'BV-S-0201', spanIndex: 2 }],
      girders: [{ structureNumber: 'BV-S-0201', spanIndex: 1, girderNumber: 5 }],
    });
  });

  it('gathers the strand rows of each girder, wherever they are in the file, as the set that replaces its rows', () => {
    const check = checkUpload([row('strand-rows', 2), row('strand-rows', 3, { girder_number: 4 }), row('strand-rows', 4, { row_id: 'R2', y_mm: 100 })]);
    const girder3 = check.strandRowsByGirder.get(girderKey({ structureNumber: 'BV-S-0201', spanIndex: 1, girderNumber: 3 }));
    expect(girder3?.strandRows.map((strandRow) => [strandRow.id, strandRow.yMm])).toEqual([['R1', 50], ['R2', 100]]);
    expect(girder3?.rows).toEqual([{ sheet: 'strand-rows', rowNumber: 2 }, { sheet: 'strand-rows', rowNumber: 4 }]);
    expect(check.strandRowsByGirder.size).toBe(2);
  });
});
