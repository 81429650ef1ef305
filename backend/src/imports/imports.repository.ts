import type { AnyConvertedRow, ImportCounts, ImportProblem, ImportState, ImportTemplateName } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';
import { inChunks } from '../db/many-created';
import { WritesInFlight } from '../db/writes-in-flight';

type Db = Database | Transaction;

export interface ImportRow {
  id: number;
  file_name: string;
  file_kind: 'csv' | 'xlsx';
  byte_size: number;
  content_sha256: string;
  state: ImportState;
  counts: Partial<Record<ImportTemplateName, ImportCounts>>;
  problem_count: number;
  uploaded_at: Date;
  uploaded_by_name: string | null;
  committed_at: Date | null;
  committed_by_name: string | null;
  uploaded_by: number | null;
  progress_done: number | null;
  progress_total: number | null;
  version: number;
}

function importsWithPeople(db: Db) {
  return db({ i: 'imports' })
    .leftJoin({ uploaded_by: 'users' }, 'uploaded_by.id', 'i.uploaded_by')
    .leftJoin({ committed_by: 'users' }, 'committed_by.id', 'i.committed_by')
    .select(
      'i.id',
      'i.file_name',
      'i.file_kind',
      'i.byte_size',
      'i.content_sha256',
      'i.state',
      'i.counts',
      'i.problem_count',
      'i.uploaded_at',
      'i.committed_at',
      'i.uploaded_by',
      'i.progress_done',
      'i.progress_total',
      'i.version',
      'uploaded_by.display_name as uploaded_by_name',
      'committed_by.display_name as committed_by_name',
    );
}

/** The import history, newest first. */
export async function findImports(db: Db, limit: number): Promise<ImportRow[]> {
  return importsWithPeople(db).orderBy([{ column: 'i.uploaded_at', order: 'desc' }, { column: 'i.id', order: 'desc' }]).limit(limit);
}

export async function findImportById(db: Db, id: number): Promise<ImportRow | undefined> {
  return importsWithPeople(db).where('i.id', id).first();
}

/** The problems found in an import, every one, in the order found. */
export async function findImportProblems(db: Db, id: number): Promise<ImportProblem[]> {
  const row = await db('imports').where({ id }).first('problems');
  return (row?.problems as ImportProblem[] | undefined) ?? [];
}

/** The committed import of a file with these bytes, if there is one. */
export async function findCommittedImportOfContent(db: Db, contentSha256: string): Promise<ImportRow | undefined> {
  return importsWithPeople(db).where({ 'i.content_sha256': contentSha256, 'i.state': 'committed' }).first();
}

export interface CheckedImportColumns {
  file_name: string;
  file_kind: 'csv' | 'xlsx';
  byte_size: number;
  content_sha256: string;
  counts: Partial<Record<ImportTemplateName, ImportCounts>>;
  problems: readonly ImportProblem[];
  rateable_girders: ReadonlySet<string>;
  /** How many girders the file gives each span, by span key (`spanKey`). */
  girders_per_span: ReadonlyMap<string, number>;
}

export async function insertCheckedImport(db: Db, columns: CheckedImportColumns, userId: number): Promise<number> {
  const [row] = await db('imports')
    .insert({
      ...columns,
      counts: JSON.stringify(columns.counts),
      problems: JSON.stringify(columns.problems),
      problem_count: columns.problems.length,
      rateable_girders: JSON.stringify([...columns.rateable_girders]),
      girders_per_span: JSON.stringify(Object.fromEntries(columns.girders_per_span)),
      uploaded_by: userId,
    })
    .returning('id');
  return (row as { id: number }).id;
}

/** Rows of one template per stored page: the commit holds one page in memory at a time. */
export const ROWS_PER_PAGE = 5000;

/** Where a page of checked rows is kept: a template's rows are numbered 0, 1, … in file order. */
export interface ImportRowPageKey {
  readonly template: ImportTemplateName;
  readonly page: number;
}

/** A checked row as its page keeps it: a girders row with its record's digest (`girderRecordDigest`) when the check worked one out. */
export type KeptRow = AnyConvertedRow & { readonly recordDigest?: string };

/**
 * The checked rows, each template's in file order, kept in pages so a commit writes exactly what
 * was checked; a girders row keeps the digest of its record (`recordDigests`).
 */
export async function insertImportRowPages(trx: Db, importId: number, rows: readonly AnyConvertedRow[], recordDigests: ReadonlyMap<AnyConvertedRow, string>): Promise<void> {
  const byTemplate = new Map<ImportTemplateName, KeptRow[]>();
  for (const row of rows) {
    const recordDigest = recordDigests.get(row);
    const kept: KeptRow = recordDigest === undefined ? row : { ...row, recordDigest };
    const ofTemplate = byTemplate.get(row.template);
    if (ofTemplate) ofTemplate.push(kept);
    else byTemplate.set(row.template, [kept]);
  }
  // Each page is sent without waiting for the one before: the next is made into JSON while the database stores this one.
  const writes = new WritesInFlight();
  try {
    for (const [template, ofTemplate] of byTemplate) {
      let page = 0;
      for (const chunk of inChunks(ofTemplate, ROWS_PER_PAGE)) {
        writes.send(trx('import_row_pages').insert({ import_id: importId, template, page, row_count: chunk.length, rows: JSON.stringify(chunk) }));
        await writes.letThemGo();
        page += 1;
      }
    }
  } finally {
    await writes.drain();
  }
}

/** The pages of an import's checked rows, by template and page. */
export async function findImportRowPageKeys(db: Db, importId: number): Promise<(ImportRowPageKey & { rowCount: number })[]> {
  return db('import_row_pages').where({ import_id: importId }).orderBy(['template', 'page']).select('template', 'page', 'row_count as rowCount');
}

export async function findImportRowPage(db: Db, importId: number, { template, page }: ImportRowPageKey): Promise<KeptRow[]> {
  const row = await db('import_row_pages').where({ import_id: importId, template, page }).first('rows');
  return (row?.rows as KeptRow[] | undefined) ?? [];
}

/** What the import's check kept for its commit: digests of the girders the engine passed, and the file's girders per span (null for a check kept before it was). */
export async function findKeptByCheck(db: Db, importId: number): Promise<{ rateableGirders: Set<string>; girdersPerSpan: Map<string, number> | null }> {
  const row = (await db('imports').where({ id: importId }).first('rateable_girders', 'girders_per_span')) as { rateable_girders: string[] | null; girders_per_span: Record<string, number> | null } | undefined;
  return {
    rateableGirders: new Set(row?.rateable_girders ?? []),
    girdersPerSpan: row?.girders_per_span ? new Map(Object.entries(row.girders_per_span)) : null,
  };
}

/** What the check kept for the commit — the rows, the girders passed — once the import is committed or set aside. */
export async function forgetCheckedRows(db: Db, importId: number): Promise<void> {
  await db('import_row_pages').where({ import_id: importId }).delete();
  await db('imports').where({ id: importId }).update({ rateable_girders: null, girders_per_span: null });
}

/** The import row locked for a step, with who uploaded it. */
export async function findImportForStep(trx: Transaction, id: number): Promise<Pick<ImportRow, 'id' | 'state' | 'version' | 'uploaded_by' | 'problem_count' | 'content_sha256' | 'byte_size'> | undefined> {
  return trx({ i: 'imports' }).where('i.id', id).forUpdate().first('i.id', 'i.state', 'i.version', 'i.uploaded_by', 'i.problem_count', 'i.content_sha256', 'i.byte_size');
}

export interface ImportStepColumns {
  state: ImportState;
  committed?: boolean;
  problems?: readonly ImportProblem[];
  progress?: { done: number; total: number } | null;
}

export async function updateImportState(db: Db, id: number, step: ImportStepColumns, userId: number): Promise<void> {
  await db('imports')
    .where({ id })
    .update({
      state: step.state,
      ...(step.committed ? { committed_by: userId, committed_at: db.fn.now() } : {}),
      ...(step.problems ? { problems: JSON.stringify(step.problems), problem_count: step.problems.length } : {}),
      ...(step.progress !== undefined ? { progress_done: step.progress?.done ?? null, progress_total: step.progress?.total ?? null } : {}),
      version: db.raw('version + 1'),
      updated_at: db.fn.now(),
    });
}

/** Rows written so far by a commit in the background, written outside its transaction so others see it, while it is still running. */
export async function updateImportProgress(db: Db, id: number, done: number, total: number): Promise<void> {
  await db('imports').where({ id, state: 'committing' }).update({ progress_done: done, progress_total: total });
}

export async function countImportRows(db: Db, importId: number): Promise<number> {
  const [row] = await db('import_row_pages').where({ import_id: importId }).sum<{ sum: string | null }[]>('row_count as sum');
  return Number(row?.sum ?? 0);
}
