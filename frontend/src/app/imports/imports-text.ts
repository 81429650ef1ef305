import { HttpErrorResponse } from '@angular/common/http';
import { IMPORT_TEMPLATES, IMPORT_TEMPLATE_NAMES, type ImportCounts, type ImportDetail, type ImportProblem, type ImportSummary, type ImportTemplateName } from '@spanledger/shared';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { saveFailureOf } from '../structures/field-problems';

const COUNT_FORMAT = new Intl.NumberFormat('en');

/** A count as people read it: "12,480". */
export const countText = (count: number): string => COUNT_FORMAT.format(count);

/** One template's line of a check: how its rows would land. */
export interface CountsRow extends ImportCounts {
  readonly template: ImportTemplateName;
  readonly title: string;
}

/** The templates a file held, in the templates' own order. */
export function countsRows(counts: ImportSummary['counts']): CountsRow[] {
  return IMPORT_TEMPLATE_NAMES.flatMap((template) => {
    const count = counts[template];
    return count ? [{ template, title: IMPORT_TEMPLATES[template].title, ...count }] : [];
  });
}

/** "Structures: 3 new, 1 changed, 8 unchanged, 2 refused; Spans: 12 new, 0 changed, 0 unchanged"; refused rows are named when there are any. */
export function countsSummary(counts: ImportSummary['counts']): string {
  const rows = countsRows(counts);
  if (rows.length === 0) return 'No rows';
  const refused = (row: CountsRow) => (row.refused ? `, ${countText(row.refused)} refused` : '');
  return rows.map((row) => `${row.title}: ${countText(row.create)} new, ${countText(row.update)} changed, ${countText(row.unchanged)} unchanged${refused(row)}`).join('; ');
}

/** A template's refused rows as the check's table shows them; a check kept before they were counted shows a dash. */
export const refusedText = (row: CountsRow): string => (row.refused === undefined ? '—' : countText(row.refused));

/** A cell's value as the file held it; an empty cell shows as a dash. */
export function problemValueText(value: ImportProblem['value']): string {
  if (value === null || value === '') return '—';
  return String(value);
}

/** The column a problem is at; a problem of the row as a whole names none. */
export function problemColumnText(column: ImportProblem['column']): string {
  return column === '' ? '(whole row)' : column;
}

/** "1 problem", "1,200 problems". */
export function problemCountText(count: number): string {
  return count === 1 ? '1 problem' : `${countText(count)} problems`;
}

/** What the user is told when an upload is refused, and the earlier import when the same file came before. */
export interface UploadFailure {
  readonly message: string;
  readonly earlierImportId: number | null;
}

const FIELD_NAMES: Readonly<Record<string, string>> = { file: 'File', template: 'Template' };

/** Says plainly why a file was not checked: imported already (409), too large (413), not a spreadsheet (415), or a form problem (400). */
export function uploadFailureOf(error: unknown): UploadFailure {
  const refused = (message: string, earlierImportId: number | null = null): UploadFailure => ({ message, earlierImportId });
  if (!(error instanceof HttpErrorResponse)) return refused(`The file was not checked. ${String(error)}`);
  const serverSaid = hasServerMessage(error) ? describeServerError(serverErrorReport(error)) : null;
  // The server's words already say "imported already" and name the earlier import.
  if (error.status === 409 && serverCode(error) === 'already_exists') return refused(serverSaid ?? 'This file was imported already.', earlierImportIdOf(error));
  if (error.status === 413) return refused(`The file is too large to import. ${serverSaid ?? 'Split it into smaller files and upload each.'}`);
  if (error.status === 415) return refused(`That file is not a CSV or XLSX spreadsheet the server can read.${serverSaid ? ` ${serverSaid}` : ''}`);
  const failure = saveFailureOf(error);
  if (failure.kind === 'fields') {
    return refused(`The file was not checked. ${failure.problems.map((problem) => `${FIELD_NAMES[problem.field] ?? problem.field}: ${problem.message}`).join('. ')}.`);
  }
  return refused(`The file was not checked. ${failure.kind === 'other' ? failure.message : describeServerError(serverErrorReport(error))}`);
}

/** Why committing or setting aside did not happen, in a line; with the import as it is now when it changed meanwhile. */
export interface StepFailure {
  readonly message: string;
  readonly current: ImportDetail | null;
}

export type ImportStep = 'commit' | 'discard';

export function stepFailureOf(error: unknown, step: ImportStep): StepFailure {
  const what = step === 'commit' ? 'Nothing was imported.' : 'The import was not set aside.';
  if (!(error instanceof HttpErrorResponse)) return { message: `${what} ${String(error)}`, current: null };
  const current = error.status === 409 && serverCode(error) === 'version_conflict' ? currentImportOf(error) : null;
  if (current) return { message: `${what} The import changed after you opened it; it is shown below as it is now.`, current };
  return { message: `${what} ${describeServerError(serverErrorReport(error))}`, current: null };
}

type ErrorBody = { error?: { code?: unknown; message?: unknown; details?: { importId?: unknown; current?: unknown } } } | null;

const bodyOf = (error: HttpErrorResponse) => (error.error as ErrorBody)?.error;

/** The server's error code, such as `version_conflict`; null when the body is not the server's error shape. */
function serverCode(error: HttpErrorResponse): string | null {
  const code = bodyOf(error)?.code;
  return typeof code === 'string' ? code : null;
}

function hasServerMessage(error: HttpErrorResponse): boolean {
  return typeof bodyOf(error)?.message === 'string';
}

function earlierImportIdOf(error: HttpErrorResponse): number | null {
  const id = bodyOf(error)?.details?.importId;
  return typeof id === 'number' ? id : null;
}

/** A version conflict carries the record as it is now (docs/api.md, Conventions). */
function currentImportOf(error: HttpErrorResponse): ImportDetail | null {
  const current = bodyOf(error)?.details?.current as Partial<ImportDetail> | undefined;
  return current && typeof current.id === 'number' && typeof current.state === 'string' && Array.isArray(current.problems) ? (current as ImportDetail) : null;
}
