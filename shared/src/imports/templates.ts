import type { Workbook } from 'exceljs';
import { IMPORT_TEMPLATES, IMPORT_TEMPLATE_NAMES, siToUs, type ImportColumn, type ImportTemplateName } from './columns';
import { COLUMNS_SHEET_NAME } from './rights';

/**
 * The downloadable templates, written from the column definitions so they cannot drift from
 * them: CSV text for `data-import/templates/`, an XLSX workbook per template for the server,
 * and the column tables of `data-import/README.md`. Templates carry the SI headers; the US
 * customary headers are listed in the README and accepted on import.
 */

/** A CSV field, quoted when it holds a comma, a quote or a line break (RFC 4180). */
function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** The template as CSV: the header row and one example row, CRLF line ends as RFC 4180 has them. */
export function templateCsv(name: ImportTemplateName): string {
  const { columns } = IMPORT_TEMPLATES[name];
  const lines = [columns.map((column) => column.header), columns.map((column) => column.example)];
  return lines.map((cells) => cells.map(csvField).join(',')).join('\r\n') + '\r\n';
}

/** The example as a spreadsheet cell: numbers as numbers, everything else as text (dates stay YYYY-MM-DD text). */
function exampleCell(column: ImportColumn): string | number | null {
  if (column.example === '') return null;
  return column.type === 'number' || column.type === 'whole-number' ? Number(column.example) : column.example;
}

/**
 * Adds templates to an exceljs workbook the caller made (`new ExcelJS.Workbook()`), so that the
 * shared code does not load exceljs in the browser: for each, a sheet named after the template
 * with the header row and an example row; then one sheet `columns` describing every column of
 * them, which an upload skips.
 */
export function addTemplateSheets(workbook: Workbook, names: readonly ImportTemplateName[]): void {
  for (const name of names) addTemplateSheet(workbook, name);
  const about = workbook.addWorksheet(COLUMNS_SHEET_NAME);
  about.addRow(['sheet', 'column', 'required', 'unit', 'US customary column', 'description', 'example']).font = { bold: true };
  for (const name of names) {
    for (const column of IMPORT_TEMPLATES[name].columns) {
      about.addRow([name, column.header, column.required ? 'yes' : 'no', column.unit?.label ?? '', column.us?.header ?? '', column.description, column.example]);
    }
  }
}

function addTemplateSheet(workbook: Workbook, name: ImportTemplateName): void {
  const template = IMPORT_TEMPLATES[name];
  const sheet = workbook.addWorksheet(template.name);
  sheet.addRow(template.columns.map((column) => column.header)).font = { bold: true };
  sheet.addRow(template.columns.map(exampleCell));
  template.columns.forEach((column, index) => {
    const sheetColumn = sheet.getColumn(index + 1);
    sheetColumn.width = Math.max(12, column.header.length + 2);
    // Text columns keep what is typed: a structure number 0012 stays 0012, a date stays YYYY-MM-DD.
    if (column.type !== 'number' && column.type !== 'whole-number') sheetColumn.numFmt = '@';
  });
}

/** The example converted to US customary units, rounded for reading. */
function usExample(column: ImportColumn): string {
  if (column.us === null || column.example === '') return '';
  const values = column.example.split(';').map((item) => Number(siToUs(column, Number(item)).toPrecision(4)));
  return values.join(';');
}

const markdownCell = (text: string) => text.replaceAll('|', '\\|');

/** The README's table of one template's columns. */
export function templateColumnsMarkdown(name: ImportTemplateName): string {
  const template = IMPORT_TEMPLATES[name];
  const header = '| column | required | unit | rule | example | US customary column (example) |\n|---|---|---|---|---|---|';
  const rows = template.columns.map((column) => {
    const us = column.us === null ? '' : `\`${column.us.header}\` (${column.us.label}${usExample(column) === '' ? '' : `, ${usExample(column)}`})`;
    const example = column.example === '' ? '' : `\`${column.example}\``;
    return `| \`${column.header}\` | ${column.required ? 'yes' : ''} | ${column.unit?.label ?? ''} | ${markdownCell(column.description)} | ${example} | ${us} |`;
  });
  const keys = template.keyHeaders.map((header) => `\`${header}\``).join(' + ');
  return [`### ${template.title} — \`templates/${name}.csv\``, '', template.summary, '', `Key: ${keys}.`, '', header, ...rows].join('\n');
}

/** All the README's column tables, in template order. */
export function allColumnsMarkdown(): string {
  return IMPORT_TEMPLATE_NAMES.map(templateColumnsMarkdown).join('\n\n') + '\n';
}
