import { damageEntryOfFinding, findingChange, isCriticalFinding, newFinding, type FindingDamage } from './inspections';

const base: FindingDamage = { kind: 'lost-strands', strands: { rowId: 'r1', strands: [0, 3] }, lossFraction: null, brokenWires: null, spall: null, deckLossMm: null, fromM: 8, toM: 9.5, id: 41 };

describe('damageEntryOfFinding', () => {
  it('maps each kind onto the calculation file’s damage entry at its place along the span', () => {
    expect(damageEntryOfFinding(base)).toEqual({ kind: 'lost-strands', rowId: 'r1', strands: [0, 3], fromM: 8, toM: 9.5, findingId: 41 });
    expect(damageEntryOfFinding({ ...base, kind: 'strand-section-loss', strands: { rowId: 'r2', count: 2 }, lossFraction: 0.2 })).toEqual({
      kind: 'strand-area-loss', rowId: 'r2', count: 2, lossFraction: 0.2, fromM: 8, toM: 9.5, findingId: 41,
    });
    expect(damageEntryOfFinding({ ...base, kind: 'exposed-strands' })).toMatchObject({ kind: 'exposed-strands', strands: [0, 3] });
    expect(damageEntryOfFinding({ ...base, kind: 'spall', strands: null, spall: { depthMm: 60, widthMm: 300 } })).toMatchObject({ kind: 'concrete-loss', bottomFlange: { depthMm: 60, widthMm: 300 } });
    expect(damageEntryOfFinding({ ...base, kind: 'deck-loss', strands: null, deckLossMm: 25 })).toMatchObject({ kind: 'deck-loss', thicknessMm: 25 });
  });

  it('takes broken wires as a seventh of the strand’s area each (seven-wire strand, ASTM A416; hand check from the definition)', () => {
    expect(damageEntryOfFinding({ ...base, kind: 'broken-wires', brokenWires: 2 })).toMatchObject({ kind: 'strand-area-loss', lossFraction: 2 / 7 });
  });

  it('gives no entry for cracks and other findings, which no capacity method models', () => {
    expect(damageEntryOfFinding({ ...base, kind: 'crack', strands: null })).toBeNull();
    expect(damageEntryOfFinding({ ...base, kind: 'other', strands: null })).toBeNull();
  });
});

describe('isCriticalFinding', () => {
  it('alerts on newly broken strands or wires and on anything marked critical', () => {
    expect(isCriticalFinding({ kind: 'lost-strands', severity: 'moderate', disposition: 'new' })).toBe(true);
    expect(isCriticalFinding({ kind: 'broken-wires', severity: 'minor', disposition: 'grown' })).toBe(true);
    expect(isCriticalFinding({ kind: 'lost-strands', severity: 'severe', disposition: 'confirmed' })).toBe(false);
    expect(isCriticalFinding({ kind: 'spall', severity: 'critical', disposition: 'confirmed' })).toBe(true);
    expect(isCriticalFinding({ kind: 'crack', severity: 'severe', disposition: 'new' })).toBe(false);
  });
});

describe('newFinding and findingChange', () => {
  const finding = { girderId: 7, kind: 'lost-strands', strands: { rowId: 'r1', strands: [1, 2] }, fromM: 3, toM: 4, severity: 'severe' };
  const fields = (result: { error?: { issues: { path: PropertyKey[] }[] } }) => (result.error?.issues ?? []).map((issue) => issue.path.join('.'));

  it('requires what the kind needs and refuses what it does not use', () => {
    expect(newFinding.safeParse(finding).success).toBe(true);
    expect(fields(newFinding.safeParse({ ...finding, strands: null }))).toEqual(['strands']);
    expect(fields(newFinding.safeParse({ ...finding, kind: 'strand-section-loss' }))).toEqual(['lossFraction']);
    expect(fields(newFinding.safeParse({ ...finding, kind: 'spall' }))).toEqual(['strands', 'spall']);
    expect(fields(newFinding.safeParse({ ...finding, toM: 2 }))).toEqual(['toM']);
    expect(fields(newFinding.safeParse({ ...finding, strands: { rowId: 'r1', strands: [1], count: 1 } }))).toEqual(['strands.strands']);
    expect(fields(newFinding.safeParse({ ...finding, kind: 'broken-wires', brokenWires: 7 }))).toEqual(['brokenWires']);
  });

  it('takes the whole finding with its version and a disposition in a change', () => {
    const { girderId: _girderId, ...rest } = finding;
    expect(findingChange.safeParse({ ...rest, version: 2, disposition: 'grown' }).success).toBe(true);
    expect(fields(findingChange.safeParse({ ...rest, version: 2, girderId: 8 }))).toEqual(['']);
  });
});
