/** The command line's entry (bin/spanledger.js): process I/O wired to `runCli`. */
import { readFile } from 'node:fs/promises';
import { runCli } from './run-cli';

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(Buffer.from(chunk));
  return Buffer.concat(chunks).toString('utf8');
}

void runCli(process.argv.slice(2), {
  readFile: (path) => readFile(path, 'utf8'),
  readStdin,
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  debug: process.env.SPANLEDGER_DEBUG === '1',
}).then((exitCode) => {
  // exitCode rather than process.exit(), so a large document piped to stdout is written in full.
  process.exitCode = exitCode;
});
