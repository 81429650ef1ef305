import type { RawRow } from './sheet-table';
import { SheetRowReader } from './xlsx-sheet-rows';
import type { WorkbookLookups } from './xlsx-workbook-parts';
import { XmlScanner } from './xlsx-xml-scanner';

const MS_PER_DAY = 24 * 60 * 60 * 1000;

/** Style 0 is General, style 1 a date format, as `readWorkbookParts` would give them. */
const LOOKUPS: WorkbookLookups = {
  sharedStrings: ['girder_key', 'G-1 & G-2', 'rich text'],
  dateStyles: [false, true],
  date1904: false,
};

const CHUNK_SIZES: ReadonlyArray<[string, number]> = [
  ['1-character', 1],
  ['7-character', 7],
  ['whole', Number.MAX_SAFE_INTEGER],
];

function sheetXml(rows: string, prefix = ''): string {
  const p = prefix ? `${prefix}:` : '';
  const xmlns = prefix ? `xmlns:${prefix}` : 'xmlns';
  return (
    '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n' +
    `<${p}worksheet ${xmlns}="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><${p}sheetData>${rows}</${p}sheetData></${p}worksheet>`
  );
}

/** The rows of `xml` read by a SheetRowReader fed `chunkSize` characters at a time. */
function readSheet(xml: string, chunkSize = Number.MAX_SAFE_INTEGER, lookups: WorkbookLookups = LOOKUPS): RawRow[] {
  const scanner = new XmlScanner('xl/worksheets/sheet1.xml');
  const reader = new SheetRowReader(scanner, 'Girders', lookups);
  const rows: RawRow[] = [];
  for (let at = 0; at < xml.length; at += chunkSize) {
    scanner.push(xml.slice(at, at + chunkSize));
    for (let row = reader.nextRow(); row !== undefined; row = reader.nextRow()) rows.push(row);
  }
  scanner.finish();
  for (let row = reader.nextRow(); row !== undefined; row = reader.nextRow()) rows.push(row);
  return rows;
}

function failureOf(xml: string, lookups: WorkbookLookups = LOOKUPS) {
  try {
    readSheet(xml, 5, lookups);
  } catch (error) {
    return error;
  }
  throw new Error('expected the sheet to be refused');
}

/** 2019-05-14 is serial 43599 in the 1900 date system: (Date.UTC(2019, 4, 14) - Date.UTC(1899, 11, 30)) / day, hand check. */
const CAST_ON = new Date(Date.UTC(2019, 4, 14));
const CAST_ON_SERIAL = (CAST_ON.getTime() - Date.UTC(1899, 11, 30)) / MS_PER_DAY;

describe('SheetRowReader', () => {
  const everyKind = sheetXml(
    '<row r="1" spans="1:9"><c r="A1" t="s"><v>0</v></c></row>' +
      '<row r="2">' +
      '<c r="A2" t="s"><v>1</v></c>' +
      '<c t="inlineStr" r="B2"><is><r><rPr><b/></rPr><t>span </t></r><r><t xml:space="preserve">one &lt;east&gt;</t></r><rPh sb="0" eb="1"><t>guide</t></rPh></is></c>' +
      "<c r='C2' s='1'><v>" + CAST_ON_SERIAL + '</v></c>' +
      '<c r="D2"><v>24.5</v></c>' +
      '<c r="E2" t="b"><v>1</v></c>' +
      '<c r="F2" t="b"><v>0</v></c>' +
      '<c r="G2" t="str"><f>A2&amp;"!"</f><v>G-1 &amp; G-2!</v></c>' +
      '<c r="H2"><f>D2*2</f><v>49</v></c>' +
      '<c r="I2" s="1"><f>C2+1</f><v>' + (CAST_ON_SERIAL + 1) + '</v></c>' +
      '<c r="J2" t="b"><f>D2&gt;1</f><v>1</v></c>' +
      '<c r="K2" t="d"><v>2020-11-02T00:00:00Z</v></c>' +
      '<c r="L2" s="1"/><c r="M2"></c>' +
      '</row>' +
      '<row r="4"/>',
  );
  const everyKindRows: RawRow[] = [
    { sheet: 'Girders', rowNumber: 1, cells: [{ column: 1, value: 'girder_key' }] },
    {
      sheet: 'Girders',
      rowNumber: 2,
      cells: [
        { column: 1, value: 'G-1 & G-2' },
        { column: 2, value: 'span one <east>' },
        { column: 3, value: CAST_ON },
        { column: 4, value: 24.5 },
        { column: 5, value: true },
        { column: 6, value: false },
        { column: 7, value: 'G-1 & G-2!' },
        { column: 8, value: 49 },
        { column: 9, value: new Date(CAST_ON.getTime() + MS_PER_DAY) },
        { column: 10, value: true },
        { column: 11, value: new Date(Date.UTC(2020, 10, 2)) },
      ],
    },
    { sheet: 'Girders', rowNumber: 4, cells: [] },
  ];

  it.each(CHUNK_SIZES)(
    'reads shared, inline and rich strings, numbers, dates, booleans and stored formula results fed in %s chunks',
    (_label, chunkSize) => {
      expect(readSheet(everyKind, chunkSize)).toEqual(everyKindRows);
    },
  );

  it('reads elements with a namespace prefix the same as without', () => {
    const prefixed = everyKind
      .replace(/<(\/?)(worksheet|sheetData|row|c|v|f|is|r|rPr|b|t|rPh)([ />])/g, '<$1x:$2$3')
      .replace('xmlns=', 'xmlns:x=');
    expect(prefixed).toContain('<x:c r="A2" t="s"><x:v>1</x:v></x:c>');
    expect(readSheet(prefixed, 7)).toEqual(everyKindRows);
    expect(readSheet(sheetXml('<row><c><v>1</v></c></row>', 'x'))).toEqual([
      { sheet: 'Girders', rowNumber: 1, cells: [{ column: 1, value: 1 }] },
    ]);
  });

  it('counts from the 1904 date system when the workbook says so (ECMA-376 Part 1, 18.17.4.1: 1462 days later)', () => {
    const xml = sheetXml(`<row r="2"><c r="A2" s="1"><v>${CAST_ON_SERIAL - 1462}</v></c></row>`);
    expect(readSheet(xml, 7, { ...LOOKUPS, date1904: true })[0]!.cells).toEqual([{ column: 1, value: CAST_ON }]);
  });

  it('gives a row without `r` the next row number and a cell without `r` the next column', () => {
    const xml = sheetXml('<row r="3"><c><v>1</v></c><c r="D3"><v>4</v></c><c><v>5</v></c></row><row><c><v>6</v></c></row>');
    expect(readSheet(xml, 1)).toEqual([
      { sheet: 'Girders', rowNumber: 3, cells: [{ column: 1, value: 1 }, { column: 4, value: 4 }, { column: 5, value: 5 }] },
      { sheet: 'Girders', rowNumber: 4, cells: [{ column: 1, value: 6 }] },
    ]);
  });

  it('puts cells written out of column order in order, the later of two in one column winning', () => {
    const xml = sheetXml('<row r="1"><c r="C1"><v>3</v></c><c r="A1"><v>1</v></c><c r="C1"><v>33</v></c></row>');
    expect(readSheet(xml)[0]!.cells).toEqual([{ column: 1, value: 1 }, { column: 3, value: 33 }]);
  });

  it('refuses an error cell, naming the sheet, row, column and the error shown', () => {
    const error = failureOf(sheetXml('<row r="7"><c r="AB7" t="e"><f>1/0</f><v>#DIV/0!</v></c></row>'));
    expect(error).toMatchObject({ code: 'cell_error', sheet: 'Girders', row: 7, column: 'AB' });
    expect((error as Error).message).toBe('Sheet "Girders", row 7, column AB shows an error (#DIV/0!); correct it or clear the cell');
  });

  it.each([
    ['without a value', '<c r="C2"><f>B2*2</f></c>'],
    ['with an empty value', '<c r="C2"><f>B2*2</f><v></v></c>'],
    ['shared, without a value', '<c r="C2"><f t="shared" si="0"/></c>'],
  ])('refuses a formula %s, never calculating it', (_what, cell) => {
    expect(failureOf(sheetXml(`<row r="2">${cell}</row>`))).toMatchObject({ code: 'formula_without_value', sheet: 'Girders', row: 2, column: 'C' });
  });

  it.each([
    ['a shared string index past the table', '<c r="B2" t="s"><v>3</v></c>'],
    ['a number that is not one', '<c r="B2"><v>12abc</v></c>'],
    ['a boolean that is neither 0 nor 1', '<c r="B2" t="b"><v>2</v></c>'],
    ['an ISO date that does not exist', '<c r="B2" t="d"><v>2025-02-30</v></c>'],
    ['a cell type the format does not define', '<c r="B2" t="x"><v>1</v></c>'],
    ['an entity XML does not define', '<c r="B2" t="str"><v>&nbsp;</v></c>'],
  ])('refuses %s as a value it does not understand, naming the cell', (_what, cell) => {
    expect(failureOf(sheetXml(`<row r="2">${cell}</row>`))).toMatchObject({ code: 'corrupt_file', sheet: 'Girders', row: 2, column: 'B' });
  });

  it.each([
    ['ends inside a row', '<worksheet><sheetData><row r="1"><c r="A1"><v>1</v></c>'],
    ['nests a cell in a cell', sheetXml('<row r="1"><c r="A1"><c r="B1"/></c></row>')],
    ['has a damaged cell reference', sheetXml('<row r="1"><c r="1A"><v>1</v></c></row>')],
    ['has a damaged row number', sheetXml('<row r="first"><c><v>1</v></c></row>')],
  ])('refuses a sheet that %s', (_what, xml) => {
    expect(failureOf(xml)).toMatchObject({ code: 'corrupt_file' });
  });

  it('reads rows only inside <sheetData>, not cells an extension elsewhere names alike', () => {
    const xml =
      '<worksheet><sheetData><row r="1"><c r="A1"><v>1</v></c></row></sheetData>' +
      '<extLst><ext><row r="9"><c r="A9"><v>9</v></c></row></ext></extLst></worksheet>';
    expect(readSheet(xml, 7)).toEqual([{ sheet: 'Girders', rowNumber: 1, cells: [{ column: 1, value: 1 }] }]);
  });
});
