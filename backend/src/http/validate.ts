import { z } from 'zod';
import { AppError } from './app-error';

export interface InvalidField {
  /** Dotted path of the field, e.g. `bbox` for a query parameter or `spans.0.lengthM` in a body. */
  readonly field: string;
  readonly message: string;
}

type RequestPart = 'query parameter' | 'body field' | 'path parameter';

/** Checks one part of a request against its schema and answers 400 naming every bad field. */
export function parseRequest<S extends z.ZodType>(schema: S, value: unknown, part: RequestPart): z.output<S> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const fields: InvalidField[] = result.error.issues.flatMap((issue) => {
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map((key) => ({ field: [...issue.path, key].join('.'), message: `unknown ${part}` }));
    }
    return [{ field: issue.path.join('.') || '(root)', message: issue.message }];
  });
  const summary = fields.map((f) => `${f.field}: ${f.message}`).join('; ');
  throw new AppError({
    code: 'validation_failed',
    status: 400,
    message: `Invalid ${part}${fields.length > 1 ? 's' : ''}: ${summary}`,
    details: { fields },
  });
}

/** The `:id` of a route such as `/structures/:id`: a positive whole number, else 400 naming `id`. */
export const idParameters = z.strictObject({
  id: z.string().regex(/^[1-9]\d{0,9}$/, 'expected a positive whole number').transform(Number),
});

/** Reads the `:id` path parameter. */
export function idFrom(params: unknown): number {
  return parseRequest(idParameters, params, 'path parameter').id;
}
