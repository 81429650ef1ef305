/**
 * `npm test`: system packages, type checks, then every jest suite (shared, backend, API against a
 * throw-away PostgreSQL/PostGIS cluster, front-end components, browser journeys in Chromium).
 * Ends with one line `N passed, N failed` over all of it; any failure exits non-zero.
 */
import fs from 'node:fs';
import path from 'node:path';
import { buildFrontendIfChanged } from './lib/frontend-build';
import { PROJECT_ROOT, TEST_OUTPUT_DIR } from './lib/project-paths';
import { runVisible } from './lib/run-command';
import { ensureSystemPackages } from './lib/system-packages';

const SUMMARY_FILE = path.join(TEST_OUTPUT_DIR, 'summary.txt');
const JEST_RESULTS_FILE = path.join(TEST_OUTPUT_DIR, 'jest-results.json');
const TYPE_CHECKS = ['tsconfig.json', 'frontend/tsconfig.app.json', 'frontend/tsconfig.spec.json'];

interface Tally {
  passed: number;
  failed: number;
}

const bin = (pkg: string, file: string) => path.join(PROJECT_ROOT, 'node_modules', pkg, file);

async function runTypeChecks(tally: Tally): Promise<void> {
  for (const project of TYPE_CHECKS) {
    console.log(`\nType check: ${project}`);
    const code = await runVisible(process.execPath, [bin('typescript', 'bin/tsc'), '--noEmit', '-p', project], { cwd: PROJECT_ROOT });
    if (code === 0) tally.passed += 1;
    else tally.failed += 1;
  }
}

interface JestResults {
  numPassedTests: number;
  numFailedTests: number;
  numRuntimeErrorTestSuites: number;
  numTotalTests: number;
}

/** Runs every jest project in one run; a suite that could not even start counts as a failure. */
async function runJest(tally: Tally, extraArgs: string[]): Promise<void> {
  fs.rmSync(JEST_RESULTS_FILE, { force: true });
  const args = [bin('jest', 'bin/jest.js'), '--ci', '--json', `--outputFile=${JEST_RESULTS_FILE}`, ...extraArgs];
  const code = await runVisible(process.execPath, args, { cwd: PROJECT_ROOT });
  if (!fs.existsSync(JEST_RESULTS_FILE)) {
    tally.failed += 1;
    return;
  }
  const results = JSON.parse(fs.readFileSync(JEST_RESULTS_FILE, 'utf8')) as JestResults;
  tally.passed += results.numPassedTests;
  tally.failed += results.numFailedTests + results.numRuntimeErrorTestSuites;
  if (code !== 0 && results.numFailedTests + results.numRuntimeErrorTestSuites === 0) tally.failed += 1;
  if (results.numTotalTests === 0) tally.failed += 1;
}

async function main(): Promise<number> {
  fs.mkdirSync(TEST_OUTPUT_DIR, { recursive: true });
  const tally: Tally = { passed: 0, failed: 0 };
  try {
    await ensureSystemPackages({ forTests: true });
    await runTypeChecks(tally);
    await buildFrontendIfChanged();
    await runJest(tally, process.argv.slice(2));
  } catch (error) {
    console.error(`\n${error instanceof Error ? error.message : String(error)}`);
    tally.failed += 1;
  }
  const summary = `${tally.passed} passed, ${tally.failed} failed`;
  fs.writeFileSync(SUMMARY_FILE, `${summary}\n`);
  console.log(`\n${summary}`);
  return tally.failed === 0 ? 0 : 1;
}

main().then((code) => process.exit(code));
