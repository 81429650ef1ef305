import fs from 'node:fs';
import { readAllRows, importFailure, useTempFolder } from './test-support/temp-files';
import {
  expectedSampleRows,
  writeFormulaWithoutValue,
  writeSampleByHand,
  writeSampleWithExcelJs,
} from './test-support/workbooks';

const temp = useTempFolder();

describe('readRows on XLSX', () => {
  it('reads text, numbers, dates, booleans and a formula’s stored result from an exceljs workbook', async () => {
    const file = temp.file('girders-exceljs.xlsx');
    await writeSampleWithExcelJs(file);
    const rows = await readAllRows(file);
    expect(rows).toEqual(expectedSampleRows());
    expect(rows[0]!.cells.cast_on).toBeInstanceOf(Date);
  });

  it('reads a workbook built by hand (inline strings, other part order) the same as the exceljs one', async () => {
    const byExcelJs = temp.file('same-exceljs.xlsx');
    const byHand = temp.file('same-by-hand.xlsx');
    await writeSampleWithExcelJs(byExcelJs);
    await writeSampleByHand(byHand);
    expect(await readAllRows(byHand)).toEqual(await readAllRows(byExcelJs));
  });

  it('reads a hand-built workbook whose parts are stored uncompressed', async () => {
    const file = temp.file('stored.xlsx');
    await writeSampleByHand(file, { partOptions: { deflate: false }, worksheetFirst: false });
    expect(await readAllRows(file)).toEqual(expectedSampleRows());
  });

  it('reads an uncompressed workbook whose worksheet comes before its workbook part: parts are found by the zip directory, not by their order', async () => {
    const file = temp.file('stored-out-of-order.xlsx');
    await writeSampleByHand(file, { partOptions: { deflate: false }, worksheetFirst: true });
    expect(await readAllRows(file)).toEqual(expectedSampleRows());
  });

  it('refuses a formula without a stored value, naming sheet, row and column', async () => {
    const file = temp.file('uncalculated.xlsx');
    await writeFormulaWithoutValue(file);
    const error = await importFailure(readAllRows(file));
    expect(error).toMatchObject({ code: 'formula_without_value', sheet: 'Spans', row: 2, column: 'C' });
    expect(error.message).toContain('formula without a stored value: open and save the file in a spreadsheet program, or paste values');
  });

  it('stops at the row cap with a message naming the limit', async () => {
    const file = temp.file('capped.xlsx');
    await writeSampleWithExcelJs(file);
    const error = await importFailure(readAllRows(file, { maxRows: 1 }));
    expect(error).toMatchObject({ code: 'too_many_rows', sheet: 'Girders', row: 4 });
    expect(error.message).toContain('more than 1 rows');
  });
});

describe('readRows on CSV', () => {
  it('reads a UTF-8 CSV with a BOM, names the sheet after the file and keeps record numbers', async () => {
    const file = temp.file('strand-rows.csv');
    fs.writeFileSync(file, '\uFEFFgirder_key, strand_count ,note\r\nG-1,12,"top, bottom"\r\n\r\nG-2,16,\r\n');
    expect(await readAllRows(file)).toEqual([
      { sheet: 'strand-rows', rowNumber: 2, cells: { girder_key: 'G-1', strand_count: '12', note: 'top, bottom' } },
      { sheet: 'strand-rows', rowNumber: 4, cells: { girder_key: 'G-2', strand_count: '16', note: null } },
    ]);
  });

  it('keeps a header named __proto__ or constructor an ordinary column, on every row', async () => {
    const file = temp.file('odd-headers.csv');
    fs.writeFileSync(file, '__proto__,constructor,girder_key\r\nx,y,G-1\r\n,,G-2\r\n');
    const rows = await readAllRows(file);
    expect(rows.map((row) => Object.keys(row.cells))).toEqual([
      ['__proto__', 'constructor', 'girder_key'],
      ['__proto__', 'constructor', 'girder_key'],
    ]);
    expect(rows[0]!.cells).toMatchObject({ constructor: 'y', girder_key: 'G-1' });
    expect(Object.getOwnPropertyDescriptor(rows[0]!.cells, '__proto__')?.value).toBe('x');
    expect(Object.getOwnPropertyDescriptor(rows[1]!.cells, '__proto__')?.value).toBeNull();
    expect([Object.prototype, null]).toContain(Object.getPrototypeOf(rows[0]!.cells));
  });

  it('reads a CSV named .xlsx as CSV, under a given sheet name', async () => {
    const file = temp.file('really-text.xlsx');
    fs.writeFileSync(file, 'girder_key,strand_count\nG-1,12\n');
    expect(await readAllRows(file, { sheetName: 'girders.csv' })).toEqual([
      { sheet: 'girders.csv', rowNumber: 2, cells: { girder_key: 'G-1', strand_count: '12' } },
    ]);
  });

  it('detects a semicolon delimiter from the header line', async () => {
    const file = temp.file('semicolons.csv');
    fs.writeFileSync(file, 'girder_key;span_length_m\nG-1;24,5\n');
    expect(await readAllRows(file)).toEqual([
      { sheet: 'semicolons', rowNumber: 2, cells: { girder_key: 'G-1', span_length_m: '24,5' } },
    ]);
  });

  it('keeps commas when told the delimiter is a comma', async () => {
    const file = temp.file('told-comma.csv');
    fs.writeFileSync(file, 'note;more\n"a;b";c\n');
    expect(await readAllRows(file, { csvDelimiter: ',' })).toEqual([
      { sheet: 'told-comma', rowNumber: 2, cells: { 'note;more': '"a;b";c' } },
    ]);
  });

  it('refuses duplicated headers, naming the sheet and both columns', async () => {
    const file = temp.file('twice.csv');
    fs.writeFileSync(file, 'girder_key,span_length_m,Girder_Key \nG-1,20,G-2\n');
    const error = await importFailure(readAllRows(file));
    expect(error).toMatchObject({ code: 'bad_header', sheet: 'twice', row: 1, column: 'C' });
    expect(error.message).toContain('columns A and C');
  });

  it('refuses a file with no header row', async () => {
    const file = temp.file('blank.csv');
    fs.writeFileSync(file, ',,\n , \n');
    expect(await importFailure(readAllRows(file))).toMatchObject({ code: 'bad_header' });
  });

  it('refuses a value in a column the header does not name', async () => {
    const file = temp.file('extra.csv');
    fs.writeFileSync(file, 'girder_key,strand_count\nG-1,12,surprise\n');
    expect(await importFailure(readAllRows(file))).toMatchObject({
      code: 'value_without_header',
      sheet: 'extra',
      row: 2,
      column: 'C',
    });
  });

  it('enforces the row cap', async () => {
    const file = temp.file('long.csv');
    fs.writeFileSync(file, `key\n${Array.from({ length: 5 }, (_, index) => `K-${index}`).join('\n')}\n`);
    expect(await readAllRows(file, { maxRows: 5 })).toHaveLength(5);
    expect(await importFailure(readAllRows(file, { maxRows: 4 }))).toMatchObject({ code: 'too_many_rows', row: 6 });
  });

  it('refuses bytes that are not UTF-8 past the part checked by content sniffing', async () => {
    const file = temp.file('latin1-late.csv');
    const header = `note\n${'plain ascii row\n'.repeat(10_000)}`;
    fs.writeFileSync(file, Buffer.concat([Buffer.from(header), Buffer.from([0x63, 0x61, 0x66, 0xe9, 0x0a])]));
    expect(await importFailure(readAllRows(file))).toMatchObject({ code: 'unsupported_file' });
  });

  it('reports an unclosed quote as a file that cannot be read', async () => {
    const file = temp.file('open-quote.csv');
    fs.writeFileSync(file, 'note\n"never closed\n');
    expect(await importFailure(readAllRows(file))).toMatchObject({ code: 'corrupt_file' });
  });
});
