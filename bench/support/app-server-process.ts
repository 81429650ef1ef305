/**
 * Child-process entry started by startAppServerProcess: the real server (createApp through
 * startServer) with the settings its parent sends over IPC. It stops by itself when the parent
 * goes away, even when the parent was killed, so no server outlives a benchmark.
 */
import { loadConfig } from '../../backend/src/config';
import { startServer, type RunningServer } from '../../backend/src/server';
import type { ServerReadyMessage, ServerSettingsMessage } from './app-server';

function answer(message: ServerReadyMessage): void {
  process.send?.(message);
}

let server: RunningServer | null = null;
const stop = () => {
  void (server?.close() ?? Promise.resolve()).finally(() => process.exit(0));
};
process.once('SIGTERM', stop);
process.once('disconnect', stop);
process.once('message', (message: ServerSettingsMessage) => {
  startServer(loadConfig(message.settings)).then(
    (running) => {
      server = running;
      answer({ url: running.url });
    },
    (error: unknown) => {
      answer({ error: error instanceof Error ? error.message : String(error) });
      process.exit(1);
    },
  );
});
