import { BadInputError } from './bad-input';

/** Line and column (both from 1) of a character offset in a text. */
function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  const before = text.slice(0, offset).split('\n');
  return { line: before.length, column: before[before.length - 1]!.length + 1 };
}

/**
 * Parses the text of a calculation file, or throws a BadInputError naming the source and,
 * when JSON.parse gives the offset of the fault, its line and column.
 */
export function parseJsonText(text: string, sourceName: string): unknown {
  // Editors on Windows may save UTF-8 with a byte-order mark, which JSON.parse refuses.
  const json = text.startsWith('\uFEFF') ? text.slice(1) : text;
  try {
    return JSON.parse(json);
  } catch (error) {
    if (!(error instanceof SyntaxError)) throw error;
    throw new BadInputError([`${sourceName}: ${describeSyntaxError(error.message, json)}`]);
  }
}

/** `Unexpected number in JSON at position 18` becomes `line 3, column 7: malformed JSON: Unexpected number`. */
function describeSyntaxError(message: string, json: string): string {
  const position = /in JSON at position (\d+)/.exec(message);
  if (position === null) return `malformed JSON: ${message}`;
  const { line, column } = lineAndColumn(json, Number(position[1]));
  // Newer Node versions append "(line L column C)"; the line and column lead our message instead.
  const problem = message.slice(0, position.index).trimEnd();
  return `line ${line}, column ${column}: malformed JSON: ${problem}`;
}
