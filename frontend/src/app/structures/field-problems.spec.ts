import { HttpErrorResponse } from '@angular/common/http';
import { FormArray, FormControl, FormGroup } from '@angular/forms';
import { spanChange } from '@spanledger/shared';

import { PROBLEM, missingValues, placeProblems, saveFailureOf, schemaProblems } from './field-problems';

function failure(status: number, body: unknown): HttpErrorResponse {
  return new HttpErrorResponse({ status, error: body });
}

describe('field problems', () => {
  it('names schema issues by dotted path, as the server does', () => {
    const result = spanChange.safeParse({ version: 1, barriers: [{ loadKnM: -1 }], colour: 'red' });
    expect(result.success).toBe(false);
    const problems = schemaProblems(result.error!);

    expect(problems).toContainEqual({ field: 'barriers.0.loadKnM', message: expect.stringMatching(/> 0/) });
    expect(problems).toContainEqual({ field: 'colour', message: 'unknown body field' });
  });

  it('tells a stale version from bad fields and from other failures', () => {
    expect(saveFailureOf(failure(409, { error: { code: 'version_conflict', message: 'changed', details: { current: {} } } }))).toEqual({ kind: 'conflict' });
    expect(saveFailureOf(failure(400, { error: { code: 'validation_failed', message: 'bad', details: { fields: [{ field: 'adt', message: 'must be >= 0' }] } } }))).toEqual({
      kind: 'fields',
      problems: [{ field: 'adt', message: 'must be >= 0' }],
    });
    expect(
      saveFailureOf(failure(409, { error: { code: 'already_exists', message: 'taken', details: { fields: [{ field: 'structureNumber', message: 'Structure number NP-1 is already in the register' }] } } })),
    ).toMatchObject({ kind: 'fields' });
    expect(saveFailureOf(failure(403, { error: { code: 'forbidden', message: 'Not your district' }, requestId: 'r-1' }))).toEqual({ kind: 'other', message: 'Not your district (request r-1)' });
  });

  it('puts each problem on its input and hands back those no input shows', () => {
    const form = new FormGroup({
      lengthM: new FormControl<number | null>(30),
      barriers: new FormArray([new FormGroup({ loadKnM: new FormControl<number | null>(0) })]),
    });

    const unplaced = placeProblems(form, [
      { field: 'lengthM', message: 'must be at most 300 m' },
      { field: 'lengthM', message: 'is odd' },
      { field: 'barriers.0.loadKnM', message: 'must be > 0' },
      { field: 'barriers', message: 'too many' },
      { field: 'girderCount', message: 'unknown body field' },
    ]);

    expect(form.controls.lengthM.errors?.[PROBLEM]).toBe('must be at most 300 m; is odd');
    expect(form.controls.lengthM.touched).toBe(true);
    expect(form.get('barriers.0.loadKnM')?.errors?.[PROBLEM]).toBe('must be > 0');
    expect(unplaced.map((problem) => problem.field)).toEqual(['barriers', 'girderCount']);

    form.controls.lengthM.setValue(31);
    expect(form.controls.lengthM.errors).toBeNull();
  });

  it('finds the inputs left empty', () => {
    const form = new FormGroup({ a: new FormControl<number | null>(null), b: new FormControl<number | null>(0), c: new FormControl('') });
    expect(missingValues(form, ['a', 'b', 'c'])).toEqual([
      { field: 'a', message: 'is required' },
      { field: 'c', message: 'is required' },
    ]);
  });
});
