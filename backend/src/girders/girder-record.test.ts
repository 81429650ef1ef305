import type { GirderRecord } from '../../../shared/src';
import { recordPathOf } from './girder-record';

const typed = { girderTypeId: 3, sectionOverrides: { depthMm: 1700 }, customSection: null } as unknown as GirderRecord;
const custom = { girderTypeId: null, sectionOverrides: {}, customSection: { shape: 'rectangle' } } as unknown as GirderRecord;

describe('recordPathOf', () => {
  it.each([
    ['girder.strandRows[2].yMm', typed, 'strandRows.2.yMm'],
    ['girder.deck.strengthMpa', typed, 'deckConcrete.strengthMpa'],
    ['girder.concrete.basis', typed, 'concrete.basis'],
    ['girder.section.depthMm', typed, 'sectionOverrides.depthMm'],
    ['girder.section.webWidthMm', typed, 'girderTypeId'],
    ['girder.section.widthMm', custom, 'customSection.widthMm'],
    ['girder.section', custom, 'customSection'],
    ['profiles[0].rowId', typed, 'profiles.0.rowId'],
    ['span.position', typed, 'position'],
    ['span.lengthM', typed, 'span.lengthM'],
  ])('puts %s at its place in the record', (path, record, expected) => {
    expect(recordPathOf(path, record)).toBe(expected);
  });
});
