import { firstJsonDifference } from './support/compare-json';

describe('firstJsonDifference', () => {
  it('accepts equal documents, numbers within 1e-9 relative and keys in any order', () => {
    expect(firstJsonDifference({ a: 1000, b: [1, 'x', null] }, { b: [1, 'x', null], a: 1000 * (1 + 5e-10) })).toBeNull();
  });

  it('names the first differing path', () => {
    const golden = { rows: [{ rowId: 'r1', stressMpa: 1750 }, { rowId: 'r2', stressMpa: 1740 }] };
    const actual = { rows: [{ rowId: 'r1', stressMpa: 1750 }, { rowId: 'r2', stressMpa: 1740.001 }] };
    expect(firstJsonDifference(actual, golden)).toBe('rows[1].stressMpa: 1740.001 where 1740 was expected');
  });

  it('reports missing, extra and retyped keys and list lengths', () => {
    expect(firstJsonDifference({}, { phi: 1 })).toBe('phi: missing');
    expect(firstJsonDifference({ phi: 1, extra: 0 }, { phi: 1 })).toBe('extra: not expected');
    expect(firstJsonDifference({ blockDepthMm: null }, { blockDepthMm: 98.7 })).toBe('blockDepthMm: null where number was expected');
    expect(firstJsonDifference({ warnings: [] }, { warnings: ['w'] })).toBe('warnings: 0 items where 1 were expected');
    expect(firstJsonDifference('a', 'b')).toBe('(root): "a" where "b" was expected');
  });
});
