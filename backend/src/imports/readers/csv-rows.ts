import { createReadStream } from 'node:fs';
import { open } from 'node:fs/promises';
import { Transform, type TransformCallback } from 'node:stream';
import { parse, CsvError } from 'csv-parse';
import { ImportFileError } from './import-file-error';
import { readBytes } from './zip-directory';
import type { RawRow } from './sheet-table';

export type CsvDelimiter = ',' | ';';

/** A record longer than this has lost its line ends or its closing quote; stop before it fills memory. */
const MAX_RECORD_CHARACTERS = 1024 * 1024;
const HEADER_SAMPLE_BYTES = 64 * 1024;

/** Streams a UTF-8 CSV file's records as raw rows of one sheet; row numbers count records, header = 1. */
export async function* readCsvRows(
  filePath: string,
  sheet: string,
  delimiter: CsvDelimiter | 'auto',
): AsyncGenerator<RawRow> {
  const chosen = delimiter === 'auto' ? await detectDelimiter(filePath) : delimiter;
  const source = createReadStream(filePath);
  const decoder = utf8Text();
  const parser = source.pipe(decoder).pipe(
    parse({
      delimiter: chosen,
      bom: true,
      // Rows shorter or longer than the header are the header check's business, with a clearer message.
      relax_column_count: true,
      // `12" girder` in an unquoted field is common in hand-typed sheets.
      relax_quotes: true,
      skip_empty_lines: false,
      max_record_size: MAX_RECORD_CHARACTERS,
    }),
  );
  // pipe() does not pass errors on: hand them to the parser, whose iteration then throws them.
  source.on('error', (error) => parser.destroy(error));
  decoder.on('error', (error) => parser.destroy(error));
  let rowNumber = 0;
  try {
    for await (const record of parser as AsyncIterable<string[]>) {
      rowNumber += 1;
      yield { sheet, rowNumber, cells: record.map((value, index) => ({ column: index + 1, value: value === '' ? null : value })) };
    }
  } catch (error) {
    throw asImportError(error, sheet, rowNumber + 1);
  } finally {
    source.destroy();
  }
}

/** `;` when the header line holds more semicolons than commas outside quotes (spreadsheets in decimal-comma locales). */
export async function detectDelimiter(filePath: string): Promise<CsvDelimiter> {
  const file = await open(filePath, 'r');
  try {
    const sample = (await readBytes(file, 0, HEADER_SAMPLE_BYTES)).toString('utf8');
    let inQuotes = false;
    let commas = 0;
    let semicolons = 0;
    for (const character of sample) {
      if (character === '"') inQuotes = !inQuotes;
      else if (!inQuotes && (character === '\n' || character === '\r')) break;
      else if (!inQuotes && character === ',') commas += 1;
      else if (!inQuotes && character === ';') semicolons += 1;
    }
    return semicolons > commas ? ';' : ',';
  } finally {
    await file.close();
  }
}

/** Decodes UTF-8 strictly (a leading BOM is dropped) and refuses NUL bytes anywhere in the file. */
function utf8Text(): Transform {
  const decoder = new TextDecoder('utf-8', { fatal: true });
  const decode = (chunk: Buffer | undefined, done: TransformCallback, stream: boolean) => {
    let text: string;
    try {
      text = decoder.decode(chunk, { stream });
    } catch {
      done(notText('text that is not UTF-8: save the CSV as UTF-8'));
      return;
    }
    if (text.includes('\0')) done(notText('a binary file, not CSV text'));
    else done(null, text);
  };
  return new Transform({
    transform: (chunk: Buffer, _encoding, done) => decode(chunk, done, true),
    flush: (done) => decode(undefined, done, false),
  });
}

function notText(what: string): ImportFileError {
  return new ImportFileError({
    code: 'unsupported_file',
    message: `The file is ${what}. Upload a CSV (UTF-8) or an Excel workbook (.xlsx).`,
  });
}

function asImportError(error: unknown, sheet: string, row: number): unknown {
  if (error instanceof CsvError) {
    return new ImportFileError({ code: 'corrupt_file', message: `The CSV cannot be read near row ${row}: ${error.message}`, sheet, row });
  }
  return error;
}
