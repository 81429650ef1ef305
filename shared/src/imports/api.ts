import { z } from 'zod';
import type { ImportTemplateName } from './columns';
import type { ImportProblem } from './rows';

/**
 * What the imports API answers. An upload is checked first — every row of every sheet against
 * the templates, against each other and against the register — and the check is kept as an
 * import in the history with what it would create, change and leave alone.
 */

/**
 * checked: read and judged, nothing written; committing: being written (a large file, in the
 * background); committed: written in one transaction; failed: the write found problems and
 * wrote nothing; discarded: set aside by its uploader.
 */
export const IMPORT_STATES = ['checked', 'committing', 'committed', 'failed', 'discarded'] as const;
export type ImportState = (typeof IMPORT_STATES)[number];
export const IMPORT_STATE_NAMES: Readonly<Record<ImportState, string>> = {
  checked: 'Checked',
  committing: 'Importing',
  committed: 'Imported',
  failed: 'Not imported',
  discarded: 'Set aside',
};

/** How the rows of one template would land: new records, changed ones and ones already as the file says. */
export interface ImportCounts {
  /** Rows of the template that passed its columns' own checks and were judged against the register. */
  readonly rows: number;
  readonly create: number;
  readonly update: number;
  readonly unchanged: number;
  /**
   * Rows of the template with at least one problem at them — a cell its columns refuse, a rule of
   * the file or of the register — none of which a commit could write. Absent in checks kept
   * before it was counted.
   */
  readonly refused?: number;
  /** Data rows of the template in the file, whatever became of them. Absent in checks kept before it was counted, and when reading stopped at a row. */
  readonly fileRows?: number;
}

/** An import in the history. */
export interface ImportSummary {
  readonly id: number;
  readonly fileName: string;
  readonly fileKind: 'csv' | 'xlsx';
  readonly byteSize: number;
  /** SHA-256 of the file's bytes: the same file twice is recognised by it. */
  readonly contentSha256: string;
  readonly state: ImportState;
  readonly counts: Readonly<Partial<Record<ImportTemplateName, ImportCounts>>>;
  readonly problemCount: number;
  readonly uploaded: { readonly at: string; readonly by: string | null };
  readonly committed: { readonly at: string; readonly by: string | null } | null;
  /** Rows written so far while committing; null otherwise. */
  readonly progress: { readonly done: number; readonly total: number } | null;
  readonly version: number;
}

/** `GET /api/imports/:id`: the summary with the problems found (the first ones, when there are very many). */
export interface ImportDetail extends ImportSummary {
  readonly problems: readonly ImportProblem[];
  /** True when more problems were found than are listed; the CSV report has them all. */
  readonly problemsTruncated: boolean;
  /** Whether the signed-in user may commit or set aside this import now (the server checks again): its uploader, while checked with no problems. */
  readonly allowed: { readonly commit: boolean; readonly discard: boolean };
}

/** Body of `POST /api/imports/:id/commit` and `/discard`: the version read. */
export const importStep = z.strictObject({ version: z.number({ error: 'the version you read is required' }).int().positive() });

/** Problems listed in an answer at most; the error report (CSV) has every one. */
export const IMPORT_PROBLEMS_LISTED = 500;
