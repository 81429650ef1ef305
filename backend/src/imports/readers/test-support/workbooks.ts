import ExcelJS from 'exceljs';
import { writeZip, type ZipPartOptions } from './zip-writer';

/** Invented girder rows (not engineering data): text, numbers, a date, a boolean and a formula with its stored result. */
export const SAMPLE_HEADER = ['girder_key', 'span_length_m', 'cast_on', 'strand_count', 'is_exterior', 'double_length_m'];
export const SAMPLE_ROWS = [
  { rowNumber: 2, values: ['G-1', 24.5, new Date(Date.UTC(2019, 4, 14)), 12, true, 49] },
  // Row 3 is left empty on purpose: readers skip it and keep the spreadsheet's row numbers.
  { rowNumber: 4, values: ['G-2', 30, new Date(Date.UTC(2020, 10, 2)), 16, false, 60] },
] as const;
export const SAMPLE_SHEET = 'Girders';

/** The rows `readRows` should give for the sample workbook, whoever wrote it. */
export function expectedSampleRows() {
  return SAMPLE_ROWS.map(({ rowNumber, values }) => ({
    sheet: SAMPLE_SHEET,
    rowNumber,
    cells: Object.fromEntries(SAMPLE_HEADER.map((name, index) => [name, values[index]])),
  }));
}

/** The sample written by exceljs, with the last column as a formula whose result is stored. */
export async function writeSampleWithExcelJs(filePath: string): Promise<void> {
  const workbook = new ExcelJS.Workbook();
  const sheet = workbook.addWorksheet(SAMPLE_SHEET);
  sheet.getRow(1).values = SAMPLE_HEADER;
  for (const { rowNumber, values } of SAMPLE_ROWS) {
    const [key, length, castOn, strands, exterior, doubled] = values;
    const row = sheet.getRow(rowNumber);
    row.values = [key, length, castOn, strands, exterior];
    row.getCell(3).numFmt = 'yyyy-mm-dd';
    row.getCell(6).value = { formula: `B${rowNumber}*2`, result: doubled };
  }
  await workbook.xlsx.writeFile(filePath);
}

/** A one-sheet workbook by exceljs whose cell C2 holds a formula never calculated (no stored result). */
export async function writeFormulaWithoutValue(filePath: string): Promise<void> {
  const workbook = new ExcelJS.Workbook();
  const sheet = workbook.addWorksheet('Spans');
  sheet.getRow(1).values = ['span_key', 'span_length_m', 'double_length_m'];
  sheet.getRow(2).values = ['S-1', 20];
  sheet.getCell('C2').value = { formula: 'B2*2' } as ExcelJS.CellFormulaValue;
  await workbook.xlsx.writeFile(filePath);
}

const MAIN_NS = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const REL_NS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const PACKAGE_REL_NS = 'http://schemas.openxmlformats.org/package/2006/relationships';
const XML_DECLARATION = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n';
const MS_PER_DAY = 24 * 60 * 60 * 1000;
/** Day 0 of the 1900 date system as spreadsheet programs count it (ECMA-376 Part 1, 18.17.4.1). */
const SERIAL_DAY_ZERO_MS = Date.UTC(1899, 11, 30);

/** The package parts every workbook needs; `sheetXml` becomes xl/worksheets/sheet1.xml. */
export function minimalWorkbookParts(sheetXml: string) {
  return {
    contentTypes:
      `${XML_DECLARATION}<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">` +
      '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>' +
      '<Default Extension="xml" ContentType="application/xml"/>' +
      '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>' +
      '<Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>' +
      '<Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>' +
      '</Types>',
    packageRels:
      `${XML_DECLARATION}<Relationships xmlns="${PACKAGE_REL_NS}">` +
      `<Relationship Id="rId1" Type="${REL_NS}/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
    workbook:
      `${XML_DECLARATION}<workbook xmlns="${MAIN_NS}" xmlns:r="${REL_NS}">` +
      `<sheets><sheet name="${SAMPLE_SHEET}" sheetId="1" r:id="rId1"/></sheets></workbook>`,
    workbookRels:
      `${XML_DECLARATION}<Relationships xmlns="${PACKAGE_REL_NS}">` +
      `<Relationship Id="rId1" Type="${REL_NS}/worksheet" Target="worksheets/sheet1.xml"/>` +
      `<Relationship Id="rId2" Type="${REL_NS}/styles" Target="styles.xml"/></Relationships>`,
    // Style 1 uses built-in number format 14, the short date every spreadsheet program knows.
    styles:
      `${XML_DECLARATION}<styleSheet xmlns="${MAIN_NS}">` +
      '<fonts count="1"><font><sz val="11"/><name val="Calibri"/></font></fonts>' +
      '<fills count="1"><fill><patternFill patternType="none"/></fill></fills>' +
      '<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders>' +
      '<cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs>' +
      '<cellXfs count="2"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/>' +
      '<xf numFmtId="14" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/></cellXfs>' +
      '</styleSheet>',
    sheet: `${XML_DECLARATION}<worksheet xmlns="${MAIN_NS}"><sheetData>${sheetXml}</sheetData></worksheet>`,
  };
}

function inlineText(ref: string, text: string): string {
  return `<c r="${ref}" t="inlineStr"><is><t>${text}</t></is></c>`;
}

function sampleSheetXml(): string {
  const header = SAMPLE_HEADER.map((name, index) => inlineText(`${'ABCDEF'[index]}1`, name)).join('');
  const rows = SAMPLE_ROWS.map(({ rowNumber: r, values }) => {
    const [key, length, castOn, strands, exterior, doubled] = values;
    const serial = (castOn.getTime() - SERIAL_DAY_ZERO_MS) / MS_PER_DAY;
    return (
      `<row r="${r}">${inlineText(`A${r}`, key)}<c r="B${r}"><v>${length}</v></c>` +
      `<c r="C${r}" s="1"><v>${serial}</v></c><c r="D${r}"><v>${strands}</v></c>` +
      `<c r="E${r}" t="b"><v>${exterior ? 1 : 0}</v></c><c r="F${r}"><f>B${r}*2</f><v>${doubled}</v></c></row>`
    );
  });
  return `<row r="1">${header}</row>${rows.join('')}`;
}

/**
 * The same sample as a different program might write it: inline strings instead of a shared-string
 * table, the worksheet stored before the workbook part, sizes in the local headers.
 */
export async function writeSampleByHand(
  filePath: string,
  { partOptions = {}, worksheetFirst = true }: { partOptions?: ZipPartOptions; worksheetFirst?: boolean } = {},
): Promise<void> {
  const parts = minimalWorkbookParts(sampleSheetXml());
  const worksheet = { name: 'xl/worksheets/sheet1.xml', data: parts.sheet, options: partOptions };
  await writeZip(filePath, [
    { name: '[Content_Types].xml', data: parts.contentTypes, options: partOptions },
    { name: '_rels/.rels', data: parts.packageRels, options: partOptions },
    ...(worksheetFirst ? [worksheet] : []),
    { name: 'xl/workbook.xml', data: parts.workbook, options: partOptions },
    { name: 'xl/_rels/workbook.xml.rels', data: parts.workbookRels, options: partOptions },
    { name: 'xl/styles.xml', data: parts.styles, options: partOptions },
    ...(worksheetFirst ? [] : [worksheet]),
  ]);
}
