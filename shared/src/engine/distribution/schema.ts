import { z } from 'zod';

/** Largest moment distribution factor the product accepts from a user (a girder rarely takes more than two lanes). */
export const USER_MOMENT_FACTOR_MAX = 2;

/** A distribution factor given by the user: 0 < moment ≤ USER_MOMENT_FACTOR_MAX, lanes per girder. */
export const userDistributionSchema = z.strictObject({
  method: z.literal('user'),
  moment: z.number().positive('must be > 0').max(USER_MOMENT_FACTOR_MAX, `must be <= ${USER_MOMENT_FACTOR_MAX}`),
});

/**
 * The calculation file's `span.distribution` (calc-file.md): the published formulas, the lever
 * rule, or a factor the user gives, which always overrides and is recorded.
 */
export const spanDistributionSchema = z.discriminatedUnion('method', [
  z.strictObject({ method: z.literal('formula') }),
  z.strictObject({ method: z.literal('lever') }),
  userDistributionSchema,
]);
export type SpanDistribution = z.infer<typeof spanDistributionSchema>;
