import { changedFields } from './changed-fields';

describe('changedFields', () => {
  it('keeps only the fields whose value differs, nested values compared whole', () => {
    const current = { name: 'Old', adt: 100, barriers: [{ loadKnM: 5 }], notes: null };
    const change = { name: 'Old', adt: 120, barriers: [{ loadKnM: 5 }], notes: 'cracked' };
    expect(changedFields(current, change)).toEqual({ fields: ['adt', 'notes'], before: { adt: 100, notes: null }, after: { adt: 120, notes: 'cracked' } });
  });

  it('sees a cleared value as a change and an unsent one as none', () => {
    expect(changedFields({ adt: 100, adtt: 10 }, { adt: null, adtt: undefined }).fields).toEqual(['adt']);
  });
});
