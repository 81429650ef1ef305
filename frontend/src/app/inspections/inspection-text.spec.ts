import { localToday, strandsText } from './inspection-text';

describe('inspection text', () => {
  it("dates a new inspection in the user's own calendar, late in the evening too", () => {
    expect(localToday(new Date(2025, 2, 4, 23, 45))).toBe('2025-03-04');
    expect(localToday(new Date(2025, 11, 31, 0, 5))).toBe('2025-12-31');
  });

  it('names strands by their index in the row, or by a count', () => {
    expect(strandsText({ rowId: 'r1', strands: [9, 0, 4] })).toBe('Row r1: strands 0, 4, 9');
    expect(strandsText({ rowId: 'r2', strands: [3] })).toBe('Row r2: strand 3');
    expect(strandsText({ rowId: 'r2', count: 1 })).toBe('Row r2: 1 strand');
    expect(strandsText(null)).toBe('');
  });
});
