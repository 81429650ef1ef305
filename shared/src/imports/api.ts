import type { ImportTemplateName } from './columns';
import type { ImportProblem } from './rows';

/**
 * What the imports API answers. An upload is checked first — every row of every sheet against
 * the templates, against each other and against the register — and the check is kept as an
 * import in the history with what it would create, change and leave alone.
 */

/** checked: read and judged, nothing written; committed: written in one transaction; discarded: set aside by its uploader. */
export const IMPORT_STATES = ['checked', 'committed', 'discarded'] as const;
export type ImportState = (typeof IMPORT_STATES)[number];
export const IMPORT_STATE_NAMES: Readonly<Record<ImportState, string>> = { checked: 'Checked', committed: 'Imported', discarded: 'Set aside' };

/** How the rows of one template would land: new records, changed ones and ones already as the file says. */
export interface ImportCounts {
  readonly rows: number;
  readonly create: number;
  readonly update: number;
  readonly unchanged: number;
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
}

/** `GET /api/imports/:id`: the summary with the problems found (the first ones, when there are very many). */
export interface ImportDetail extends ImportSummary {
  readonly problems: readonly ImportProblem[];
  /** True when more problems were found than are listed; the CSV report has them all. */
  readonly problemsTruncated: boolean;
}

/** Problems listed in an answer at most; the error report (CSV) has every one. */
export const IMPORT_PROBLEMS_LISTED = 500;
