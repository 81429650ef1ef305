import { lowestCondition, newStructure, ratingBandOf, spanChange, structureChange, structureListQuery } from './inventory';

const issuesOf = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  (result.error?.issues ?? []).map((issue) => `${issue.path.join('.')}: ${issue.message}`);

describe('structureListQuery', () => {
  it('defaults to the first page in structure-number order, the box open', () => {
    expect(structureListQuery.parse({})).toEqual({
      limit: 1000,
      offset: 0,
      ratingBasis: 'legal',
      sort: { key: 'structureNumber', descending: false },
    });
  });

  it('reads lists, a descending sort and the page', () => {
    const query = structureListQuery.parse({ district: 'North District, East District', status: 'open,posted', sort: '-adt', limit: '25', offset: '50' });
    expect(query).toMatchObject({ district: ['North District', 'East District'], status: ['open', 'posted'], sort: { key: 'adt', descending: true }, limit: 25, offset: 50 });
  });

  it.each([
    [{ limit: '2.5' }, /^limit: expected a whole number/],
    [{ limit: '20001' }, /^limit:/],
    [{ status: 'open,shut' }, /^status: unknown value "shut"/],
    [{ ratingBand: 'red' }, /^ratingBand: unknown value "red"/],
    [{ sort: 'colour' }, /^sort: expected one of structureNumber/],
    [{ conditionAtMost: '10' }, /^conditionAtMost:/],
    [{ colour: 'red' }, /colour/],
  ])('refuses %p naming the parameter', (query, message) => {
    const messages = issuesOf(structureListQuery.safeParse(query));
    expect(messages.join('\n')).toMatch(message);
  });
});

describe('structureChange', () => {
  it('needs the version that was read', () => {
    expect(issuesOf(structureChange.safeParse({ name: 'A' }))).toEqual(['version: the version you read is required']);
  });

  it('names each bad field, including the cross-field rules', () => {
    const messages = issuesOf(structureChange.safeParse({ version: 1, deckCondition: 11, adt: 100, adtt: 200, yearBuilt: 1990, yearLastMajorWork: 1980, status: 'shut', extra: 1 }));
    expect(messages).toEqual(
      expect.arrayContaining([
        'deckCondition: must be 0 to 9',
        expect.stringMatching(/^status:/),
        expect.stringMatching(/extra/),
      ]),
    );
  });

  it('checks traffic and years against each other once the fields parse', () => {
    const messages = issuesOf(structureChange.safeParse({ version: 1, adt: 100, adtt: 200, yearBuilt: 1990, yearLastMajorWork: 1980 }));
    expect(messages).toEqual(['adtt: truck traffic cannot exceed all traffic (ADT)', 'yearLastMajorWork: cannot be before the year built']);
  });

  it('accepts a partial change and clears a value with null', () => {
    expect(structureChange.parse({ version: 3, notes: 'Bearing seat cracked', deckCondition: null })).toEqual({ version: 3, notes: 'Bearing seat cracked', deckCondition: null });
  });
});

describe('newStructure', () => {
  it('fills the optional fields and requires the identity', () => {
    const messages = issuesOf(newStructure.safeParse({ structureNumber: 'BV-0001' }));
    expect(messages).toEqual(expect.arrayContaining(['name: Invalid input: expected string, received undefined', expect.stringMatching(/^longitude:/)]));
    const parsed = newStructure.parse({ structureNumber: 'BV-0001', name: 'A', routeCarried: 'R', featureCrossed: 'F', district: 'D', longitude: -98, latitude: 38 });
    expect(parsed).toMatchObject({ status: 'open', skewDeg: 0, notes: '', adt: null });
  });
});

describe('spanChange', () => {
  it('uses the calculation file rules and names the path of a nested value', () => {
    const messages = issuesOf(spanChange.safeParse({ version: 1, lengthM: -2, barriers: [{ loadKnM: 0 }], lengthMm: 3 }));
    expect(messages).toEqual(expect.arrayContaining(['lengthM: must be > 0', 'barriers.0.loadKnM: must be > 0', expect.stringMatching(/lengthMm/)]));
  });

  it('keeps diaphragms on the span', () => {
    expect(issuesOf(spanChange.safeParse({ version: 1, lengthM: 20, diaphragms: [{ xM: 25, loadKn: 10 }] }))).toEqual(['diaphragms.0.xM: lies beyond the span (20 m)']);
  });
});

describe('lowestCondition and ratingBandOf', () => {
  it('takes the lowest recorded rating', () => {
    expect(lowestCondition({ deck: 7, superstructure: 5, substructure: null })).toBe(5);
    expect(lowestCondition({ deck: null, superstructure: null, substructure: null })).toBeNull();
  });

  it('puts 1.00 in the band that needs no posting', () => {
    expect([null, 0.99, 1, 1.49, 1.5].map(ratingBandOf)).toEqual(['not-rated', 'below-1', '1-to-1.5', '1-to-1.5', '1.5-up']);
  });
});
