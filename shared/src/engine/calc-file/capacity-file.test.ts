import { parseCapacityFile } from './capacity-file';
import { rectangleFile, strand127 } from '../capacity/test-files';

/** The paths of every issue a file raises, with their messages. */
function issuesOf(input: unknown): string[] {
  const result = parseCapacityFile(input);
  return result.ok ? [] : result.issues.map((issue) => `${issue.path}: ${issue.message}`);
}

type Mutable = Record<string, any>;
function edited(edit: (file: Mutable) => void): unknown {
  const file = structuredClone(rectangleFile()) as Mutable;
  edit(file);
  return file;
}

describe('the capacity calculation file', () => {
  it('accepts a sound file and fills in the defaults', () => {
    const result = parseCapacityFile(rectangleFile());
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.file.options).toEqual({ method: 'strain-compatibility', strandCurve: 'power', concreteModel: 'whitney', haunchInSection: false });
    expect(result.file.girder.strandRows[0]?.bonded).toBe(true);
    expect(result.file.girder.tensioning).toBe('pre');
  });

  it.each([
    ['a negative strand area', (f: Mutable) => (f.girder.strandRows[1].strandAreaMm2 = -98.7), 'girder.strandRows[1].strandAreaMm2: must be > 0'],
    ['an unknown shape', (f: Mutable) => (f.girder.section = { shape: 'hexagon', widthMm: 300 }), 'girder.section.shape:'],
    ['an unknown key', (f: Mutable) => (f.girder.concrete.colour = 'grey'), 'girder.concrete.colour: unknown key'],
    ['a strength without its basis', (f: Mutable) => delete f.girder.concrete.basis, 'girder.concrete.basis:'],
    ['US customary units', (f: Mutable) => (f.units = 'us'), 'units: must be "si"'],
    ['fpy above fpu', (f: Mutable) => (f.girder.strandRows[0].fpyMpa = 1900), 'girder.strandRows[0].fpyMpa: must be less than fpuMpa (1860)'],
    ['a row outside the section', (f: Mutable) => (f.girder.strandRows[0].yMm = 950), 'girder.strandRows[0].yMm: 950 mm is not inside the girder section'],
    ['a strand position outside the section', (f: Mutable) => Object.assign(f.girder.strandRows[1], { xMm: [-150, -50, 50, 250] }), 'girder.strandRows[1].xMm[3]: (250, 110) mm is not inside the girder section'],
    ['positions that do not match the count', (f: Mutable) => (f.girder.strandRows[1].xMm = [0, 50]), 'girder.strandRows[1].xMm: has 2 positions for 4 strands'],
    ['two rows with one id', (f: Mutable) => (f.girder.strandRows[1].id = 'r1'), 'girder.strandRows[1].id: id "r1" is used twice'],
    ['damage naming an unknown row', (f: Mutable) => (f.damage = [{ kind: 'lost-strands', rowId: 'r9', count: 1 }]), 'damage[0].rowId: no strand row has id "r9"'],
    ['more lost strands than the row has', (f: Mutable) => (f.damage = [{ kind: 'lost-strands', rowId: 'r2', count: 5 }]), 'damage[0].count: 5 strands named but row "r2" has only 4 left'],
    ['lost strands beyond what earlier entries left', (f: Mutable) => (f.damage = [{ kind: 'lost-strands', rowId: 'r2', count: 3 }, { kind: 'lost-strands', rowId: 'r2', count: 2 }]), 'damage[1].count: 2 strands named but row "r2" has only 1 left'],
    ['a strand index beyond the row', (f: Mutable) => (f.damage = [{ kind: 'lost-strands', rowId: 'r2', strands: [1, 4] }]), 'damage[0].strands[1]: row "r2" has strands 0–3 only'],
    ['a strand named twice', (f: Mutable) => (f.damage = [{ kind: 'lost-strands', rowId: 'r2', strands: [1, 1] }]), 'damage[0].strands[1]: strand 1 is named twice'],
    ['both a count and indexes', (f: Mutable) => (f.damage = [{ kind: 'exposed-strands', rowId: 'r2', count: 1, strands: [0] }]), 'damage[0]: give either "count" or "strands"'],
    ['a section loss over 100 %', (f: Mutable) => (f.damage = [{ kind: 'strand-area-loss', rowId: 'r1', count: 1, lossFraction: 0.6 }, { kind: 'strand-area-loss', rowId: 'r1', count: 1, lossFraction: 0.6 }]), 'damage[1].lossFraction: strand 0 would lose more than its whole area'],
    ['deck loss without a deck', (f: Mutable) => (f.damage = [{ kind: 'deck-loss', thicknessMm: 10 }]), 'damage[0].thicknessMm: deck loss on a girder without a deck'],
    ['a spall outside the girder', (f: Mutable) => (f.damage = [{ kind: 'concrete-loss', bottomFlange: { depthMm: 50, widthMm: 500 } }]), 'damage[0].bottomFlange: corner (-250, 0) mm lies outside the girder concrete'],
    ['the IS method with the PCI curve', (f: Mutable) => { f.options = { method: 'is1343', strandCurve: 'pci', concreteModel: 'is1343' }; f.girder.concrete.basis = 'cube'; }, 'options.strandCurve: the IS 1343 method does not use the PCI strand curves'],
    ['the IS method on a cylinder strength', (f: Mutable) => (f.options = { method: 'is1343' }), 'girder.concrete.basis: the IS 1343 method and concrete curve take a cube strength'],
    ['the AASHTO block on a cube strength', (f: Mutable) => (f.girder.concrete.basis = 'cube'), 'girder.concrete.basis: the whitney concrete model takes a cylinder strength'],
    ['the PCI curve on 1725 MPa-class strand of another grade', (f: Mutable) => { f.options = { strandCurve: 'pci' }; f.girder.strandRows[0].fpuMpa = 1600; f.girder.strandRows[0].fpyMpa = 1440; }, 'girder.strandRows[0].fpuMpa: the PCI strand curves cover only 1860 or 1725 MPa strand'],
    ['a haunch option without a deck', (f: Mutable) => (f.options = { haunchInSection: true }), 'options.haunchInSection: there is no deck, so no haunch'],
    ['a row without its effective prestress', (f: Mutable) => delete f.girder.strandRows[0].fpeMpa, 'girder.strandRows[0].fpeMpa: required for a capacity calculation'],
    ['an unbonded row without its length', (f: Mutable) => (f.girder.strandRows[0].bonded = false), 'girder.strandRows[0].unbondedLengthMm: required for an unbonded row'],
  ])('refuses %s, naming its path', (_what, edit, expected) => {
    const issues = issuesOf(edited(edit));
    expect(issues.some((issue) => issue.startsWith(expected))).toBe(true);
  });

  it('refuses a deck on a shape without a flat top', () => {
    const file = edited((f) => {
      f.girder.section = { shape: 'polygon', pointsMm: [[-200, 0], [200, 0], [0, 600]] };
      f.girder.deck = { widthMm: 2000, thicknessMm: 200, strengthMpa: 30, basis: 'cylinder' };
      f.girder.strandRows = [{ id: 'r1', yMm: 50, count: 2, ...strand127, fpeMpa: 1100 }];
    });
    expect(issuesOf(file)).toContain('girder.deck: a "polygon" section has no flat top for a deck to sit on');
  });

  it('reports every problem at once', () => {
    const file = edited((f) => {
      f.girder.strandRows[0].fpyMpa = 1900;
      f.damage = [{ kind: 'lost-strands', rowId: 'r9', count: 1 }];
    });
    expect(issuesOf(file)).toEqual(expect.arrayContaining([expect.stringMatching(/^girder\.strandRows\[0\]\.fpyMpa/), expect.stringMatching(/^damage\[0\]\.rowId/)]));
  });
});
