import type { z } from 'zod';

/** One problem with a calculation file, at its JSON path: `girder.strandRows[2].strandAreaMm2`. */
export interface CalcFileIssue {
  readonly path: string;
  readonly message: string;
}

/** Writes a path the way engineers read JSON: keys joined by dots, list positions in brackets. */
export function formatJsonPath(path: readonly PropertyKey[]): string {
  return path.reduce<string>((text, key) => {
    if (typeof key === 'number') return `${text}[${key}]`;
    return text === '' ? String(key) : `${text}.${String(key)}`;
  }, '');
}

/** Every issue of a failed parse, unknown keys each named on their own. */
export function describeIssues(error: z.ZodError): CalcFileIssue[] {
  return error.issues.flatMap((issue) => {
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map((key) => ({ path: formatJsonPath([...issue.path, key]), message: 'unknown key' }));
    }
    return [{ path: formatJsonPath(issue.path) || '(file)', message: issue.message }];
  });
}
