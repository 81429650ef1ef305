import { lossesSchema } from './schema';

const messagesOf = (value: unknown) => {
  const parsed = lossesSchema.safeParse(value);
  return parsed.success ? [] : parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
};

describe('lossesSchema (calc-file.md `losses`)', () => {
  it('accepts the given method', () => {
    expect(lossesSchema.parse({ method: 'given' })).toEqual({ method: 'given' });
  });

  it('defaults the strand type to low-relaxation and leaves Eci to the policy formula', () => {
    expect(lossesSchema.parse({ method: 'aashto-approximate', jackingStressMpa: 1395, fciMpa: 35, relativeHumidityPct: 70 })).toEqual({
      method: 'aashto-approximate',
      jackingStressMpa: 1395,
      fciMpa: 35,
      relativeHumidityPct: 70,
      strandType: 'low-relaxation',
    });
  });

  it('keeps a given strand type and Eci', () => {
    const losses = { method: 'aashto-approximate', jackingStressMpa: 1395, fciMpa: 35, relativeHumidityPct: 70, strandType: 'stress-relieved', eciMpa: 28_000 };
    expect(lossesSchema.parse(losses)).toEqual(losses);
  });

  it('names each bad field with a clear message', () => {
    expect(
      messagesOf({ method: 'aashto-approximate', jackingStressMpa: -1, fciMpa: 0, relativeHumidityPct: 120, strandType: 'galvanised', eciMpa: 0 }),
    ).toEqual([
      'jackingStressMpa: must be > 0',
      'fciMpa: must be > 0',
      'relativeHumidityPct: must be <= 100 %',
      'strandType: must be "low-relaxation" or "stress-relieved"',
      'eciMpa: must be > 0',
    ]);
  });

  it('requires the approximate method inputs', () => {
    expect(messagesOf({ method: 'aashto-approximate' })).toEqual([
      'jackingStressMpa: must be a number',
      'fciMpa: must be a number',
      'relativeHumidityPct: must be a number',
    ]);
  });

  it('rejects unknown keys and unknown methods', () => {
    expect(messagesOf({ method: 'given', fciMpa: 35 })).toEqual([': Unrecognized key: "fciMpa"']);
    expect(messagesOf({ method: 'lump-sum' })).toEqual(['method: method must be "given" or "aashto-approximate"']);
  });
});
