import type { RawRow } from './sheet-table';
import { SheetRowReader } from './xlsx-sheet-rows';
import { readWorkbookParts } from './xlsx-workbook-parts';
import { XmlScanner } from './xlsx-xml-scanner';
import { XlsxZipParts } from './xlsx-zip-parts';

/**
 * Streams every worksheet's rows, sheet after sheet in the workbook's tab order. Each worksheet part
 * is inflated and scanned chunk by chunk, so memory holds one chunk and one row besides the shared
 * strings and styles. Cells with a date format come back as dates; formulas give their stored result
 * and are never evaluated. Call only after `checkXlsxSafety` has passed the file.
 */
export async function* readXlsxRows(filePath: string): AsyncGenerator<RawRow> {
  const zip = await XlsxZipParts.open(filePath);
  try {
    const workbook = await readWorkbookParts(zip);
    for (const worksheet of workbook.worksheets) {
      const scanner = new XmlScanner(worksheet.partName);
      const rows = new SheetRowReader(scanner, worksheet.name, workbook);
      for await (const text of zip.textChunks(worksheet.entry, scanner)) {
        scanner.push(text);
        for (let row = rows.nextRow(); row !== undefined; row = rows.nextRow()) yield row;
      }
      scanner.finish();
      for (let row = rows.nextRow(); row !== undefined; row = rows.nextRow()) yield row;
    }
  } finally {
    await zip.close();
  }
}
