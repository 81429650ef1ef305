/**
 * Strain-compatibility solves per second and heap allocated per solve, on one core:
 * (a) a rectangle with two strand rows, (b) a composite bulb-tee (width profile) with six
 * strand rows and three damage entries. Run through `npm run bench`, which starts node with
 * --expose-gc and a semi-space large enough that no scavenge runs inside a measured batch,
 * so the heap growth over a batch is what the solves allocated.
 */
import { parseCapacityFile } from '../calc-file/capacity-file';
import { buildSectionModel } from './build-section-model';
import { computeCapacity } from './capacity';
import { strainCompatibilityStrength } from './strain-compatibility';
import { bulbTeeFile, rectangleFile } from './test-files';

const cases = {
  '(a) rectangle, 2 strand rows': rectangleFile(),
  '(b) composite bulb-tee, 6 rows, 3 damage entries': bulbTeeFile({
    damage: [
      { kind: 'lost-strands', rowId: 'r1', count: 2 },
      { kind: 'strand-area-loss', rowId: 'r2', count: 3, lossFraction: 0.2 },
      { kind: 'concrete-loss', bottomFlange: { depthMm: 40, widthMm: 600 } },
    ],
  }),
};

const runGc = (globalThis as { gc?: () => void }).gc;

function measure(label: string, solve: () => number): void {
  for (let i = 0; i < 2000; i++) solve(); // warm up the optimising compiler
  const batch = 2000;
  runGc?.();
  const heapBefore = process.memoryUsage().heapUsed;
  let checksum = 0;
  for (let i = 0; i < batch; i++) checksum += solve();
  const heapPerSolve = (process.memoryUsage().heapUsed - heapBefore) / batch;

  const seconds = 2;
  let solves = 0;
  const started = process.hrtime.bigint();
  const deadline = started + BigInt(seconds * 1e9);
  while (process.hrtime.bigint() < deadline) {
    for (let i = 0; i < 100; i++) checksum += solve();
    solves += 100;
  }
  const elapsed = Number(process.hrtime.bigint() - started) / 1e9;
  const heapText = runGc ? `${(heapPerSolve / 1024).toFixed(1)} KiB/solve` : 'heap n/a (run with --expose-gc)';
  // The checksum keeps the work from being optimised away.
  console.log(`${label.padEnd(62)} ${Math.round(solves / elapsed).toString().padStart(8)} solves/s  ${heapText}  (checksum ${checksum.toFixed(0)})`);
}

for (const [name, input] of Object.entries(cases)) {
  const parsed = parseCapacityFile(input);
  if (!parsed.ok) throw new Error(`${name}: ${parsed.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
  const file = parsed.file;
  const model = buildSectionModel(file);
  const options = { strandCurve: file.options.strandCurve, concreteModel: file.options.concreteModel };
  measure(`${name}: solve`, () => strainCompatibilityStrength(model, options).nominalMomentKnm);
  measure(`${name}: build + solve`, () => computeCapacity(file).nominalMomentKnm);
}
