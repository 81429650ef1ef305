import { previousRecordText } from './rating-text';

describe('previousRecordText', () => {
  const figures = { lowestLegalRatingFactor: 1.1, lowestInventoryRatingFactor: 0.9 } as never;

  it('names Spanledger’s rating of record by its number', () => {
    expect(previousRecordText({ ...(figures as object), id: 41, approvedAt: '2026-03-04T15:00:00Z' } as never)).toMatch(/^Change from the rating of record \(rating 41, approved Mar 4, 2026\)$/);
  });

  it('names a rating on file from before Spanledger by its day, which no time zone moves, and its source', () => {
    const before = { ...(figures as object), id: 7, approvedAt: '2019-03-08T00:00:00Z', priorRating: { id: 7, approvedOn: '2019-03-08', sourceNote: 'Rating report of March 2019', spanIndex: null } };
    expect(previousRecordText(before as never)).toBe('Change from the rating on file from before Spanledger (approved Mar 8, 2019; Rating report of March 2019)');
  });

  it('says when there is nothing to compare with', () => {
    expect(previousRecordText(null)).toBe('First rating of this span: no rating of record to compare with');
  });
});
