import { spawn, type SpawnOptions } from 'node:child_process';

export interface CommandResult {
  readonly code: number;
  readonly output: string;
}

/** Runs a program to completion, collecting stdout and stderr together; never throws on a non-zero exit. */
export function runCommand(program: string, args: readonly string[], options: SpawnOptions = {}): Promise<CommandResult> {
  return new Promise((resolve, reject) => {
    const child = spawn(program, args, { ...options, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.once('error', reject);
    child.once('close', (code) => resolve({ code: code ?? 1, output }));
  });
}

/** Runs a program with its output passed straight through to this terminal; resolves to its exit code. */
export function runVisible(program: string, args: readonly string[], options: SpawnOptions = {}): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(program, args, { ...options, stdio: 'inherit' });
    child.once('error', reject);
    child.once('close', (code) => resolve(code ?? 1));
  });
}

export const isRoot = (): boolean => typeof process.getuid === 'function' && process.getuid() === 0;
