import ExcelJS from 'exceljs';
import type { RawRow } from './sheet-table';
import { importFailure, readAllRows, useTempFolder } from './test-support/temp-files';
import { expectedSampleRows, minimalWorkbookParts, writeSampleByHand } from './test-support/workbooks';
import { writeZip } from './test-support/zip-writer';
import { readXlsxRows } from './xlsx-rows';

const temp = useTempFolder();

const MAIN_NS = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const REL_NS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const PACKAGE_REL_NS = 'http://schemas.openxmlformats.org/package/2006/relationships';
const MS_PER_DAY = 24 * 60 * 60 * 1000;

async function rawRowsOf(filePath: string): Promise<RawRow[]> {
  const rows: RawRow[] = [];
  for await (const row of readXlsxRows(filePath)) rows.push(row);
  return rows;
}

interface HandBuiltWorkbook {
  readonly workbook: string;
  readonly relationships: string;
  readonly parts: Record<string, string>;
}

/** A package of the given parts; [Content_Types].xml and the package relationships come from the test fixtures. */
async function writeWorkbook(filePath: string, { workbook, relationships, parts }: HandBuiltWorkbook): Promise<void> {
  const common = minimalWorkbookParts('');
  await writeZip(filePath, [
    { name: '[Content_Types].xml', data: common.contentTypes },
    { name: '_rels/.rels', data: common.packageRels },
    ...Object.entries(parts).map(([name, data]) => ({ name, data })),
    { name: 'xl/workbook.xml', data: workbook },
    { name: 'xl/_rels/workbook.xml.rels', data: relationships },
  ]);
}

function relationshipsXml(relationships: ReadonlyArray<[id: string, type: string, target: string]>): string {
  const items = relationships.map(([id, type, target]) => `<Relationship Id="${id}" Type="${REL_NS}/${type}" Target="${target}"/>`);
  return `<Relationships xmlns="${PACKAGE_REL_NS}">${items.join('')}</Relationships>`;
}

function worksheetXml(rows: string): string {
  return `<worksheet xmlns="${MAIN_NS}"><sheetData>${rows}</sheetData></worksheet>`;
}

describe('readXlsxRows', () => {
  it('reads the sheets in the workbook’s tab order, not the order of their parts in the file', async () => {
    const file = temp.file('tab-order.xlsx');
    await writeWorkbook(file, {
      workbook:
        `<workbook xmlns="${MAIN_NS}" xmlns:rel="${REL_NS}"><sheets>` +
        '<sheet name="spans" sheetId="2" rel:id="rId2"/><sheet name="chart" sheetId="3" rel:id="rId3"/><sheet name="girders &amp; more" sheetId="1" rel:id="rId1"/>' +
        '</sheets></workbook>',
      relationships: relationshipsXml([
        ['rId1', 'worksheet', 'worksheets/sheet1.xml'],
        ['rId2', 'worksheet', '/xl/worksheets/sheet2.xml'],
        ['rId3', 'chartsheet', 'chartsheets/sheet1.xml'],
      ]),
      parts: {
        'xl/worksheets/sheet1.xml': worksheetXml('<row r="1"><c r="A1"><v>1</v></c></row>'),
        'xl/worksheets/sheet2.xml': worksheetXml('<row r="1"><c r="A1"><v>2</v></c></row>'),
        'xl/chartsheets/sheet1.xml': '<chartsheet/>',
      },
    });
    expect(await rawRowsOf(file)).toEqual([
      { sheet: 'spans', rowNumber: 1, cells: [{ column: 1, value: 2 }] },
      { sheet: 'girders & more', rowNumber: 1, cells: [{ column: 1, value: 1 }] },
    ]);
  });

  it('reads shared strings, custom date formats and the 1904 date system from their parts', async () => {
    const file = temp.file('styles-and-strings.xlsx');
    // 2019-05-14 is serial 43599 in the 1900 system, 42137 in the 1904 system (1462 days later, ECMA-376 Part 1, 18.17.4.1), hand check.
    const serial1904 = (Date.UTC(2019, 4, 14) - Date.UTC(1899, 11, 30)) / MS_PER_DAY - 1462;
    await writeWorkbook(file, {
      workbook:
        `<workbook xmlns="${MAIN_NS}" xmlns:r="${REL_NS}"><workbookPr date1904="true"/>` +
        '<sheets><sheet name="Girders" sheetId="1" r:id="rId1"/></sheets></workbook>',
      relationships: relationshipsXml([
        ['rId1', 'worksheet', 'worksheets/sheet1.xml'],
        ['rId2', 'styles', 'styles.xml'],
        ['rId3', 'sharedStrings', '/xl/sharedStrings.xml'],
      ]),
      parts: {
        'xl/styles.xml':
          `<styleSheet xmlns="${MAIN_NS}"><numFmts count="2"><numFmt numFmtId="164" formatCode="yyyy\\-mm\\-dd"/>` +
          '<numFmt numFmtId="165" formatCode="0.0&quot; mm&quot;"/></numFmts>' +
          '<cellStyleXfs count="1"><xf numFmtId="14"/></cellStyleXfs>' +
          '<cellXfs count="4"><xf numFmtId="0"/><xf numFmtId="164" applyNumberFormat="1"/><xf numFmtId="165"/><xf numFmtId="22"/></cellXfs>' +
          '<dxfs count="1"><dxf><numFmt numFmtId="166" formatCode="yyyy"/></dxf></dxfs></styleSheet>',
        'xl/sharedStrings.xml':
          `<sst xmlns="${MAIN_NS}" count="3" uniqueCount="3"><si><t>cast_on</t></si>` +
          '<si><r><rPr><b/></rPr><t>Span </t></r><r><t xml:space="preserve">1 &amp; 2 </t></r></si><si/></sst>',
        'xl/worksheets/sheet1.xml': worksheetXml(
          '<row r="1"><c r="A1" t="s"><v>0</v></c><c r="B1" t="s"><v>1</v></c><c r="C1" t="s"><v>2</v></c></row>' +
            `<row r="2"><c r="A2" s="1"><v>${serial1904}</v></c><c r="B2" s="2"><v>${serial1904}</v></c><c r="C2" s="3"><v>${serial1904 + 0.5}</v></c></row>`,
        ),
      },
    });
    expect(await rawRowsOf(file)).toEqual([
      { sheet: 'Girders', rowNumber: 1, cells: [{ column: 1, value: 'cast_on' }, { column: 2, value: 'Span 1 & 2 ' }, { column: 3, value: '' }] },
      {
        sheet: 'Girders',
        rowNumber: 2,
        cells: [
          { column: 1, value: new Date(Date.UTC(2019, 4, 14)) },
          // A format with "mm" inside quotes shows millimetres, not months: the number stays a number.
          { column: 2, value: serial1904 },
          { column: 3, value: new Date(Date.UTC(2019, 4, 14, 12)) },
        ],
      },
    ]);
  });

  it('reads what exceljs writes: shared and rich text, dates, booleans and formula results of every type', async () => {
    const file = temp.file('exceljs-kinds.xlsx');
    const workbook = new ExcelJS.Workbook();
    const sheet = workbook.addWorksheet('Kinds');
    sheet.getRow(1).values = ['note', 'cast_on', 'exterior', 'label', 'is_long', 'double'];
    sheet.getCell('A2').value = { richText: [{ text: 'Bold ', font: { bold: true } }, { text: '& plain <text>' }] };
    sheet.getCell('B2').value = new Date(Date.UTC(2021, 0, 31));
    sheet.getCell('B2').numFmt = 'dd.mm.yyyy';
    sheet.getCell('C2').value = true;
    sheet.getCell('D2').value = { formula: 'A2&"!"', result: 'Bold & plain <text>!' };
    sheet.getCell('E2').value = { formula: 'F2>10', result: true };
    sheet.getCell('F2').value = { formula: '6*2', result: 12 };
    await workbook.xlsx.writeFile(file);
    expect(await readAllRows(file)).toEqual([
      {
        sheet: 'Kinds',
        rowNumber: 2,
        cells: {
          note: 'Bold & plain <text>',
          cast_on: new Date(Date.UTC(2021, 0, 31)),
          exterior: true,
          label: 'Bold & plain <text>!',
          is_long: true,
          double: 12,
        },
      },
    ]);
  });

  it('reads a hand-built workbook whose worksheet is stored uncompressed before its workbook part', async () => {
    const file = temp.file('stored-worksheet-first.xlsx');
    await writeSampleByHand(file, { partOptions: { deflate: false }, worksheetFirst: true });
    expect(await readAllRows(file)).toEqual(expectedSampleRows());
  });

  it('refuses a package without its workbook part as a workbook that could not be read completely', async () => {
    const file = temp.file('no-workbook.xlsx');
    const parts = minimalWorkbookParts('<row r="1"><c r="A1"><v>1</v></c></row>');
    await writeZip(file, [
      { name: '[Content_Types].xml', data: parts.contentTypes },
      { name: 'xl/worksheets/sheet1.xml', data: parts.sheet },
    ]);
    const error = await importFailure(rawRowsOf(file));
    expect(error).toMatchObject({ code: 'corrupt_file' });
    expect(error.message).toBe('The workbook could not be read completely; open and save it in a spreadsheet program, then upload it again');
  });

  it('refuses a sheet whose part is missing from the package', async () => {
    const file = temp.file('missing-sheet.xlsx');
    const parts = minimalWorkbookParts('');
    await writeZip(file, [
      { name: '[Content_Types].xml', data: parts.contentTypes },
      { name: 'xl/workbook.xml', data: parts.workbook },
      { name: 'xl/_rels/workbook.xml.rels', data: parts.workbookRels },
    ]);
    expect(await importFailure(rawRowsOf(file))).toMatchObject({ code: 'corrupt_file' });
  });

  it('refuses a worksheet whose XML is damaged, naming the part', async () => {
    const file = temp.file('damaged-xml.xlsx');
    const parts = minimalWorkbookParts('<row r="1"><c r="A1"><v>1</v></c>');
    await writeZip(file, [
      { name: '[Content_Types].xml', data: parts.contentTypes },
      { name: 'xl/workbook.xml', data: parts.workbook },
      { name: 'xl/_rels/workbook.xml.rels', data: parts.workbookRels },
      { name: 'xl/worksheets/sheet1.xml', data: parts.sheet.replace('</sheetData></worksheet>', '') },
    ]);
    const error = await importFailure(rawRowsOf(file));
    expect(error).toMatchObject({ code: 'corrupt_file' });
    expect(error.message).toContain('xl/worksheets/sheet1.xml');
  });
});
