/**
 * Bulk import of 50 000 girder rows from one XLSX, end to end as a person does it: a workbook of
 * 1 000 invented structures of the demo authority (5 spans of 10 girders each, one strand row per
 * girder) is written with exceljs's streaming writer, then a manager signed in through the local
 * identity provider uploads it to the real server (`POST /api/imports`, answered when checked) and
 * commits it (`POST /api/imports/:id/commit`, answered when written, or 202 and polled until it
 * leaves `committing`). Prints the time to check and to commit, rows per second end to end and the
 * server's peak resident memory against the targets, how busy the machine was, what the
 * register holds afterwards and how long a new structure's history takes to answer; asserts no
 * timing, but a refused or failed import ends it non-zero with its first problems. Run through
 * `npm run bench`.
 *
 * BENCH_IMPORT_GIRDERS=2000 makes a smaller file (a multiple of 50) while developing;
 * BENCH_CPU_PROFILE_DIR=<folder> has the server write a V8 CPU profile there when it stops.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { createDatabase, type Database } from '../backend/src/db/database';
import { seed as seedDemoInventory } from '../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../seeds/demo-structures';
import type { ImportDetail } from '../shared/src';
import { SignInClient } from '../tests/support/sign-in-client';
import { BENCH_SUBJECT, startBenchStack, type BenchStack } from './support/bench-stack';
import { runBenchmark } from './support/clean-up';
import { commitAndWait, describeProblem, uploadForCheck } from './support/import-steps';
import { BENCH_IMPORT_SHEETS, writeBenchImportWorkbook, type BenchImportFile } from './support/import-workbook';
import { describeMachineLoad, processWithChildren, watchMachineLoad, type MachineLoad, type WatchedProcesses } from './support/machine-load';
import { describeBytes, processMemory } from './support/process-memory';
import { SignedInHttp } from './support/signed-in-http';

const TARGET_GIRDER_ROWS_PER_S = 5000;
const TARGET_PEAK_RSS_BYTES = 400e6;
const DEFAULT_GIRDER_COUNT = 50_000;
/** A line now and then while a long commit runs, so a minutes-long wait is seen to be alive. */
const HEARTBEAT_MS = 30_000;
const PROBLEMS_SHOWN = 10;
const MIB = 1024 * 1024;

function girderCountAsked(): number {
  const asked = process.env.BENCH_IMPORT_GIRDERS;
  if (asked === undefined || asked === '') return DEFAULT_GIRDER_COUNT;
  const count = Number(asked.replace(/[ _]/g, ''));
  if (!Number.isInteger(count) || count <= 0) throw new Error(`BENCH_IMPORT_GIRDERS must be a whole number of girders, not "${asked}"`);
  return count;
}

/** The demo register the import lands in: its structures, and the girder-type catalogue the girder rows name. */
async function seedDemoRegister(db: Database): Promise<number> {
  const started = performance.now();
  await seedDemoStructures(db);
  await seedDemoInventory(db);
  const [{ count }] = (await db('structures').count({ count: '*' })) as [{ count: string }];
  console.log(`Seeded the demo register (${count} structures with their girders, and the girder-type catalogue) in ${Math.round(performance.now() - started)} ms`);
  return Number(count);
}

const secondsSince = (startedMs: number) => (performance.now() - startedMs) / 1000;
const perSecond = (rows: number, seconds: number) => Math.round(rows / seconds);

/** Prints the first problems an import answered with, and fails the benchmark: its figures would mean nothing. */
function failWithProblems(what: string, detail: ImportDetail): never {
  console.log(`  ${what}: ${detail.problemCount} problem${detail.problemCount === 1 ? '' : 's'}; the first ${Math.min(PROBLEMS_SHOWN, detail.problems.length)}:`);
  for (const problem of detail.problems.slice(0, PROBLEMS_SHOWN)) console.log(`    ${describeProblem(problem)}`);
  throw new Error(`${what} (import ${detail.id}, state ${detail.state}): the figures would mean nothing`);
}

/** The check must find the whole file new and clean, or the commit would measure something else. */
function checkedClean(detail: ImportDetail, file: BenchImportFile): ImportDetail {
  if (detail.problemCount > 0) failWithProblems('The check found problems', detail);
  for (const sheet of BENCH_IMPORT_SHEETS) {
    const counts = detail.counts[sheet];
    if (counts?.rows !== file.rowsPerSheet[sheet] || counts.update + counts.unchanged > 0) {
      throw new Error(`the check did not find the file's ${file.rowsPerSheet[sheet]} ${sheet} rows all new: ${JSON.stringify(detail.counts)}`);
    }
  }
  return detail;
}

/** Commits, with a line now and then while it runs so that a wait of minutes is seen to be alive. */
async function commitWithHeartbeat(http: SignedInHttp, checked: ImportDetail, startedMs: number): Promise<{ detail: ImportDetail; status: number }> {
  let progress: ImportDetail['progress'] = null;
  const heartbeat = setInterval(() => {
    const written = progress ? `: ${progress.done} of ${progress.total} rows written` : '';
    console.log(`  … ${Math.round(secondsSince(startedMs))} s into the commit${written}`);
  }, HEARTBEAT_MS);
  try {
    return await commitAndWait(http, checked, (latest) => (progress = latest));
  } finally {
    clearInterval(heartbeat);
  }
}

interface RegisterCounts {
  readonly structures: number;
  readonly spans: number;
  readonly girders: number;
  readonly strandRows: number;
}

/** What the register holds under the file's structure numbers, read from the database itself. */
async function registerCounts(databaseUrl: string, structureNumbers: readonly string[]): Promise<RegisterCounts> {
  const db = createDatabase(databaseUrl, { min: 0, max: 1 });
  try {
    const { rows } = await db.raw<{ rows: Record<keyof RegisterCounts, string>[] }>(
      `select count(distinct s.id) as structures, count(distinct sp.id) as spans, count(distinct g.id) as girders, count(sr.id) as "strandRows"
         from structures s
         left join spans sp on sp.structure_id = s.id
         left join girders g on g.span_id = sp.id
         left join strand_rows sr on sr.girder_id = g.id
        where s.structure_number = any(?::text[])`,
      [[...structureNumbers]],
    );
    const counts = rows[0]!;
    return { structures: Number(counts.structures), spans: Number(counts.spans), girders: Number(counts.girders), strandRows: Number(counts.strandRows) };
  } finally {
    await db.destroy();
  }
}

function watchedProcesses(stack: BenchStack): WatchedProcesses {
  return new Map([
    ['server', () => [stack.serverPid]],
    ['PostgreSQL', () => processWithChildren(stack.databasePid)],
    ['benchmark', () => [process.pid]],
  ]);
}

const met = (ok: boolean) => (ok ? 'met' : 'NOT met');

/** Requests of a structure's history timed after the import. */
const HISTORY_REQUESTS = 5;

/**
 * How long a structure's history (`GET /api/structures/:id/history`, its first page) takes once the
 * import has added its tens of thousands of events: the history is looked up by subject, so it
 * should not grow with the whole history's size.
 */
async function timeStructureHistory(http: SignedInHttp, databaseUrl: string, structureNumber: string): Promise<void> {
  const db = createDatabase(databaseUrl, { min: 0, max: 1 });
  try {
    const structure = (await db('structures').where({ structure_number: structureNumber }).first('id')) as { id: number };
    const [{ events }] = (await db('audit_events').count({ events: '*' })) as [{ events: string }];
    const times: number[] = [];
    for (let request = 0; request < HISTORY_REQUESTS; request += 1) {
      const started = performance.now();
      const answer = await http.get(`/api/structures/${structure.id}/history`);
      if (answer.status !== 200) throw new Error(`the history of structure ${structureNumber} answered ${answer.status}: ${answer.text.slice(0, 200)}`);
      times.push(performance.now() - started);
    }
    const sorted = [...times].sort((a, b) => a - b);
    console.log(
      `  structure ${structureNumber}'s history, first page, with ${events} events in the whole history: ${Math.round(sorted[Math.floor(sorted.length / 2)]!)} ms ` +
        `(median of ${HISTORY_REQUESTS}; ${Math.round(sorted[0]!)}–${Math.round(sorted[sorted.length - 1]!)} ms)`,
    );
  } finally {
    await db.destroy();
  }
}

/** The phase's machine load, and the CPU time each watched group spent in it: on a shared machine that says more than the wall-clock time. */
function describePhaseLoad(load: MachineLoad, seconds: number): string[] {
  const cpu = [...load.groups].map(([name, use]) => `${name} ${(use.cores * seconds).toFixed(1)} s`).join(', ');
  return [`    ${describeMachineLoad(load)}`, `    CPU time over the ${seconds.toFixed(1)} s: ${cpu}`];
}

runBenchmark(async (cleanUp) => {
  const girderCount = girderCountAsked();
  const folder = await mkdtemp(path.join(os.tmpdir(), 'spanledger-bench-import-'));
  cleanUp.add('the benchmark workbook', () => rm(folder, { recursive: true, force: true }));
  const writingStarted = performance.now();
  const file = await writeBenchImportWorkbook(path.join(folder, `bench-inventory-${girderCount}-girders.xlsx`), girderCount);
  const writingS = secondsSince(writingStarted);
  const allRows = BENCH_IMPORT_SHEETS.reduce((sum, sheet) => sum + file.rowsPerSheet[sheet], 0);

  // The upload cap is the operator's setting: raised to let the whole file in, as an owner importing large files would.
  const sizeLimitBytes = (Math.floor(file.byteSize / MIB) + 1) * MIB;
  const stack = await startBenchStack(cleanUp, { forBrowser: false, seed: seedDemoRegister, serverSettings: { IMPORT_MAX_BYTES: String(sizeLimitBytes) } });
  const client = new SignInClient(stack.appUrl);
  await client.signInAs(BENCH_SUBJECT);
  const http = SignedInHttp.of(client, stack.appUrl);
  const watched = watchedProcesses(stack);

  console.log(`Import of ${girderCount} girders from one XLSX, end to end against the real server, signed in as ${BENCH_SUBJECT} (a manager of the demo authority):`);
  console.log(
    `  file: ${describeBytes(file.byteSize)}, written in ${writingS.toFixed(1)} s; rows: ${BENCH_IMPORT_SHEETS.map((sheet) => `${sheet} ${file.rowsPerSheet[sheet]}`).join(', ')} (${allRows} in all); ` +
      `upload cap IMPORT_MAX_BYTES=${sizeLimitBytes}`,
  );
  const atRest = processMemory(stack.serverPid);

  const checkStarted = performance.now();
  const checkLoad = watchMachineLoad(watched);
  const answered = await uploadForCheck(http, file.filePath);
  const checkS = secondsSince(checkStarted);
  const checkMachine = checkLoad.stop();
  const afterCheck = processMemory(stack.serverPid);
  console.log(`  check (upload → checked):  ${checkS.toFixed(1)} s, ${perSecond(allRows, checkS)} rows/s; server peak RSS so far ${describeBytes(afterCheck.peakResidentBytes)}`);
  for (const line of describePhaseLoad(checkMachine, checkS)) console.log(line);
  const checked = checkedClean(answered, file);

  const commitStarted = performance.now();
  const commitLoad = watchMachineLoad(watched);
  const { detail: committed, status } = await commitWithHeartbeat(http, checked, commitStarted);
  const commitS = secondsSince(commitStarted);
  const commitMachine = commitLoad.stop();
  const afterCommit = processMemory(stack.serverPid);
  const how = status === 202 ? 'accepted (202), then polled' : `answered ${status}`;
  console.log(`  commit (→ ${committed.state}, ${how}):  ${commitS.toFixed(1)} s, ${perSecond(allRows, commitS)} rows/s; server peak RSS so far ${describeBytes(afterCommit.peakResidentBytes)}`);
  for (const line of describePhaseLoad(commitMachine, commitS)) console.log(line);
  if (committed.state !== 'committed') failWithProblems(`The commit ended ${committed.state}`, committed);

  const totalS = checkS + commitS;
  const girderRate = perSecond(file.rowsPerSheet.girders, totalS);
  const peak = afterCommit.peakResidentBytes;
  const peakPhase = peak > afterCheck.peakResidentBytes ? 'while committing' : 'while checking';
  console.log(`  total: ${totalS.toFixed(1)} s (check ${Math.round((checkS / totalS) * 100)} %, commit ${Math.round((commitS / totalS) * 100)} %)`);
  console.log(`  girder rows per second end to end: ${girderRate}  target ≥ ${TARGET_GIRDER_ROWS_PER_S}: ${met(girderRate >= TARGET_GIRDER_ROWS_PER_S)}`);
  console.log(`  all rows per second end to end: ${perSecond(allRows, totalS)} (${allRows} rows)`);
  console.log(
    `  server peak RSS (VmHWM): ${describeBytes(peak)}, reached ${peakPhase}; ${describeBytes(atRest.residentBytes)} at rest before the upload  ` +
      `target < ${describeBytes(TARGET_PEAK_RSS_BYTES)}: ${met(peak < TARGET_PEAK_RSS_BYTES)}`,
  );

  const held = await registerCounts(stack.databaseUrl, file.structureNumbers);
  const expected: RegisterCounts = { structures: file.rowsPerSheet.structures, spans: file.rowsPerSheet.spans, girders: file.rowsPerSheet.girders, strandRows: file.rowsPerSheet['strand-rows'] };
  const asExpected = (Object.keys(expected) as (keyof RegisterCounts)[]).every((key) => held[key] === expected[key]);
  console.log(
    `  the register holds under the file's structure numbers: ${held.structures} structures, ${held.spans} spans, ${held.girders} girders, ${held.strandRows} strand rows — ` +
      (asExpected ? 'as the file says' : `NOT as the file says (${expected.structures}, ${expected.spans}, ${expected.girders}, ${expected.strandRows})`),
  );
  if (!asExpected) throw new Error('the committed import did not leave the register holding what the file says');
  await timeStructureHistory(http, stack.databaseUrl, file.structureNumbers[0]!);
});
