import { open } from 'node:fs/promises';
import { ImportFileError } from './import-file-error';
import { readBytes, readZipDirectory, type ZipEntry } from './zip-directory';

export type FileKind = 'csv' | 'xlsx';

/** Enough of the start of a file to tell its kind and to see whether text is UTF-8. */
const SNIFF_BYTES = 64 * 1024;

interface KnownMagic {
  readonly bytes: readonly number[];
  readonly what: string;
}

/** Formats people upload by mistake, recognised by their first bytes so the message can name them. */
const OTHER_FORMATS: readonly KnownMagic[] = [
  {
    bytes: [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1],
    what: 'a legacy Excel workbook (.xls) or a password-protected workbook: save it as .xlsx without a password, or as CSV',
  },
  { bytes: [0x25, 0x50, 0x44, 0x46, 0x2d], what: 'a PDF document' },
  { bytes: [0x1f, 0x8b], what: 'a gzip archive' },
  { bytes: [0x52, 0x61, 0x72, 0x21], what: 'a RAR archive' },
  { bytes: [0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c], what: 'a 7-Zip archive' },
  { bytes: [0x89, 0x50, 0x4e, 0x47], what: 'a PNG image' },
  { bytes: [0xff, 0xd8, 0xff], what: 'a JPEG image' },
  { bytes: [0xff, 0xfe], what: 'UTF-16 text: save the CSV as UTF-8' },
  { bytes: [0xfe, 0xff], what: 'UTF-16 text: save the CSV as UTF-8' },
];

const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04];
const EMPTY_ZIP_MAGIC = [0x50, 0x4b, 0x05, 0x06];
const UTF8_BOM = [0xef, 0xbb, 0xbf];

/** Tells CSV from XLSX by the file's content, whatever its name says; throws `unsupported_file` for anything else. */
export async function detectFileKind(filePath: string): Promise<FileKind> {
  const file = await open(filePath, 'r');
  try {
    const { size } = await file.stat();
    const start = await readBytes(file, 0, Math.min(size, SNIFF_BYTES));
    if (start.length === 0) throw unsupported('an empty file');
    if (startsWith(start, ZIP_MAGIC)) {
      const { entries } = await readZipDirectory(file, size);
      return kindOfZip(entries);
    }
    if (startsWith(start, EMPTY_ZIP_MAGIC)) throw unsupported('an empty zip archive');
    const other = OTHER_FORMATS.find((format) => startsWith(start, format.bytes));
    if (other) throw unsupported(other.what);
    checkLooksLikeText(start, size > start.length);
    return 'csv';
  } finally {
    await file.close();
  }
}

function kindOfZip(entries: readonly ZipEntry[]): FileKind {
  const names = new Set(entries.map((entry) => entry.name));
  if (names.has('[Content_Types].xml') && names.has('xl/workbook.xml')) return 'xlsx';
  if (names.has('xl/workbook.bin')) throw unsupported('an Excel binary workbook (.xlsb): save it as .xlsx or CSV');
  if (names.has('word/document.xml')) throw unsupported('a Word document');
  if (names.has('ppt/presentation.xml')) throw unsupported('a PowerPoint presentation');
  if (names.has('mimetype') && names.has('content.xml')) {
    throw unsupported('an OpenDocument file (such as .ods): save it as .xlsx or CSV');
  }
  throw unsupported('a zip archive that holds no Excel workbook');
}

/**
 * CSV must be UTF-8 text without NUL bytes. Only the start is checked here; the CSV reader checks the
 * rest as it streams. `truncated` allows a character cut in half at the end of the sample.
 */
function checkLooksLikeText(start: Buffer, truncated: boolean): void {
  if (start.includes(0)) throw unsupported('a binary file, not CSV text');
  const text = startsWith(start, UTF8_BOM) ? start.subarray(UTF8_BOM.length) : start;
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(text, { stream: truncated });
  } catch {
    throw unsupported('text that is not UTF-8: save the CSV as UTF-8');
  }
}

function startsWith(buffer: Buffer, magic: readonly number[]): boolean {
  return buffer.length >= magic.length && magic.every((byte, index) => buffer[index] === byte);
}

function unsupported(what: string): ImportFileError {
  return new ImportFileError({
    code: 'unsupported_file',
    message: `The file is ${what}. Upload a CSV (UTF-8) or an Excel workbook (.xlsx).`,
  });
}
