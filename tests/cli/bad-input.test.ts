import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { readExample, rectangleWith } from './support/examples';
import { runSpanledger, type CliRun } from './support/run-spanledger';

// Each run starts Node and tsx afresh (about a second).
jest.setTimeout(30_000);

/** Bad input: exit status 2, nothing on stdout, and stderr naming the offending path. */
function expectBadInput(run: CliRun, expectedLine: string | RegExp): void {
  expect(run.stdout).toBe('');
  expect(run.status).toBe(2);
  const lines = run.stderr.trimEnd().split('\n');
  if (typeof expectedLine === 'string') expect(lines).toContain(expectedLine);
  else expect(lines).toEqual(expect.arrayContaining([expect.stringMatching(expectedLine)]));
}

describe('spanledger capacity on bad input', () => {
  let scratchDir: string;
  beforeAll(() => {
    scratchDir = fs.mkdtempSync(path.join(os.tmpdir(), 'spanledger-cli-'));
  });
  afterAll(() => fs.rmSync(scratchDir, { recursive: true, force: true }));

  it('a negative strand area (examples/bad/bad-negative-area.json)', async () => {
    const run = await runSpanledger(['capacity', 'examples/bad/bad-negative-area.json']);
    expectBadInput(run, 'girder.strandRows[1].strandAreaMm2: must be > 0');
  });

  it('more lost strands than the row has (examples/bad/bad-more-lost-than-row.json)', async () => {
    const run = await runSpanledger(['capacity', 'examples/bad/bad-more-lost-than-row.json']);
    expectBadInput(run, /^damage\[0\]\.count: 7 strands named but row "r2" has only 6/);
  });

  it('an unknown section shape', async () => {
    const file = rectangleWith((f) => {
      f.girder.section = { shape: 'trapezoid', widthMm: 500, depthMm: 1000 };
    });
    expectBadInput(await runSpanledger(['capacity', '-'], file), /^girder\.section\.shape: /);
  });

  it('damage naming a strand row id that does not exist', async () => {
    const file = rectangleWith((f) => {
      f.damage = [{ kind: 'lost-strands', rowId: 'r9', count: 1 }];
    });
    expectBadInput(await runSpanledger(['capacity', '-'], file), 'damage[0].rowId: no strand row has id "r9"');
  });

  it('an unknown key', async () => {
    const file = rectangleWith((f) => {
      f.girder.strandRows[0]!.strandAreaMM2 = 140;
    });
    expectBadInput(await runSpanledger(['capacity', '-'], file), 'girder.strandRows[0].strandAreaMM2: unknown key');
  });

  it('malformed JSON, with the line and column of the fault', async () => {
    const broken = path.join(scratchDir, 'broken.json');
    // The comma after "si" is missing: the fault is where "girder" starts, line 3, column 3.
    fs.writeFileSync(broken, readExample('rectangle-two-rows.json').replace('"units": "si",', '"units": "si"'));
    const run = await runSpanledger(['capacity', broken]);
    expectBadInput(run, /^.*broken\.json: line 3, column 3: malformed JSON: /);
  });

  it('a file that does not exist', async () => {
    const run = await runSpanledger(['capacity', 'examples/no-such-girder.json']);
    expectBadInput(run, 'examples/no-such-girder.json: cannot read the file (no such file)');
  });

  it('names every offending path at once, one line each', async () => {
    const file = rectangleWith((f) => {
      f.girder.strandRows[0]!.strandAreaMm2 = 0;
      f.girder.strandRows[1]!.count = 2.5;
    });
    const run = await runSpanledger(['capacity', '-'], file);
    expectBadInput(run, 'girder.strandRows[0].strandAreaMm2: must be > 0');
    expect(run.stderr).toBe('girder.strandRows[0].strandAreaMm2: must be > 0\ngirder.strandRows[1].count: must be a whole number\n');
  });

  it('a method that cannot take the section (EngineInputError)', async () => {
    const file = rectangleWith((f) => {
      f.girder.section = { shape: 'polygon', pointsMm: [[-250, 0], [250, 0], [250, 1000], [-250, 1000]] };
      f.options = { method: 'aashto-approximate' };
    });
    expectBadInput(await runSpanledger(['capacity', '-'], file), /^options\.method: the AASHTO approximate method needs/);
  });

  it('an unknown command', async () => {
    const run = await runSpanledger(['design', 'examples/rectangle-two-rows.json']);
    expectBadInput(run, 'spanledger: unknown command "design"');
  });

  it('a capacity file given to rate names what a rating needs', async () => {
    const run = await runSpanledger(['rate', 'examples/rectangle-two-rows.json']);
    expectBadInput(run, /^span: /m);
  });
});

describe('spanledger rate on bad input', () => {
  /** The sound rating example with a change applied, as JSON text. */
  const ratingWith = (change: (file: any) => void): string => {
    const file = JSON.parse(readExample('rate/interior-girder-sound.json'));
    change(file);
    return JSON.stringify(file);
  };

  it.each([
    ['a negative span length', (f: any) => (f.span.lengthM = -27.4), 'span.lengthM: must be > 0'],
    ['damage outside the span', (f: any) => (f.damage = [{ kind: 'lost-strands', rowId: 'r1', count: 1, fromM: 26, toM: 30 }]), 'damage[0].toM: lies beyond the span (27.4 m)'],
    ['an unknown vehicle id', (f: any) => f.vehicles.push('hs25'), /^vehicles\[8\]: /],
    ['a profile for a row that does not exist', (f: any) => (f.profiles = [{ rowId: 'r9', shape: 'straight' }]), 'profiles[0].rowId: no strand row has id "r9"'],
  ])('%s: exit 2 naming the path', async (_what, change, expected) => {
    expectBadInput(await runSpanledger(['rate', '-'], ratingWith(change)), expected);
  });
});
