import { parseCapacityFile } from '../../shared/src/engine/calc-file/capacity-file';
import { computeCapacity } from '../../shared/src/engine/capacity/capacity';
import { runCli, type CliIo } from '../../shared/src/cli/run-cli';
import { firstJsonDifference } from './support/compare-json';
import { readExample, rectangleWith, VALID_EXAMPLES } from './support/examples';

/** A fake process: files from a map, standard input from a string, output collected. */
function fakeIo(files: Record<string, string> = {}, stdin = '', overrides: Partial<CliIo> = {}) {
  const written = { stdout: '', stderr: '' };
  const io: CliIo = {
    readFile: async (path) => {
      if (path in files) return files[path]!;
      throw Object.assign(new Error(`ENOENT: no such file or directory, open '${path}'`), { code: 'ENOENT' });
    },
    readStdin: async () => stdin,
    stdout: (text) => (written.stdout += text),
    stderr: (text) => (written.stderr += text),
    ...overrides,
  };
  return { io, written };
}

async function run(args: string[], files: Record<string, string> = {}, stdin = '', overrides: Partial<CliIo> = {}) {
  const { io, written } = fakeIo(files, stdin, overrides);
  const status = await runCli(args, io);
  return { status, ...written };
}

describe('runCli', () => {
  it.each(VALID_EXAMPLES)('%s: the same numbers as parseCapacityFile + computeCapacity', async (name) => {
    const text = readExample(`${name}.json`);
    const parsed = parseCapacityFile(JSON.parse(text));
    if (!parsed.ok) throw new Error(`example ${name} does not parse: ${JSON.stringify(parsed.issues)}`);
    const result = await run(['capacity', 'girder.json'], { 'girder.json': text });
    expect(result.status).toBe(0);
    // Through JSON both ways, so that a key present but undefined would still show.
    const direct = JSON.parse(JSON.stringify(computeCapacity(parsed.file))) as unknown;
    expect(firstJsonDifference(JSON.parse(result.stdout), direct)).toBeNull();
  });

  it('reads standard input for "-"', async () => {
    const result = await run(['capacity', '-'], {}, readExample('rectangle-two-rows.json'));
    expect(result.status).toBe(0);
    expect(JSON.parse(result.stdout)).toMatchObject({ method: 'strain-compatibility' });
  });

  it('accepts a file saved with a UTF-8 byte-order mark', async () => {
    const result = await run(['capacity', 'bom.json'], { 'bom.json': `\uFEFF${readExample('rectangle-two-rows.json')}` });
    expect(result.status).toBe(0);
  });

  it('prints usage on stdout for --help and -h, exit 0', async () => {
    for (const flag of ['--help', '-h']) {
      const result = await run([flag]);
      expect(result.status).toBe(0);
      expect(result.stdout).toMatch(/capacity FILE\.json/);
      expect(result.stderr).toBe('');
    }
  });

  it.each([
    [[], /^Usage: spanledger/],
    [['design', 'x.json'], /^spanledger: unknown command "design"\n/],
    [['rate'], /^spanledger: rate takes one FILE\.json/],
    [['capacity'], /^spanledger: capacity takes one FILE\.json/],
    [['capacity', 'a.json', 'b.json'], /^spanledger: capacity takes one FILE\.json/],
    [['capacity', '--verbose'], /^spanledger: unknown option "--verbose"/],
  ])('%j: usage on stderr, exit 2', async (args, firstLines) => {
    const result = await run(args);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toMatch(firstLines);
    expect(result.stderr).toMatch(/capacity FILE\.json/);
  });

  it('names the line and column of malformed JSON when JSON.parse gives the position', async () => {
    const result = await run(['capacity', '-'], {}, '{\n  "units": "si"\n  "girder": {}\n}');
    expect(result.status).toBe(2);
    expect(result.stderr).toMatch(/^standard input: line 3, column 3: malformed JSON: \S/);
    expect(result.stderr).not.toMatch(/position/);
  });

  it('reports malformed JSON without a position as it comes', async () => {
    const result = await run(['capacity', '-'], {}, '');
    expect(result.stderr).toBe('standard input: malformed JSON: Unexpected end of JSON input\n');
  });

  it('puts two problems at one path on one line', async () => {
    // A cube-strength formula for Ec meets two cylinder strengths: both problems sit at the option.
    const file = rectangleWith((f) => {
      f.girder.deck = { widthMm: 2000, thicknessMm: 200, strengthMpa: 30, basis: 'cylinder' };
      f.options = { elasticModulusFormula: 'is-456' };
    });
    const result = await run(['capacity', '-'], {}, file);
    expect(result.status).toBe(2);
    expect(result.stderr).toBe(
      'options.elasticModulusFormula: is-456 takes a cube strength, but girder.concrete gives a cylinder strength; ' +
        'is-456 takes a cube strength, but girder.deck gives a cylinder strength\n',
    );
  });

  it('refuses a file the schema accepts but the method cannot take, at the path the engine names', async () => {
    const file = rectangleWith((f) => {
      f.girder.section = { shape: 'polygon', pointsMm: [[-250, 0], [250, 0], [250, 1000], [-250, 1000]] };
      f.options = { method: 'is1343', concreteModel: 'is1343' };
      (f.girder.concrete as Record<string, unknown>).basis = 'cube';
    });
    const result = await run(['capacity', '-'], {}, file);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toMatch(/^options\.method: IS 1343 Appendix B needs a rectangular or flanged compression zone/);
  });

  it('any other failure: exit 1, a short message, the stack only with SPANLEDGER_DEBUG', async () => {
    const failing = { readStdin: () => Promise.reject(new Error('standard input closed')) };
    const quiet = await run(['capacity', '-'], {}, '', failing);
    expect(quiet.status).toBe(1);
    expect(quiet.stdout).toBe('');
    expect(quiet.stderr).toBe('spanledger: standard input closed\nset SPANLEDGER_DEBUG=1 to see the stack\n');
    const debug = await run(['capacity', '-'], {}, '', { ...failing, debug: true });
    expect(debug.status).toBe(1);
    expect(debug.stderr).toMatch(/^spanledger: standard input closed\nError: standard input closed\n\s+at /);
  });
});
