import { parseCapacityFile } from '../engine/calc-file/capacity-file';
import { parseRateFile } from '../engine/calc-file/rate-file';
import { computeCapacity, type CapacityOutput } from '../engine/capacity/capacity';
import { rateGirderLine, type RateOutput } from '../engine/rating/rate';
import { BadInputError, issueLines } from './bad-input';
import { parseJsonText } from './json-text';

/**
 * The engine's commands: the text of a calculation file in, the engine's output out. Each throws
 * BadInputError for malformed JSON or a file the schema refuses; an EngineInputError from a
 * method that cannot take the input passes through to the caller.
 */
export const COMMANDS = {
  capacity(text: string, sourceName: string): CapacityOutput {
    const parsed = parseCapacityFile(parseJsonText(text, sourceName));
    if (!parsed.ok) throw new BadInputError(issueLines(parsed.issues));
    return computeCapacity(parsed.file);
  },
  rate(text: string, sourceName: string): RateOutput {
    const parsed = parseRateFile(parseJsonText(text, sourceName));
    if (!parsed.ok) throw new BadInputError(issueLines(parsed.issues));
    return rateGirderLine(parsed.file);
  },
} as const;

export type CommandName = keyof typeof COMMANDS;

export function isCommandName(name: string): name is CommandName {
  return Object.hasOwn(COMMANDS, name);
}
