import {
  EngineInputError,
  computeCapacity,
  parseCapacityFile,
  parseRateFile,
  rateGirderLine,
  type CalcFileIssue,
  type CapacityOutput,
  type RateOutput,
} from '../../../shared/src';
import { AppError } from '../http/app-error';

function badCalculationFile(issues: readonly CalcFileIssue[]): AppError {
  const fields = issues.map((issue) => ({ field: issue.path, message: issue.message }));
  return new AppError({
    code: 'validation_failed',
    status: 400,
    message: `The calculation file has ${fields.length} problem${fields.length === 1 ? '' : 's'}: ${fields.map((f) => `${f.field}: ${f.message}`).join('; ')}`,
    details: { fields },
  });
}

/** Runs an engine command, turning the engine's own refusal of an input into a 400 naming the path. */
function runEngine<T>(work: () => T): T {
  try {
    return work();
  } catch (error) {
    if (error instanceof EngineInputError) throw badCalculationFile([{ path: error.path, message: error.problem }]);
    throw error;
  }
}

/** `POST /api/calc/capacity`: the same numbers as `spanledger capacity` for the same file. */
export function calculateCapacity(body: unknown): CapacityOutput {
  const parsed = parseCapacityFile(body);
  if (!parsed.ok) throw badCalculationFile(parsed.issues);
  return runEngine(() => computeCapacity(parsed.file));
}

/** `POST /api/calc/rate`: the same numbers as `spanledger rate` for the same file. */
export function calculateRating(body: unknown): RateOutput {
  const parsed = parseRateFile(body);
  if (!parsed.ok) throw badCalculationFile(parsed.issues);
  return runEngine(() => rateGirderLine(parsed.file));
}
