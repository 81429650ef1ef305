/**
 * Input the command line cannot use: an unreadable file, malformed JSON or a calculation file
 * the schema refuses. Each line names one offending place and what is wrong with it; the
 * command line prints them on standard error and exits with status 2 (calc-file.md).
 */
export class BadInputError extends Error {
  override readonly name = 'BadInputError';

  constructor(readonly lines: readonly string[]) {
    super(lines.join('\n'));
  }
}

/** One line per offending path, `girder.strandRows[2].strandAreaMm2: must be > 0`; problems at one path share its line. */
export function issueLines(issues: readonly { path: string; message: string }[]): string[] {
  const messagesByPath = new Map<string, string[]>();
  for (const { path, message } of issues) {
    const messages = messagesByPath.get(path) ?? [];
    if (!messages.includes(message)) messages.push(message);
    messagesByPath.set(path, messages);
  }
  return [...messagesByPath].map(([path, messages]) => `${path}: ${messages.join('; ')}`);
}
