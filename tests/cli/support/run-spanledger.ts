import { spawn } from 'node:child_process';
import path from 'node:path';

export const REPO_ROOT = path.resolve(__dirname, '../../..');

export interface CliRun {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

/** Runs the real command line, `node bin/spanledger.js ARGS…` from the repository root, feeding `input` to its standard input. */
export function runSpanledger(args: readonly string[], input = '', env: NodeJS.ProcessEnv = {}): Promise<CliRun> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['bin/spanledger.js', ...args], {
      cwd: REPO_ROOT,
      env: { ...process.env, SPANLEDGER_DEBUG: '', ...env },
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString('utf8')));
    child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString('utf8')));
    child.on('error', reject);
    child.on('close', (status) => resolve({ status, stdout, stderr }));
    child.stdin.end(input);
  });
}
