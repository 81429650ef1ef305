import { HttpErrorResponse } from '@angular/common/http';
import { AbstractControl, FormControl } from '@angular/forms';
import type { z } from 'zod';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';

/** One bad field, named by its dotted path in the request body (`barriers.0.loadKnM`), as the server names it. */
export interface FieldProblem {
  readonly field: string;
  readonly message: string;
}

/** The key under which a control carries its problem, for `<mat-error>` to show. */
export const PROBLEM = 'problem';

/** What a failed save means for the form. */
export type SaveFailure =
  | { readonly kind: 'conflict' }
  | { readonly kind: 'fields'; readonly problems: readonly FieldProblem[] }
  | { readonly kind: 'other'; readonly message: string };

/** The issues of a schema check, named as the server's 400 answer names them, so both read alike. */
export function schemaProblems(error: z.ZodError): FieldProblem[] {
  return error.issues.flatMap((issue) =>
    issue.code === 'unrecognized_keys'
      ? issue.keys.map((key) => ({ field: [...issue.path, key].join('.'), message: 'unknown body field' }))
      : [{ field: issue.path.join('.'), message: issue.message }],
  );
}

/** Sorts a failed save into a stale version (409 `version_conflict`), bad fields (400, or a taken number), or anything else. */
export function saveFailureOf(error: unknown): SaveFailure {
  if (!(error instanceof HttpErrorResponse)) return { kind: 'other', message: String(error) };
  const body = error.error as { error?: { code?: unknown; details?: { fields?: unknown } } } | null;
  if (error.status === 409 && body?.error?.code === 'version_conflict') return { kind: 'conflict' };
  const fields = body?.error?.details?.fields;
  if (Array.isArray(fields) && fields.length > 0 && fields.every(isFieldProblem)) return { kind: 'fields', problems: fields };
  return { kind: 'other', message: describeServerError(serverErrorReport(error)) };
}

function isFieldProblem(value: unknown): value is FieldProblem {
  return typeof value === 'object' && value !== null && typeof (value as FieldProblem).field === 'string' && typeof (value as FieldProblem).message === 'string';
}

/**
 * Puts each problem on the input its field names, where `<mat-error>` shows it until the next edit;
 * answers the problems no single input shows (a whole group, or a field the form lacks).
 */
export function placeProblems(form: AbstractControl, problems: readonly FieldProblem[]): FieldProblem[] {
  const unplaced: FieldProblem[] = [];
  for (const problem of problems) {
    const control = problem.field === '' ? null : form.get(problem.field);
    if (control instanceof FormControl) {
      const earlier = control.errors?.[PROBLEM] as string | undefined;
      control.setErrors({ ...control.errors, [PROBLEM]: earlier ? `${earlier}; ${problem.message}` : problem.message });
      control.markAsTouched();
    } else {
      unplaced.push(problem);
    }
  }
  return unplaced;
}

/** Problems for the inputs left empty that must hold a value; the schemas would only say "expected number". */
export function missingValues(form: AbstractControl, requiredFields: readonly string[]): FieldProblem[] {
  return requiredFields
    .filter((field) => {
      const value: unknown = form.get(field)?.value;
      return value === null || value === undefined || value === '';
    })
    .map((field) => ({ field, message: 'is required' }));
}
