import { z } from 'zod';
import { AppError, type InvalidField } from './app-error';

export type { InvalidField };

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
  throw AppError.invalidFields(fields, part);
}

/** The `:id` of a route such as `/structures/:id`: a positive whole number, else 400 naming `id`. */
export const idParameters = z.strictObject({
  id: z.string().regex(/^[1-9]\d{0,9}$/, 'expected a positive whole number').transform(Number),
});

/** Reads the `:id` path parameter. */
export function idFrom(params: unknown): number {
  return parseRequest(idParameters, params, 'path parameter').id;
}
