import type { ImportCounts, ImportProblem, ImportState, ImportTemplateName } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';

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
}

export async function insertCheckedImport(db: Db, columns: CheckedImportColumns, userId: number): Promise<number> {
  const [row] = await db('imports')
    .insert({ ...columns, counts: JSON.stringify(columns.counts), problems: JSON.stringify(columns.problems), problem_count: columns.problems.length, uploaded_by: userId })
    .returning('id');
  return (row as { id: number }).id;
}
