/**
 * `GET /api/structures?bbox=…` under load: the real server over 10 000 structures, signed in,
 * with autocannon cycling through regional map views of a few hundred structures each on
 * loopback, first from one connection, then four, then ten. Prints latency percentiles and
 * requests per second against the target, and how busy the machine was meanwhile (the server,
 * PostgreSQL and autocannon share its cores); asserts no timing. Run through `npm run bench`.
 */
import autocannon from 'autocannon';
import { SESSION_COOKIE } from '../backend/src/auth/sessions';
import type { BoundingBox, StructureFeatureCollection } from '../shared/src';
import { SignInClient } from '../tests/support/sign-in-client';
import { BENCH_SUBJECT, startBenchStack } from './support/bench-stack';
import { runBenchmark } from './support/clean-up';
import { describeMachineLoad, processWithChildren, watchMachineLoad, type MachineLoad, type WatchedProcesses } from './support/machine-load';

const TARGET_P95_MS = 50;
/**
 * One person panning the map, a few at once, then a busy office: connections that each send the
 * next request as soon as the last is answered. The target is for 1 and 10; 4 shows the way between.
 */
const CONNECTION_COUNTS = [1, 4, 10] as const;
const DURATION_S = 10;
const WARMUP_S = 3;
/** Views a district engineer might look at, about 1° by 0.8° (≈ 90 km by 90 km): a few hundred structures each. */
const REGIONAL_VIEWS: readonly BoundingBox[] = [
  { minLon: -101.5, minLat: 37.3, maxLon: -100.5, maxLat: 38.1 },
  { minLon: -99.2, minLat: 38.4, maxLon: -98.2, maxLat: 39.2 },
  { minLon: -97.6, minLat: 37.6, maxLon: -96.6, maxLat: 38.4 },
  { minLon: -96.3, minLat: 38.9, maxLon: -95.3, maxLat: 39.7 },
];

const bboxPath = (view: BoundingBox) => `/api/structures?bbox=${[view.minLon, view.minLat, view.maxLon, view.maxLat].join(',')}`;

/** The value below which `fraction` of the sorted sample lies (nearest rank). */
function percentile(sortedMs: readonly number[], fraction: number): number {
  const rank = Math.max(1, Math.ceil(fraction * sortedMs.length));
  return sortedMs[rank - 1] as number;
}

const ms = (value: number) => `${value.toFixed(1)} ms`;

/** Asks for each view once, as the signed-in user, to check the answers and count what each holds. */
async function structuresPerView(client: SignInClient): Promise<number[]> {
  const counts: number[] = [];
  for (const view of REGIONAL_VIEWS) {
    const response = await client.request(bboxPath(view));
    if (response.status !== 200) throw new Error(`${bboxPath(view)} answered ${response.status}: ${response.text.slice(0, 300)}`);
    const body = JSON.parse(response.text) as StructureFeatureCollection;
    if (body.truncated) throw new Error(`${bboxPath(view)} was cut short by the page limit: choose a smaller view`);
    counts.push(body.features.length);
  }
  return counts;
}

interface LoadFigures {
  readonly sortedMs: readonly number[];
  readonly requestsPerSecond: number;
  readonly bytesPerSecond: number;
  /** How busy the machine was meanwhile: the server, PostgreSQL and autocannon share its cores with anything else running. */
  readonly machineLoad: MachineLoad;
}

/** One autocannon run; every response's time is kept, since autocannon's own percentiles have no p95. */
async function applyLoad(options: autocannon.Options, watched: WatchedProcesses): Promise<LoadFigures> {
  const latenciesMs: number[] = [];
  const statuses = new Map<number, number>();
  const machine = watchMachineLoad(watched);
  const run = autocannon(options);
  run.on('response', (_client, statusCode, _bytes, responseTimeMs) => {
    latenciesMs.push(responseTimeMs);
    statuses.set(statusCode, (statuses.get(statusCode) ?? 0) + 1);
  });
  const result = await run;
  const machineLoad = machine.stop();
  if (result.non2xx > 0 || result.errors > 0) {
    const byStatus = [...statuses].map(([status, count]) => `${count} × ${status}`).join(', ');
    throw new Error(`not every request succeeded (${byStatus}; ${result.errors} connection errors, ${result.timeouts} timeouts): the figures would mean nothing`);
  }
  return { sortedMs: latenciesMs.sort((a, b) => a - b), requestsPerSecond: result.requests.average, bytesPerSecond: result.throughput.average, machineLoad };
}

function report(connections: number, { sortedMs, requestsPerSecond, bytesPerSecond, machineLoad }: LoadFigures): void {
  const p95 = percentile(sortedMs, 0.95);
  const label = `${connections} connection${connections === 1 ? '' : 's'}:`.padEnd(16);
  console.log(
    `  ${label}p50 ${ms(percentile(sortedMs, 0.5))}  p95 ${ms(p95)}  p99 ${ms(percentile(sortedMs, 0.99))}  max ${ms(sortedMs.at(-1) ?? 0)}  ` +
      `${Math.round(requestsPerSecond)} requests/s (${(bytesPerSecond / 1e6).toFixed(1)} MB/s)  ` +
      `target p95 < ${TARGET_P95_MS} ms: ${p95 < TARGET_P95_MS ? 'met' : 'NOT met'}`,
  );
  console.log(`  ${''.padEnd(16)}${describeMachineLoad(machineLoad)}`);
}

runBenchmark(async (cleanUp) => {
  const stack = await startBenchStack(cleanUp, { forBrowser: false });
  const url = new URL(stack.appUrl);
  if (url.hostname !== '127.0.0.1') throw new Error(`the benchmark sends load to loopback only, not to ${url.hostname}`);

  const client = new SignInClient(stack.appUrl);
  await client.signInAs(BENCH_SUBJECT);
  const session = client.cookie(SESSION_COOKIE);
  if (!session) throw new Error(`signing in as ${BENCH_SUBJECT} set no ${SESSION_COOKIE} cookie`);
  const counts = await structuresPerView(client);

  const load = (connections: number, duration: number): autocannon.Options => ({
    url: stack.appUrl,
    connections,
    duration,
    headers: { cookie: `${SESSION_COOKIE}=${session}`, accept: 'application/geo+json' },
    requests: REGIONAL_VIEWS.map((view) => ({ method: 'GET', path: bboxPath(view) })),
  });
  const watched: WatchedProcesses = new Map([
    ['server', () => [stack.serverPid]],
    ['PostgreSQL', () => processWithChildren(stack.databasePid)],
    ['autocannon', () => [process.pid]],
  ]);
  await applyLoad(load(Math.max(...CONNECTION_COUNTS), WARMUP_S), watched);
  console.log(
    `GET /api/structures?bbox=… over ${stack.structureCount} structures, signed in, ${REGIONAL_VIEWS.length} regional views of ` +
      `${Math.min(...counts)}–${Math.max(...counts)} structures in turn, ${DURATION_S} s per load after a ${WARMUP_S} s warm-up:`,
  );
  for (const connections of CONNECTION_COUNTS) {
    report(connections, await applyLoad(load(connections, DURATION_S), watched));
    // Requests whose connection autocannon closed at the end are still being answered: let them finish first.
    await structuresPerView(client);
  }
});
