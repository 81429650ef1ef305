/**
 * Operations per second of the material functions the strength solvers call inside their root
 * finders. Run: `node --import tsx shared/src/engine/materials/materials.bench.ts`.
 */
import { isConcreteStressMpa, todeschiniStressMpa } from './concrete';
import { mildSteelStressMpa } from './mild-steel';
import { flexureResistanceFactor } from './resistance-factor';
import { strandStressFor, type StrandMaterial } from './strand';

const CALLS = 2_000_000;
const strand: StrandMaterial = { epsMpa: 196_500, fpuMpa: 1860, fpyMpa: 1674 };
const girderConcrete = { fcMpa: 45, ecMpa: 31_500 };
const bar = { fyMpa: 420 };

/** Strains swept across each curve's range, so every branch is exercised. */
function strainAt(call: number, highestStrain: number): number {
  return ((call % 1000) / 1000) * highestStrain;
}

const cases: Record<string, (call: number) => number> = {
  'strandStressFor power': (call) => strandStressFor('power', strainAt(call, 0.03), strand),
  'strandStressFor pci': (call) => strandStressFor('pci', strainAt(call, 0.03), strand),
  'strandStressFor is1343': (call) => strandStressFor('is1343', strainAt(call, 0.03), strand),
  todeschiniStressMpa: (call) => todeschiniStressMpa(strainAt(call, 0.003), girderConcrete),
  isConcreteStressMpa: (call) => isConcreteStressMpa(strainAt(call, 0.0035), 40),
  mildSteelStressMpa: (call) => mildSteelStressMpa(strainAt(call, 0.01), bar),
  flexureResistanceFactor: (call) => flexureResistanceFactor(strainAt(call, 0.01), 'prestressed'),
};

for (const [name, evaluate] of Object.entries(cases)) {
  let checksum = 0;
  const started = process.hrtime.bigint();
  for (let call = 0; call < CALLS; call++) checksum += evaluate(call);
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  // The checksum is printed so the engine cannot discard the loop as unused work.
  console.log(`${name.padEnd(24)} ${(CALLS / seconds / 1e6).toFixed(1).padStart(6)} M ops/s  (checksum ${checksum.toFixed(0)})`);
}
