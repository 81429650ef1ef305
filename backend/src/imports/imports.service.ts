import { IMPORT_PROBLEMS_LISTED, type ImportDetail, type ImportProblem, type ImportSummary, type ImportTemplateName, type SignedInUser } from '../../../shared/src';
import { recordAuditEvent } from '../audit/audit-events';
import type { Database } from '../db/database';
import { AppError } from '../http/app-error';
import { judgeAgainstRegister, readAndConvert } from './import-check';
import { contentSha256, type ReceivedImportFile } from './import-upload';
import { findCommittedImportOfContent, findImportById, findImportProblems, findImports, insertCheckedImport, type ImportRow } from './imports.repository';
import { detectFileKind } from './readers/file-kind';
import { ImportFileError, type ImportFileErrorCode } from './readers/import-file-error';

interface Reader {
  readonly db: Database;
}
interface Writer extends Reader {
  readonly user: SignedInUser;
}

const HISTORY_LENGTH = 200;

function toSummary(row: ImportRow): ImportSummary {
  return {
    id: row.id,
    fileName: row.file_name,
    fileKind: row.file_kind,
    byteSize: row.byte_size,
    contentSha256: row.content_sha256,
    state: row.state,
    counts: row.counts,
    problemCount: row.problem_count,
    uploaded: { at: row.uploaded_at.toISOString(), by: row.uploaded_by_name },
    committed: row.committed_at ? { at: row.committed_at.toISOString(), by: row.committed_by_name } : null,
  };
}

async function toDetail(db: Database, row: ImportRow): Promise<ImportDetail> {
  const problems = await findImportProblems(db, row.id);
  return { ...toSummary(row), problems: problems.slice(0, IMPORT_PROBLEMS_LISTED), problemsTruncated: problems.length > IMPORT_PROBLEMS_LISTED };
}

/** File-level refusals of the readers as the API's errors: what the file is not, or why it is too big to open. */
const STATUS_OF: Readonly<Partial<Record<ImportFileErrorCode, number>>> = {
  unsupported_file: 415,
  file_too_large_uncompressed: 413,
  zip_bomb: 413,
  too_many_entries: 413,
  too_many_rows: 413,
};

function unreadableFile(error: ImportFileError): AppError {
  const status = STATUS_OF[error.code] ?? 400;
  const code = status === 415 ? 'unsupported_media_type' : status === 413 ? 'payload_too_large' : 'validation_failed';
  return new AppError({ code, status, message: error.message, details: { fields: [{ field: 'file', message: error.message }], reason: error.code } });
}

/** A reader's refusal at a place in the file (a formula without its value, a bad header) is one more problem of the check; reading stops there. */
function problemOf(error: ImportFileError): ImportProblem {
  return { sheet: error.sheet!, row: error.row ?? 0, column: error.column ?? '', value: null, message: `${error.message} (the file was read no further)` };
}

async function readFile(file: ReceivedImportFile, fileKind: 'csv' | 'xlsx') {
  const csvTemplate: ImportTemplateName | null = fileKind === 'csv' ? (file.template ?? templateFromName(file.fileName)) : null;
  if (fileKind === 'csv' && csvTemplate === null) {
    throw AppError.invalidFields([{ field: 'template', message: 'a CSV file holds one template: choose which, or name the file after it (structures.csv, spans.csv, …)' }]);
  }
  try {
    return await readAndConvert(file.filePath, csvTemplate);
  } catch (error) {
    if (!(error instanceof ImportFileError)) throw error;
    if (error.sheet === undefined) throw unreadableFile(error);
    return { rows: [], problems: [problemOf(error)] };
  }
}

function templateFromName(fileName: string): ImportTemplateName | null {
  const stem = fileName.replace(/\.[^.]*$/, '').trim().toLowerCase().replace(/[ _]/g, '-');
  return (['structures', 'spans', 'girders', 'strand-rows', 'findings', 'prior-ratings'] as const).find((name) => stem === name) ?? null;
}

/**
 * `POST /api/imports`: reads the uploaded file, checks every row against its template, the file
 * against itself and the register, and keeps the check in the history. Nothing in the register
 * is written. A file whose bytes were imported before is refused, naming that import.
 */
export async function checkImport({ db, user }: Writer, file: ReceivedImportFile): Promise<ImportDetail> {
  const sha256 = await contentSha256(file.filePath);
  const earlier = await findCommittedImportOfContent(db, sha256);
  if (earlier) {
    throw new AppError({
      code: 'already_exists',
      status: 409,
      message: `This file was imported already: import ${earlier.id} of ${earlier.uploaded_at.toISOString().slice(0, 10)} by ${earlier.committed_by_name ?? 'someone'} holds the same bytes`,
      details: { importId: earlier.id, fields: [{ field: 'file', message: 'imported already' }] },
    });
  }
  let fileKind: 'csv' | 'xlsx';
  try {
    fileKind = await detectFileKind(file.filePath);
  } catch (error) {
    if (error instanceof ImportFileError) throw unreadableFile(error);
    throw error;
  }
  const read = await readFile(file, fileKind);
  const judged = await judgeAgainstRegister(db, user, read.rows);
  const problems = [...read.problems, ...judged.problems];
  const id = await insertCheckedImport(db, { file_name: file.fileName, file_kind: fileKind, byte_size: file.byteSize, content_sha256: sha256, counts: judged.counts, problems }, user.id);
  await recordAuditEvent({ db, user, action: 'import.checked', entity: { type: 'import', id }, after: { fileName: file.fileName, contentSha256: sha256, counts: judged.counts, problemCount: problems.length } });
  return toDetail(db, (await findImportById(db, id))!);
}

export async function listImports({ db }: Reader): Promise<ImportSummary[]> {
  return (await findImports(db, HISTORY_LENGTH)).map(toSummary);
}

export async function getImport({ db }: Reader, id: number): Promise<ImportDetail> {
  const row = await findImportById(db, id);
  if (!row) throw AppError.notFound(`There is no import with id ${id}`);
  return toDetail(db, row);
}

/** A CSV cell: quoted when it holds a separator, a quote or a line end; a leading formula sign is defused. */
function csvCell(value: string | number | boolean | null): string {
  const text = value === null ? '' : String(value);
  const safe = /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** `GET /api/imports/:id/problems.csv`: every problem of the import, a line each, to fix the file by. */
export async function importProblemsCsv({ db }: Reader, id: number): Promise<{ fileName: string; csv: string }> {
  const row = await findImportById(db, id);
  if (!row) throw AppError.notFound(`There is no import with id ${id}`);
  const problems = await findImportProblems(db, id);
  const lines = [['sheet', 'row', 'column', 'value', 'problem'].join(','), ...problems.map((p) => [p.sheet, p.row, p.column, p.value, p.message].map(csvCell).join(','))];
  return { fileName: `import-${id}-problems.csv`, csv: `${lines.join('\r\n')}\r\n` };
}
