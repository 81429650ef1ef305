import { readFileSync } from 'node:fs';
import path from 'node:path';
import ExcelJS from 'exceljs';
import { IMPORT_TEMPLATES, IMPORT_TEMPLATE_NAMES } from './columns';
import { convertRow, readHeaders } from './rows';
import { addTemplateSheets, allColumnsMarkdown, templateCsv } from './templates';

const dataImport = path.resolve(__dirname, '../../../data-import');
const REGENERATE = 'run `node --import tsx scripts/write-import-templates.ts` and commit the result';

describe('the committed templates equal what the column definitions give', () => {
  it.each(IMPORT_TEMPLATE_NAMES)('data-import/templates/%s.csv', (name) => {
    const committed = readFileSync(path.join(dataImport, 'templates', `${name}.csv`), 'utf8');
    expect({ file: committed, hint: REGENERATE }).toEqual({ file: templateCsv(name), hint: REGENERATE });
  });

  it("data-import/README.md's column tables", () => {
    const readme = readFileSync(path.join(dataImport, 'README.md'), 'utf8');
    const tables = readme.split('<!-- columns: written by scripts/write-import-templates.ts -->\n')[1]?.split('<!-- end of columns -->')[0];
    expect({ tables, hint: REGENERATE }).toEqual({ tables: allColumnsMarkdown(), hint: REGENERATE });
  });

  it('every column of every template is in the README', () => {
    const readme = readFileSync(path.join(dataImport, 'README.md'), 'utf8');
    for (const column of IMPORT_TEMPLATE_NAMES.flatMap((name) => IMPORT_TEMPLATES[name].columns)) {
      expect(readme).toContain(`| \`${column.header}\` |`);
      if (column.us) expect(readme).toContain(`\`${column.us.header}\``);
    }
  });
});

describe('templateCsv', () => {
  it('writes the header row and the example row, quoting a field that holds a comma', () => {
    const lines = templateCsv('findings').split('\r\n');
    expect(lines[0]!.split(',')).toEqual(IMPORT_TEMPLATES.findings.columns.map((column) => column.header));
    expect(lines[1]!.endsWith(',"Cover spalled off, strands rusted"')).toBe(true);
    expect(lines).toHaveLength(3);
    expect(lines[2]).toBe('');
  });
});

describe('addTemplateSheets', () => {
  it.each(IMPORT_TEMPLATE_NAMES)('%s: the XLSX written and read back gives an example row that converts', async (name) => {
    const written = new ExcelJS.Workbook();
    addTemplateSheets(written, [name]);
    const buffer = await written.xlsx.writeBuffer();
    const read = new ExcelJS.Workbook();
    await read.xlsx.load(buffer as ArrayBuffer);

    const sheet = read.getWorksheet(name)!;
    const headers = (sheet.getRow(1).values as unknown[]).slice(1).map(String);
    expect(headers).toEqual(IMPORT_TEMPLATES[name].columns.map((column) => column.header));
    const cells = Object.fromEntries(headers.map((header, index) => [header, (sheet.getRow(2).getCell(index + 1).value ?? null) as string | number | null]));
    const result = convertRow(name, readHeaders(name, name, headers), { sheet: name, rowNumber: 2, cells });
    expect(result.ok).toBe(true);

    const about = read.getWorksheet('columns')!;
    expect(about.rowCount).toBe(IMPORT_TEMPLATES[name].columns.length + 1);
  });

  it('writes every template into one workbook, in the templates’ order, with one sheet describing all their columns', async () => {
    const written = new ExcelJS.Workbook();
    addTemplateSheets(written, IMPORT_TEMPLATE_NAMES);
    const read = new ExcelJS.Workbook();
    await read.xlsx.load((await written.xlsx.writeBuffer()) as ArrayBuffer);
    expect(read.worksheets.map((sheet) => sheet.name)).toEqual([...IMPORT_TEMPLATE_NAMES, 'columns']);
    const described = IMPORT_TEMPLATE_NAMES.reduce((sum, name) => sum + IMPORT_TEMPLATES[name].columns.length, 0);
    expect(read.getWorksheet('columns')!.rowCount).toBe(described + 1);
  });
});
