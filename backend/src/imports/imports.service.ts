import { IMPORT_PROBLEMS_LISTED, IMPORT_STATE_NAMES, templateOfFileName, type ImportDetail, type ImportProblem, type ImportSummary, type ImportTemplateName, type SignedInUser } from '../../../shared/src';
import { recordAuditEvent } from '../audit/audit-events';
import { withTransaction, type Database, type Transaction } from '../db/database';
import { AppError } from '../http/app-error';
import type { BackgroundJobs } from '../jobs/background-jobs';
import { toSignedInUser } from '../auth/auth.service';
import { findUserById } from '../users/users.repository';
import { inFileOrder, judgeAgainstRegister, readAndConvert, withRefusedRows, type UploadJudgement } from './import-check';
import { contentSha256, type ReceivedImportFile } from './import-upload';
import { writeRows, type CheckedRows, type CommitProgress } from './import-commit';
import {
  countImportRows,
  findCommittedImportOfContent,
  findImportById,
  findImportForStep,
  findImportProblems,
    findImportRowPage,
  findImportRowPageKeys,
  findImports,
  forgetCheckedRows,
  findKeptByCheck,
  insertCheckedImport,
  insertImportRowPages,
  updateImportProgress,
  updateImportState,
  type ImportRow,
} from './imports.repository';
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
  const progress = row.progress_done !== null && row.progress_total !== null ? { done: row.progress_done, total: row.progress_total } : null;
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
    progress: row.state === 'committing' ? progress : null,
    version: row.version,
  };
}

/** Only the uploader takes an import further: commits a clean check, or sets it aside. */
function allowedSteps(row: Pick<ImportRow, 'state' | 'uploaded_by' | 'problem_count'>, user: SignedInUser | null): ImportDetail['allowed'] {
  const own = user !== null && row.uploaded_by === user.id && row.state === 'checked';
  return { commit: own && row.problem_count === 0, discard: own };
}

async function toDetail(db: Database, row: ImportRow, user: SignedInUser | null): Promise<ImportDetail> {
  const problems = await findImportProblems(db, row.id);
  return { ...toSummary(row), problems: problems.slice(0, IMPORT_PROBLEMS_LISTED), problemsTruncated: problems.length > IMPORT_PROBLEMS_LISTED, allowed: allowedSteps(row, user) };
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
  const csvTemplate: ImportTemplateName | null = fileKind === 'csv' ? (file.template ?? templateOfFileName(file.fileName)) : null;
  if (fileKind === 'csv' && csvTemplate === null) {
    throw AppError.invalidFields([{ field: 'template', message: 'a CSV file holds one template: choose which, or name the file after it (structures.csv, spans.csv, …)' }]);
  }
  try {
    return await readAndConvert(file.filePath, csvTemplate);
  } catch (error) {
    if (!(error instanceof ImportFileError)) throw error;
    if (error.sheet === undefined) throw unreadableFile(error);
    return { rows: [], problems: [problemOf(error)], sheets: [], fileRows: new Map() };
  }
}

/**
 * `POST /api/imports`: reads the uploaded file, checks every row against its template, the file
 * against itself and the register, and keeps the check in the history. Nothing in the register
 * is written. A file whose bytes were imported before is refused, naming that import.
 */
export async function checkImport({ db, user }: Writer, file: ReceivedImportFile): Promise<ImportDetail> {
  const sha256 = await contentSha256(file.filePath);
  const earlier = await findCommittedImportOfContent(db, sha256);
  if (earlier) throw importedBefore(earlier);
  let fileKind: 'csv' | 'xlsx';
  try {
    fileKind = await detectFileKind(file.filePath);
  } catch (error) {
    if (error instanceof ImportFileError) throw unreadableFile(error);
    throw error;
  }
  const read = await readFile(file, fileKind);
  const judged = await judgeAgainstRegister(db, user, read.rows);
  const problems = inFileOrder([...read.problems, ...judged.problems], read.sheets);
  const counts = withRefusedRows(judged.counts, problems, read.fileRows);
  const id = await withTransaction(db, async (trx) => {
    const inserted = await insertCheckedImport(trx, { file_name: file.fileName, file_kind: fileKind, byte_size: file.byteSize, content_sha256: sha256, counts, problems, ...keptForCommit(problems.length === 0 ? judged : null) }, user.id);
    // Only a clean check can be committed, so only then are its rows worth keeping.
    if (problems.length === 0) await insertImportRowPages(trx, inserted, read.rows, judged.recordDigests);
    await recordAuditEvent({ db: trx, user, action: 'import.checked', entity: { type: 'import', id: inserted }, after: { fileName: file.fileName, contentSha256: sha256, counts, problemCount: problems.length } });
    return inserted;
  });
  return toDetail(db, (await findImportById(db, id))!, user);
}

/** What a clean check keeps for its commit besides the rows; a check with problems cannot be committed, so it keeps nothing. */
function keptForCommit(judged: UploadJudgement | null) {
  return { rateable_girders: judged?.rateableGirders ?? new Set<string>(), girders_per_span: judged?.girdersPerSpan ?? new Map<string, number>() };
}

function importedBefore(earlier: ImportRow): AppError {
  return new AppError({
    code: 'already_exists',
    status: 409,
    message: `This file was imported already: import ${earlier.id} of ${earlier.uploaded_at.toISOString().slice(0, 10)} by ${earlier.committed_by_name ?? 'someone'} holds the same bytes`,
    details: { importId: earlier.id, fields: [{ field: 'file', message: 'imported already' }] },
  });
}

/** The import locked for a step by its uploader, at the version read. */
async function importForStep(trx: Transaction, user: SignedInUser, id: number, version: number) {
  const row = await findImportForStep(trx, id);
  if (!row) throw importNotFound(id);
  if (row.uploaded_by !== user.id) throw AppError.forbidden('Only the person who uploaded a file commits it or sets it aside');
  if (row.state !== 'checked') throw AppError.readOnly(`Import ${id} is ${IMPORT_STATE_NAMES[row.state].toLowerCase()}, not waiting to be imported`);
  if (row.version !== version) throw AppError.versionConflict(`Import ${id}`, await toDetail(trx, (await findImportById(trx, id))!, user));
  return row;
}

/** A fault injected between writing rows and finishing, for the test that a failed commit leaves nothing behind. */
export interface CommitOptions {
  readonly afterRowsWritten?: () => void | Promise<void>;
}

/** Where a commit can be handed to the background, and from what file size it is. */
export interface CommitQueue {
  readonly jobs: BackgroundJobs;
  readonly backgroundFromBytes: number;
}

/**
 * `POST /api/imports/:id/commit`: writes the checked rows through the inventory services in one
 * transaction — every rule, right and history entry applies, and the spans touched become due
 * for re-rating — or nothing at all: a row refused now (the register moved on since the check)
 * fails the import with its problems. The same file's bytes are committed once: a second commit
 * of them, even at the same moment, is refused by the database. A file from the queue's size on
 * is committed by a background job: the import answers `committing` with its progress at once.
 */
export async function commitImport({ db, user, queue }: Writer & { queue?: CommitQueue }, id: number, version: number, options: CommitOptions = {}): Promise<ImportDetail> {
  let failure: ImportProblem[] = [];
  try {
    await withTransaction(db, async (trx) => {
      const row = await importForStep(trx, user, id, version);
      if (row.problem_count > 0) throw AppError.readOnly(`Import ${id} has problems: fix the file and upload it again`);
      if (queue && row.byte_size >= queue.backgroundFromBytes) return queueCommit(trx, queue.jobs, user, row);
      await writeCommit(db, trx, user, row, () => undefined, options);
    });
  } catch (error) {
    if (isUniqueViolation(error)) throw alreadyImported(id);
    if (!(error instanceof CommitRefused)) throw error;
    failure = error.problems;
    await markFailed(db, user, id, failure);
  }
  return toDetail(db, (await findImportById(db, id))!, user);
}

/** Hands the commit to a background job in the same transaction: the import is `committing` exactly when the job exists. */
async function queueCommit(trx: Transaction, jobs: BackgroundJobs, user: SignedInUser, row: { id: number }): Promise<void> {
  const total = await countImportRows(trx, row.id);
  await updateImportState(trx, row.id, { state: 'committing', progress: { done: 0, total } }, user.id);
  await jobs.send('import-commit', { importId: row.id, userId: user.id }, trx);
  await recordAuditEvent({ db: trx, user, action: 'import.queued', entity: { type: 'import', id: row.id }, after: { rows: total } });
}

/** The rows' writing and the import's `committed` state, inside the caller's transaction (`db` is its pool); refused rows throw `CommitRefused`. */
async function writeCommit(db: Database, trx: Transaction, user: SignedInUser, row: { id: number; content_sha256: string }, onProgress: CommitProgress, options: CommitOptions = {}): Promise<void> {
  // Commits of the same bytes take turns, so the second finds the first done and is refused.
  await trx.raw('select pg_advisory_xact_lock(hashtextextended(?, 0))', [row.content_sha256]);
  const earlier = await findCommittedImportOfContent(trx, row.content_sha256);
  if (earlier) throw importedBefore(earlier);
  const problems = await writeRows(trx, user, await checkedRowsOf(db, trx, row.id), onProgress);
  await options.afterRowsWritten?.();
  if (problems.length > 0) throw new CommitRefused(problems);
  // Written into the register, the rows as checked are of no further use.
  await forgetCheckedRows(trx, row.id);
  await updateImportState(trx, row.id, { state: 'committed', committed: true, progress: null }, user.id);
  await recordAuditEvent({ db: trx, user, action: 'import.committed', entity: { type: 'import', id: row.id }, after: { contentSha256: row.content_sha256 } });
}

/**
 * An import's checked rows, read from the database a page at a time as the commit asks for them,
 * with what its check kept. The pages are read on a connection of their own, the next one while
 * the commit writes the last: written once by the check, they do not change while the import is
 * locked for its commit, and reading them in the commit's transaction would wait for its writes.
 */
async function checkedRowsOf(db: Database, trx: Transaction, importId: number): Promise<CheckedRows> {
  const keys = await findImportRowPageKeys(trx, importId);
  const rowsOn = (pages: typeof keys) => pages.reduce((sum, key) => sum + key.rowCount, 0);
  return {
    total: rowsOn(keys),
    ...(await findKeptByCheck(trx, importId)),
    rowCountOf: (template) => rowsOn(keys.filter((key) => key.template === template)),
    pagesOf: (template) => pagesReadAhead(keys.filter((key) => key.template === template).map((key) => () => findImportRowPage(db, importId, key))),
  };
}

/** The pages in order, each asked for while the one before is in use. */
async function* pagesReadAhead<T>(reads: readonly (() => Promise<T>)[]): AsyncGenerator<T> {
  // Settled into a value or an error at once: a read that fails while its page is not yet wanted is not left unhandled.
  const started = (read: (() => Promise<T>) | undefined) => read?.().then((page) => ({ page }), (error: unknown) => ({ error }));
  let next = started(reads[0]);
  for (let at = 0; at < reads.length; at += 1) {
    const read = (await next)!;
    if ('error' in read) throw read.error;
    next = started(reads[at + 1]);
    yield read.page;
  }
}

async function markFailed(db: Database, user: SignedInUser, id: number, problems: readonly ImportProblem[]): Promise<void> {
  await updateImportState(db, id, { state: 'failed', problems, progress: null }, user.id);
  await recordAuditEvent({ db, user, action: 'import.failed', entity: { type: 'import', id }, after: { problemCount: problems.length } });
}

/** The progress a background commit shows is written at most this often: each write is a round trip outside the commit's transaction. */
const PROGRESS_EVERY_MS = 250;

/**
 * The background job of a large commit: the same writing as a commit in the request, by the
 * uploader, with its progress written outside the transaction so the Imports screen can show
 * it. Anything that stops it fails the import with the reason; nothing of it is kept. A job
 * given again after its server died finds the import still `committing` and starts over.
 */
export async function runQueuedCommit(db: Database, { importId, userId }: { importId: number; userId: number }): Promise<void> {
  const row = await findImportById(db, importId);
  const userRow = await findUserById(db, userId);
  if (!row || row.state !== 'committing' || !userRow) return;
  const user = toSignedInUser(userRow);
  let lastWritten = 0;
  const onProgress: CommitProgress = async (done, total) => {
    if (Date.now() - lastWritten < PROGRESS_EVERY_MS && done < total) return;
    lastWritten = Date.now();
    await updateImportProgress(db, importId, done, total);
  };
  try {
    await withTransaction(db, (trx) => writeCommit(db, trx, user, row, onProgress));
  } catch (error) {
    await markFailed(db, user, importId, problemsOfStoppedCommit(error));
  }
}

/** Why a background commit stopped, as the import's problems: the refused rows, or one line saying what stopped it. */
function problemsOfStoppedCommit(error: unknown): ImportProblem[] {
  if (error instanceof CommitRefused) return error.problems;
  const message = isUniqueViolation(error)
    ? 'a file with the same bytes was imported at the same moment by another import'
    : error instanceof AppError
      ? error.message
      : `the commit stopped: ${error instanceof Error ? error.message : String(error)}`;
  return [{ sheet: '', row: 0, column: '', value: null, message: `${message}; nothing was written` }];
}

/** Rolls the commit's transaction back when rows were refused; the problems are kept outside it. */
class CommitRefused extends Error {
  constructor(readonly problems: ImportProblem[]) {
    super(`${problems.length} rows were refused`);
  }
}

const isUniqueViolation = (error: unknown) => (error as { code?: unknown } | null)?.code === '23505';

const alreadyImported = (id: number) =>
  new AppError({ code: 'already_exists', status: 409, message: `Import ${id} holds a file whose bytes were imported at the same moment by another import; nothing was written`, details: { fields: [{ field: 'file', message: 'imported already' }] } });

/** `POST /api/imports/:id/discard`: the uploader sets a checked import aside; it stays in the history. */
export async function discardImport({ db, user }: Writer, id: number, version: number): Promise<ImportDetail> {
  await withTransaction(db, async (trx) => {
    await importForStep(trx, user, id, version);
    await updateImportState(trx, id, { state: 'discarded' }, user.id);
    await forgetCheckedRows(trx, id);
    await recordAuditEvent({ db: trx, user, action: 'import.discarded', entity: { type: 'import', id } });
  });
  return toDetail(db, (await findImportById(db, id))!, user);
}

export async function listImports({ db }: Reader): Promise<ImportSummary[]> {
  return (await findImports(db, HISTORY_LENGTH)).map(toSummary);
}

const importNotFound = (id: number) => AppError.notFound(`There is no import with id ${id}`);

export async function getImport({ db, user }: Reader & { user: SignedInUser | null }, id: number): Promise<ImportDetail> {
  const row = await findImportById(db, id);
  if (!row) throw importNotFound(id);
  return toDetail(db, row, user);
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
