import { findingDetail, strandRow } from './girders.testing';
import { strandStatesOfOpenFindings } from './strand-states';

const ROWS = [strandRow({ id: 'r1', count: 6 }), strandRow({ id: 'r2', yMm: 110, count: 4 })];

describe('strandStatesOfOpenFindings', () => {
  it('crosses out the named lost strands and leaves every other strand intact', () => {
    const { states, unplaced } = strandStatesOfOpenFindings([findingDetail({ strands: { rowId: 'r1', strands: [0, 5] } })], ROWS);

    expect(states).toEqual({ r1: ['lost', 'intact', 'intact', 'intact', 'intact', 'lost'], r2: ['intact', 'intact', 'intact', 'intact'] });
    expect(unplaced).toEqual([]);
  });

  it('reads section loss and broken wires as section loss, exposed strands as exposed', () => {
    const findings = [
      findingDetail({ id: 3, kind: 'exposed-strands', strands: { rowId: 'r2', strands: [3] } }),
      findingDetail({ id: 2, kind: 'broken-wires', brokenWires: 2, strands: { rowId: 'r2', strands: [1] } }),
      findingDetail({ id: 1, kind: 'strand-section-loss', lossFraction: 0.2, strands: { rowId: 'r1', strands: [2] } }),
    ];

    const { states } = strandStatesOfOpenFindings(findings, ROWS);

    expect(states['r1']).toEqual(['intact', 'intact', 'section-loss', 'intact', 'intact', 'intact']);
    expect(states['r2']).toEqual(['intact', 'section-loss', 'intact', 'exposed']);
  });

  it('takes a count from the lowest-numbered strands still standing, older findings first', () => {
    // The register lists newest first: the older finding lost strand 0, so the newer count of two takes 1 and 2.
    const findings = [findingDetail({ id: 8, strands: { rowId: 'r1', count: 2 } }), findingDetail({ id: 7, strands: { rowId: 'r1', strands: [0] } })];

    expect(strandStatesOfOpenFindings(findings, ROWS).states['r1']).toEqual(['lost', 'lost', 'lost', 'intact', 'intact', 'intact']);
  });

  it('draws a lost strand lost even when it also has section loss, and section loss before exposure', () => {
    const findings = [
      findingDetail({ id: 3, kind: 'exposed-strands', strands: { rowId: 'r1', strands: [0, 1] } }),
      findingDetail({ id: 2, kind: 'lost-strands', strands: { rowId: 'r1', strands: [0] } }),
      findingDetail({ id: 1, kind: 'strand-section-loss', lossFraction: 0.1, strands: { rowId: 'r1', strands: [0, 1] } }),
    ];

    expect(strandStatesOfOpenFindings(findings, ROWS).states['r1']!.slice(0, 2)).toEqual(['lost', 'section-loss']);
  });

  it('leaves out findings that are repaired, superseded or still in a draft, and findings on concrete', () => {
    const findings = [
      findingDetail({ id: 1, registerState: 'repaired' }),
      findingDetail({ id: 2, registerState: 'superseded' }),
      findingDetail({ id: 3, registerState: 'draft' }),
      findingDetail({ id: 4, kind: 'spall', strands: null, spall: { depthMm: 40, widthMm: 300 } }),
    ];

    const { states } = strandStatesOfOpenFindings(findings, ROWS);

    expect(states['r1']).toEqual(Array(6).fill('intact'));
    expect(states['r2']).toEqual(Array(4).fill('intact'));
  });

  it('names the findings whose strands the current rows do not have', () => {
    const findings = [findingDetail({ id: 12, strands: { rowId: 'r9', strands: [0] } }), findingDetail({ id: 11, strands: { rowId: 'r2', count: 5 } })];

    const { unplaced } = strandStatesOfOpenFindings(findings, ROWS);

    expect(unplaced).toEqual([
      'Lost strands (finding 11): 5 strands named but row "r2" has only 4 left that this damage can reach',
      'Lost strands (finding 12): no strand row has id "r9"',
    ]);
  });
});
