import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { FRONTEND_DIST_DIR, PROJECT_ROOT } from './project-paths';
import { runVisible } from './run-command';

/** Everything the front-end bundle is built from; a change to any of it means a new build. */
const BUILD_INPUTS = ['frontend', 'shared/src', 'angular.json', 'package-lock.json'];
const IGNORED = new Set(['node_modules', '.angular']);
const HASH_FILE = path.join(FRONTEND_DIST_DIR, '.source-hash');

function listFiles(entry: string): string[] {
  const full = path.join(PROJECT_ROOT, entry);
  if (!fs.existsSync(full)) return [];
  if (fs.statSync(full).isFile()) return [entry];
  return fs
    .readdirSync(full, { withFileTypes: true })
    .filter((child) => !IGNORED.has(child.name))
    .flatMap((child) => listFiles(path.join(entry, child.name)));
}

/** A hash over the names and contents of the build inputs, in a stable order. */
export function frontendSourceHash(): string {
  const hash = createHash('sha256');
  for (const file of BUILD_INPUTS.flatMap(listFiles).sort()) {
    hash.update(file).update('\0').update(fs.readFileSync(path.join(PROJECT_ROOT, file))).update('\0');
  }
  return hash.digest('hex');
}

/** Builds the Angular app when its sources changed since the last build; returns whether it built. */
export async function buildFrontendIfChanged(): Promise<boolean> {
  const current = frontendSourceHash();
  const built = fs.existsSync(HASH_FILE) ? fs.readFileSync(HASH_FILE, 'utf8').trim() : null;
  if (built === current && fs.existsSync(path.join(FRONTEND_DIST_DIR, 'browser', 'index.html'))) return false;
  console.log('Building the front end (its sources changed)…');
  const ngCli = path.join(PROJECT_ROOT, 'node_modules', '@angular', 'cli', 'bin', 'ng.js');
  const code = await runVisible(process.execPath, [ngCli, 'build'], { cwd: PROJECT_ROOT, env: { ...process.env, NG_CLI_ANALYTICS: 'false' } });
  if (code !== 0) throw new Error('The front-end build failed (see the messages above)');
  fs.writeFileSync(HASH_FILE, `${current}\n`);
  return true;
}
