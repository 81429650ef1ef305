import { countsSummary, problemCountText, problemValueText, refusedText } from './imports-text';

describe('imports text', () => {
  it('sums up what an import held, template by template in the templates’ order', () => {
    expect(countsSummary({ spans: { rows: 2, create: 2, update: 0, unchanged: 0 }, structures: { rows: 1_204, create: 1_200, update: 3, unchanged: 1 } })).toBe(
      'Structures: 1,200 new, 3 changed, 1 unchanged; Spans: 2 new, 0 changed, 0 unchanged',
    );
    expect(countsSummary({})).toBe('No rows');
    // Refused rows are named when there are any; a check kept before they were counted has none to name.
    expect(countsSummary({ girders: { rows: 8, create: 5, update: 1, unchanged: 1, refused: 2 }, spans: { rows: 2, create: 2, update: 0, unchanged: 0, refused: 0 } })).toBe(
      'Spans: 2 new, 0 changed, 0 unchanged; Girders: 5 new, 1 changed, 1 unchanged, 2 refused',
    );
  });

  it('words problem counts and cell values for people', () => {
    expect(problemCountText(1)).toBe('1 problem');
    expect(problemCountText(2_500)).toBe('2,500 problems');
    expect(problemValueText(null)).toBe('—');
    expect(problemValueText('')).toBe('—');
    expect(problemValueText(false)).toBe('false');
    expect(problemValueText(0)).toBe('0');
  });

  it('shows a template’s refused rows, or a dash for a check kept before they were counted', () => {
    const row = { template: 'girders', title: 'Girders', rows: 8, create: 5, update: 1, unchanged: 1 } as const;
    expect(refusedText({ ...row, refused: 1_204 })).toBe('1,204');
    expect(refusedText({ ...row, refused: 0 })).toBe('0');
    expect(refusedText(row)).toBe('—');
  });
});
