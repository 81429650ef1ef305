import { z } from 'zod';
import { AppError } from './app-error';
import { parseRequest } from './validate';

const schema = z.strictObject({ lengthM: z.number().positive(), name: z.string() });

function captureError(action: () => unknown): AppError {
  try {
    action();
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error('expected an AppError');
}

describe('parseRequest', () => {
  it('returns the parsed value when it is valid', () => {
    expect(parseRequest(schema, { lengthM: 24.5, name: 'Span 1' }, 'body field')).toEqual({ lengthM: 24.5, name: 'Span 1' });
  });

  it('names every bad and unknown field in a 400', () => {
    const error = captureError(() => parseRequest(schema, { lengthM: -3, colour: 'red' }, 'body field'));
    expect(error.status).toBe(400);
    expect(error.code).toBe('validation_failed');
    expect(error.details).toEqual({
      fields: [
        { field: 'lengthM', message: expect.stringMatching(/>0/) },
        { field: 'name', message: expect.any(String) },
        { field: 'colour', message: 'unknown body field' },
      ],
    });
    expect(error.message).toMatch(/^Invalid body fields: lengthM: .*; name: .*; colour: unknown body field$/);
  });
});
