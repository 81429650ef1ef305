/** Why a file could not be read; the import screen may branch on these, so keep them stable. */
export type ImportFileErrorCode =
  | 'unsupported_file'
  | 'corrupt_file'
  | 'file_too_large_uncompressed'
  | 'zip_bomb'
  | 'too_many_entries'
  | 'encrypted_file'
  | 'unsafe_entry_path'
  | 'too_many_rows'
  | 'formula_without_value'
  | 'cell_error'
  | 'bad_header'
  | 'value_without_header';

export interface ImportFileErrorOptions {
  readonly code: ImportFileErrorCode;
  /** Safe to show to the person importing: names the sheet, row and column, never a server path. */
  readonly message: string;
  readonly sheet?: string;
  /** Row number as the spreadsheet program shows it (1 = first row of the sheet or file). */
  readonly row?: number;
  /** Column letter for XLSX (`C`), header text for CSV when known, otherwise the column number. */
  readonly column?: string;
}

/** The one error the file readers throw on purpose: the file as a whole cannot be imported. */
export class ImportFileError extends Error {
  readonly code: ImportFileErrorCode;
  readonly sheet?: string;
  readonly row?: number;
  readonly column?: string;

  constructor({ code, message, sheet, row, column }: ImportFileErrorOptions) {
    super(message);
    this.name = 'ImportFileError';
    this.code = code;
    if (sheet !== undefined) this.sheet = sheet;
    if (row !== undefined) this.row = row;
    if (column !== undefined) this.column = column;
  }
}
