import { EngineInputError } from '../engine/materials/errors';
import { BadInputError } from './bad-input';
import { COMMANDS, isCommandName } from './commands';
import { jsonDocument } from './json-document';
import { USAGE } from './usage';

/** Everything the command line touches outside itself, so tests can run it without a process. */
export interface CliIo {
  readFile(path: string): Promise<string>;
  readStdin(): Promise<string>;
  stdout(text: string): void;
  stderr(text: string): void;
  /** Print the stack of an unexpected error (SPANLEDGER_DEBUG=1). */
  readonly debug?: boolean;
}

/** Exit statuses of the contract (calc-file.md): bad input is 2, anything else that fails is 1. */
export const EXIT_OK = 0;
export const EXIT_FAILURE = 1;
export const EXIT_BAD_INPUT = 2;

const STDIN_ARGUMENT = '-';
const STDIN_NAME = 'standard input';

/** Runs `spanledger ARGS…` and resolves to the exit status; never rejects. */
export async function runCli(args: readonly string[], io: CliIo): Promise<number> {
  const [command, ...rest] = args;
  if (command === '--help' || command === '-h') {
    io.stdout(USAGE);
    return EXIT_OK;
  }
  if (command === undefined) return usageError(io, null);
  if (!isCommandName(command)) return usageError(io, `unknown command "${command}"`);
  const [file] = rest;
  if (rest.length !== 1 || file === undefined) return usageError(io, `${command} takes one FILE.json, or - for standard input`);
  if (file.startsWith('-') && file !== STDIN_ARGUMENT) return usageError(io, `unknown option "${file}"`);
  try {
    const output = COMMANDS[command](await readSource(file, io), file === STDIN_ARGUMENT ? STDIN_NAME : file);
    io.stdout(jsonDocument(output));
    return EXIT_OK;
  } catch (error) {
    return reportError(error, io);
  }
}

function usageError(io: CliIo, problem: string | null): number {
  io.stderr(problem === null ? USAGE : `spanledger: ${problem}\n\n${USAGE}`);
  return EXIT_BAD_INPUT;
}

async function readSource(file: string, io: CliIo): Promise<string> {
  if (file === STDIN_ARGUMENT) return io.readStdin();
  try {
    return await io.readFile(file);
  } catch (error) {
    throw new BadInputError([`${file}: cannot read the file (${readFailure(error)})`]);
  }
}

const READ_FAILURES: Record<string, string> = {
  ENOENT: 'no such file',
  EISDIR: 'it is a directory',
  EACCES: 'permission denied',
};

function readFailure(error: unknown): string {
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  if (code !== undefined && code in READ_FAILURES) return READ_FAILURES[code]!;
  return error instanceof Error ? error.message : String(error);
}

function reportError(error: unknown, io: CliIo): number {
  if (error instanceof BadInputError) {
    io.stderr(`${error.lines.join('\n')}\n`);
    return EXIT_BAD_INPUT;
  }
  if (error instanceof EngineInputError) {
    io.stderr(`${error.path}: ${error.problem}\n`);
    return EXIT_BAD_INPUT;
  }
  const message = error instanceof Error ? error.message : String(error);
  const detail = io.debug && error instanceof Error && error.stack ? error.stack : 'set SPANLEDGER_DEBUG=1 to see the stack';
  io.stderr(`spanledger: ${message}\n${detail}\n`);
  return EXIT_FAILURE;
}
