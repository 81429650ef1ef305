import { fork, type ChildProcess } from 'node:child_process';
import path from 'node:path';

export type ServerSettingsMessage = { readonly settings: Record<string, string> };
export type ServerReadyMessage = { readonly url: string } | { readonly error: string };

const ENTRY = path.join(__dirname, 'app-server-process.ts');
const START_TIMEOUT_MS = 60_000;
const STOP_TIMEOUT_MS = 10_000;

export interface AppServerProcess {
  readonly url: string;
  /** The server process's id, to tell how much CPU it used. */
  readonly pid: number;
  /** Asks the server to finish open requests and stop; kills it if it has not stopped in time. */
  stop(): Promise<void>;
}

function exited(child: ChildProcess): Promise<void> {
  return child.exitCode !== null || child.signalCode !== null ? Promise.resolve() : new Promise((resolve) => child.once('exit', () => resolve()));
}

async function stopChild(child: ChildProcess): Promise<void> {
  const gone = exited(child);
  child.kill('SIGTERM');
  const timer = setTimeout(() => child.kill('SIGKILL'), STOP_TIMEOUT_MS);
  await gone;
  clearTimeout(timer);
}

/**
 * The real Spanledger server in a process of its own, so that a load generator in this process
 * measures the server rather than competing with it for one event loop. `settings` are the
 * server's environment settings (PORT, DATABASE_URL, SAML_IDP_*, …), and nothing else is read.
 */
export async function startAppServerProcess(settings: Record<string, string>): Promise<AppServerProcess> {
  const child = fork(ENTRY, [], { execArgv: ['--import', 'tsx', ...(process.env.BENCH_CPU_PROFILE_DIR ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROFILE_DIR}`] : [])], stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
  try {
    const url = await new Promise<string>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`the server did not start within ${START_TIMEOUT_MS / 1000} s`)), START_TIMEOUT_MS);
      child.once('message', (message: ServerReadyMessage) => {
        clearTimeout(timer);
        if ('url' in message) resolve(message.url);
        else reject(new Error(`the server did not start: ${message.error}`));
      });
      child.once('exit', (code) => {
        clearTimeout(timer);
        reject(new Error(`the server process exited before it listened (exit code ${code})`));
      });
      child.send({ settings } satisfies ServerSettingsMessage);
    });
    return { url, pid: child.pid as number, stop: () => stopChild(child) };
  } catch (error) {
    await stopChild(child);
    throw error;
  }
}
