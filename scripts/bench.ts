/**
 * `npm run bench`: every benchmark of the engine (`shared/**\/*.bench.ts`), then those of the
 * running product (`bench/**\/*.bench.ts`: the API under load, the map's first paint, each with
 * its own throw-away database, server and browser), one after the other in its own process. It
 * prints figures; it asserts nothing.
 */
import fs from 'node:fs';
import path from 'node:path';
import { PROJECT_ROOT } from './lib/project-paths';
import { runVisible } from './lib/run-command';

function findBenchmarks(folder: string): string[] {
  return fs.readdirSync(folder, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) return findBenchmarks(full);
    return entry.name.endsWith('.bench.ts') ? [full] : [];
  });
}

async function main(): Promise<number> {
  const benchmarks = ['shared', 'bench'].flatMap((folder) => findBenchmarks(path.join(PROJECT_ROOT, folder)).sort());
  let failures = 0;
  for (const file of benchmarks) {
    console.log(`\n# ${path.relative(PROJECT_ROOT, file)}`);
    const code = await runVisible(process.execPath, ['--expose-gc', '--max-semi-space-size=256', '--import', 'tsx', file], { cwd: PROJECT_ROOT });
    if (code !== 0) failures += 1;
  }
  return failures === 0 ? 0 : 1;
}

main().then((code) => process.exit(code));
