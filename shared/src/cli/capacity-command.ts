import { parseCapacityFile } from '../engine/calc-file/capacity-file';
import { computeCapacity, type CapacityOutput } from '../engine/capacity/capacity';
import { BadInputError, issueLines } from './bad-input';
import { parseJsonText } from './json-text';

/**
 * `spanledger capacity`: the text of a calculation file in, the engine's output out. Throws
 * BadInputError for malformed JSON or a file the schema refuses; an EngineInputError from a
 * method that cannot take the section passes through to the caller.
 */
export function capacityFromText(text: string, sourceName: string): CapacityOutput {
  const parsed = parseCapacityFile(parseJsonText(text, sourceName));
  if (!parsed.ok) throw new BadInputError(issueLines(parsed.issues));
  return computeCapacity(parsed.file);
}
