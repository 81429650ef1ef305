import type { DamageEntry } from '@spanledger/shared';

import { ratingChartData, type CapacityAlongSpan, type RatingChartInputs } from './rating-chart-data';

// Invented moments along a 30 m span, shaped like a simply supported girder's: the chart only
// converts and compares them, so they are inputs, not engineering results.
const capacity: CapacityAlongSpan = {
  xM: [0, 7.5, 15, 22.5, 30],
  nominalMomentKnm: [1700, 2900, 3300, 2900, 1700],
  factoredCapacityKnm: [1500, 2600, 3000, 2600, 1500],
  factoredDemandKnm: { hl93: [0, 1800, 2400, 1800, 0], 'legal-3s2': [0, 1900, 2300, 1900, 0] },
  damagedZonesM: [
    { fromM: 20, toM: 25, damage: 0 },
    { fromM: 5, toM: 6, damage: 1 },
    { fromM: 0, toM: 3, damage: 2 },
  ],
};

const damage: DamageEntry[] = [
  { kind: 'lost-strands', rowId: 'r1', count: 2, fromM: 20, toM: 25, findingId: 41 },
  { kind: 'concrete-loss', bottomFlange: { depthMm: 50, widthMm: 200 }, fromM: 5, toM: 6, hypothetical: true },
  { kind: 'deck-loss', thicknessMm: 20, fromM: 0, toM: 3 },
];

const vehicleNames = { hl93: 'HL-93', 'legal-3s2': 'Type 3S2 legal load' };

function chartOf(overrides: Partial<RatingChartInputs> = {}) {
  return ratingChartData({ capacity, damage, vehicleNames, system: 'si', ...overrides });
}

describe('ratingChartData', () => {
  it('draws factored capacity first and thickest, then each vehicle’s demand in the engine’s order, then nominal capacity thin', () => {
    const { datasets } = chartOf();

    expect(datasets.map((dataset) => dataset.label)).toEqual(['Factored capacity', 'Factored demand: HL-93', 'Factored demand: Type 3S2 legal load', 'Nominal capacity']);
    const [factored, ...others] = datasets;
    expect(factored!.borderDash).toEqual([]);
    for (const other of others) expect(other.borderWidth).toBeLessThan(factored!.borderWidth as number);
    // Lower order draws on top in chart.js: capacity over demand over nominal.
    expect(datasets.map((dataset) => dataset.order)).toEqual([0, 1, 1, 2]);
  });

  it('leaves nominal capacity out when asked, and names a vehicle without a display name by its id', () => {
    const { datasets } = chartOf({ showNominal: false, vehicleNames: { hl93: 'HL-93' } });

    expect(datasets.map((dataset) => dataset.label)).toEqual(['Factored capacity', 'Factored demand: HL-93', 'Factored demand: legal-3s2']);
  });

  it('gives every line a colour and dash of its own, so they differ in greyscale too', () => {
    const sixVehicles = Object.fromEntries(['a', 'b', 'c', 'd', 'e', 'f'].map((id) => [id, [0, 100, 0]]));
    const { datasets } = chartOf({ capacity: { ...capacity, xM: [0, 15, 30], factoredDemandKnm: sixVehicles } });

    const looks = datasets.map((dataset) => `${dataset.borderWidth} ${JSON.stringify(dataset.borderDash)}`);
    expect(new Set(looks).size).toBe(datasets.length);
    expect(new Set(datasets.map((dataset) => dataset.borderColor)).size).toBe(datasets.length);
  });

  it('plots the stored values as they are in SI', () => {
    const { datasets, axisTitles } = chartOf();

    expect(datasets[0]!.data.map(({ x, y }) => [x, y])).toEqual([
      [0, 1500],
      [7.5, 2600],
      [15, 3000],
      [22.5, 2600],
      [30, 1500],
    ]);
    expect(axisTitles).toEqual({ x: 'Distance along span (m)', y: 'Moment per girder (kN·m)' });
  });

  it('converts distances to feet and moments to kip·ft in US customary units, keeping the stored values beside them', () => {
    const oneThousandKipFtInKnm = 1355.8179483314;
    const { datasets, axisTitles } = chartOf({
      system: 'us',
      capacity: { ...capacity, xM: [0, 30.48], factoredCapacityKnm: [0, oneThousandKipFtInKnm], factoredDemandKnm: {}, damagedZonesM: [] },
    });

    const point = datasets[0]!.data[1]!;
    // 1 ft = 0.3048 m exactly (international yard and pound, 1959).
    expect(point.x).toBeCloseTo(100, 9);
    // 1 kip·ft = 1.3558179483314 kN·m, exact by definition of the foot and the pound-force
    // (0.45359237 kg × 9.80665 m/s²). The shared units table rounds the kip to 4.448222 kN
    // (engineering.md §1), 6.5 parts in 10⁷ low, so agreement is to a hundredth of 1000 kip·ft.
    expect(point.y).toBeCloseTo(1000, 2);
    expect(point).toMatchObject({ xM: 30.48, momentKnm: oneThousandKipFtInKnm });
    expect(axisTitles).toEqual({ x: 'Distance along span (ft)', y: 'Moment per girder (kip·ft)' });
  });

  it('keeps the damaged zones in the calculation file’s order and tells what-if entries from findings', () => {
    const { zones } = chartOf();

    expect(zones).toEqual([
      { damageIndex: 0, fromX: 20, toX: 25, origin: 'finding', label: 'Lost strands 20.00–25.00 m (finding 41)' },
      { damageIndex: 1, fromX: 5, toX: 6, origin: 'hypothetical', label: 'Concrete loss 5.00–6.00 m (what-if)' },
      { damageIndex: 2, fromX: 0, toX: 3, origin: 'entered', label: 'Deck loss 0.00–3.00 m' },
    ]);
  });

  it('converts the zones to feet in US customary units', () => {
    const [lostStrands] = chartOf({ system: 'us' }).zones;

    // 20 m and 25 m over 0.3048 m/ft.
    expect(lostStrands!.fromX).toBeCloseTo(65.6168, 4);
    expect(lostStrands!.toX).toBeCloseTo(82.021, 3);
    expect(lostStrands!.label).toBe('Lost strands 65.62–82.02 ft (finding 41)');
  });

  it('sums up where demand comes closest when capacity stays above it everywhere', () => {
    // HL-93 peaks at 2400 / 3000 = 80 % at midspan; the legal load at 2300 / 3000 ≈ 76.7 %.
    expect(chartOf().summary).toBe(
      'Factored capacity stays above factored demand for every vehicle. Demand comes closest for HL-93 at 15.00 m (2,400.0 against 3,000.0 kN·m, 80.0 % of capacity). ' +
        'Damaged zones shaded: Lost strands 20.00–25.00 m (finding 41); Concrete loss 5.00–6.00 m (what-if); Deck loss 0.00–3.00 m.',
    );
  });

  it('names the vehicles whose demand exceeds capacity, and where', () => {
    const damaged = { ...capacity, factoredCapacityKnm: [1500, 2600, 3000, 1850, 1500], damagedZonesM: [] };

    // 1900 / 1850 = 102.7 % for the legal load at 22.5 m; HL-93 reaches 1800 / 1850 ≈ 97.3 %.
    expect(chartOf({ capacity: damaged }).summary).toBe(
      'Factored demand exceeds factored capacity for Type 3S2 legal load at 22.50 m (1,900.0 against 1,850.0 kN·m, 102.7 % of capacity). It stays below capacity for HL-93. No damaged zones.',
    );
  });

  it('counts demand where there is no capacity at all as exceeding it, without a percentage', () => {
    const noCapacity = { ...capacity, xM: [0, 1], factoredCapacityKnm: [0, 0], factoredDemandKnm: { hl93: [0, 50] }, damagedZonesM: [] };

    expect(chartOf({ capacity: noCapacity }).summary).toBe('Factored demand exceeds factored capacity for HL-93 at 1.00 m (50.0 against 0.0 kN·m). No damaged zones.');
  });

  it('never rounds a demand just under capacity up to 100 %', () => {
    const nearly = { ...capacity, xM: [0, 15], factoredCapacityKnm: [1000, 1000], factoredDemandKnm: { hl93: [0, 999.9] }, damagedZonesM: [] };

    expect(chartOf({ capacity: nearly }).summary).toContain('stays above factored demand for every vehicle. Demand comes closest for HL-93 at 15.00 m (999.9 against 1,000.0 kN·m, 99.9 % of capacity)');
  });

  it('says so when no vehicle was rated', () => {
    expect(chartOf({ capacity: { ...capacity, factoredDemandKnm: {}, damagedZonesM: [] } }).summary).toBe('Factored capacity along the span; no vehicle demand to compare. No damaged zones.');
  });
});
