import { z } from 'zod';
import { STRAND_TYPES } from './long-term';

const positive = z.number('must be a number').positive('must be > 0');

/**
 * The calculation file's `losses` key (calc-file.md). With `given`, each strand row carries its own
 * fpeMpa. With `aashto-approximate`, fpe is computed by AASHTO LRFD 5.9.3.2.3a and 5.9.3.3 [R]
 * from the jacking stress, f'ci (cylinder), the relative humidity and the strand type. When
 * `eciMpa` is left out, Eci comes from the policy's Ec formula on f'ci.
 */
export const lossesSchema = z.discriminatedUnion(
  'method',
  [
    z.strictObject({ method: z.literal('given') }),
    z.strictObject({
      method: z.literal('aashto-approximate'),
      jackingStressMpa: positive,
      fciMpa: positive,
      relativeHumidityPct: z.number('must be a number').min(0, 'must be >= 0 %').max(100, 'must be <= 100 %'),
      strandType: z.enum(STRAND_TYPES, 'must be "low-relaxation" or "stress-relieved"').default('low-relaxation'),
      eciMpa: positive.optional(),
    }),
  ],
  { error: 'method must be "given" or "aashto-approximate"' },
);
export type Losses = z.output<typeof lossesSchema>;
