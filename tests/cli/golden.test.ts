import { firstJsonDifference } from './support/compare-json';
import { goldenOutput, RATE_EXAMPLES, readExample, VALID_EXAMPLES } from './support/examples';
import { runSpanledger } from './support/run-spanledger';

// Each run starts Node and tsx afresh (about a second).
jest.setTimeout(30_000);

describe('spanledger capacity on the examples', () => {
  it('has the examples the documentation describes', () => {
    expect(VALID_EXAMPLES).toEqual(['bulb-tee-composite-damaged', 'i-girder-aashto-approximate', 'is1343-check', 'rectangle-two-rows']);
  });

  it.each(VALID_EXAMPLES)('%s: exit 0, nothing on stderr, output as the golden file', async (name) => {
    const run = await runSpanledger(['capacity', `examples/${name}.json`]);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(firstJsonDifference(JSON.parse(run.stdout), goldenOutput(name))).toBeNull();
  });

  it('reads the file from standard input with "-"', async () => {
    const run = await runSpanledger(['capacity', '-'], readExample('bulb-tee-composite-damaged.json'));
    expect(run.status).toBe(0);
    expect(firstJsonDifference(JSON.parse(run.stdout), goldenOutput('bulb-tee-composite-damaged'))).toBeNull();
  });

  it('prints one pretty JSON document with a trailing newline', async () => {
    const run = await runSpanledger(['capacity', 'examples/rectangle-two-rows.json']);
    expect(run.stdout).toBe(`${JSON.stringify(JSON.parse(run.stdout), null, 2)}\n`);
  });

  it('carries the caution and the warnings, the IS method its partial-factor note', async () => {
    const run = await runSpanledger(['capacity', 'examples/is1343-check.json']);
    const output = JSON.parse(run.stdout) as { caution: string; warnings: string[]; phi: number };
    expect(output.caution).toMatch(/^Results support, and do not replace, the judgement of a licensed engineer\./);
    expect(output.phi).toBe(1);
    expect(output.warnings).toEqual(expect.arrayContaining([expect.stringMatching(/partial factors/)]));
  });
});

describe('spanledger rate on the examples', () => {
  it('has the sound, damaged, exterior, harped and debonded examples', () => {
    expect(RATE_EXAMPLES).toEqual([
      'rate/debonded-girder-computed-losses',
      'rate/exterior-girder',
      'rate/harped-girder-with-break',
      'rate/interior-girder-damaged',
      'rate/interior-girder-sound',
    ]);
  });

  it.each(RATE_EXAMPLES)('%s: exit 0, nothing on stderr, output as the golden file', async (name) => {
    const run = await runSpanledger(['rate', `examples/${name}.json`]);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(firstJsonDifference(JSON.parse(run.stdout), goldenOutput(name))).toBeNull();
  });

  it('rates the damaged girder lower than the sound one and posts it, with the caution and the shear warning', async () => {
    const sound = JSON.parse((await runSpanledger(['rate', 'examples/rate/interior-girder-sound.json'])).stdout);
    const damaged = JSON.parse((await runSpanledger(['rate', 'examples/rate/interior-girder-damaged.json'])).stdout);
    const lowest = (output: { summary: { controlling: { ratingFactor: number }[] } }) => Math.min(...output.summary.controlling.map((c) => c.ratingFactor));
    expect(lowest(damaged)).toBeLessThan(lowest(sound));
    expect(damaged.summary.posting.length).toBeGreaterThan(0);
    expect(damaged.caution).toMatch(/licensed engineer/);
    expect(damaged.summary.warnings).toContain('shear not rated: this version rates flexure only');
  });
});

describe('spanledger --help', () => {
  it('lists the capacity and rate commands on stdout and exits 0', async () => {
    const run = await runSpanledger(['--help']);
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/^\s+capacity FILE\.json\s/m);
    expect(run.stdout).toMatch(/^\s+rate FILE\.json\s/m);
    expect(run.stderr).toBe('');
  });

  it('prints the usage on stderr with exit 2 when given no command', async () => {
    const run = await runSpanledger([]);
    expect(run.status).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/capacity FILE\.json/);
  });
});
