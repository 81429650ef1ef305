import { isDeepStrictEqual } from 'node:util';

/** The fields a change really alters, with their values before and after, for the history. */
export interface FieldChanges {
  readonly fields: readonly string[];
  readonly before: Record<string, unknown>;
  readonly after: Record<string, unknown>;
}

/** Compares the fields a change sends against the record as it is; fields sent with their current value are left out. */
export function changedFields(current: Readonly<Record<string, unknown>>, change: Readonly<Record<string, unknown>>): FieldChanges {
  const before: Record<string, unknown> = {};
  const after: Record<string, unknown> = {};
  for (const [field, value] of Object.entries(change)) {
    if (value === undefined || isDeepStrictEqual(current[field] ?? null, value)) continue;
    before[field] = current[field] ?? null;
    after[field] = value;
  }
  return { fields: Object.keys(after), before, after };
}
