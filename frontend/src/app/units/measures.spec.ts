import { formatMeasure, inputText, toShownUnits, toStoredUnits, unitLabel, unitLabels } from './measures';

describe('measures', () => {
  it('shows span lengths in metres or feet (1 ft = 0.3048 m exactly)', () => {
    expect(formatMeasure('spanLength', 30.48, 'si')).toBe('30.48');
    expect(formatMeasure('spanLength', 30.48, 'us')).toBe('100.00');
    expect(formatMeasure('spanLength', 30.48, 'us', { withUnit: true })).toBe('100.00 ft');
  });

  it('shows section sizes in millimetres or inches, and deck layout in millimetres or feet', () => {
    expect(formatMeasure('sectionSize', 203.2, 'us', { withUnit: true })).toBe('8.00 in');
    expect(formatMeasure('sectionSize', 203.2, 'si', { withUnit: true })).toBe('203 mm');
    expect(formatMeasure('deckLayout', 2438.4, 'us', { withUnit: true })).toBe('8.00 ft');
    expect(formatMeasure('deckLayout', 12000, 'si')).toBe('12,000');
  });

  it('shows loads in kN/m or kip/ft and kN or kip, strengths in MPa or ksi', () => {
    expect(formatMeasure('lineLoad', 14.593903, 'us', { withUnit: true })).toBe('1.000 kip/ft');
    expect(formatMeasure('pointLoad', 44.48222, 'us', { withUnit: true })).toBe('10.00 kip');
    expect(formatMeasure('strength', 55.158056, 'us', { withUnit: true })).toBe('8.00 ksi');
    expect(formatMeasure('unitWeight', 23.5, 'si', { withUnit: true })).toBe('23.5 kN/m³');
  });

  it('shows moments per girder in kN·m or kip·ft', () => {
    // 1 kip·ft = 1.3558179483314 kN·m, exact by definition of the foot (0.3048 m) and the pound-force
    // (0.45359237 kg × 9.80665 m/s²). The shared table derives it from 1 kip = 4.448222 kN
    // (engineering.md §1), 6.5 parts in 10⁷ lower, so 1000 kip·ft reads 1000.0007: agreement to a hundredth.
    expect(toShownUnits('moment', 1355.8179483314, 'us')).toBeCloseTo(1000, 2);
    expect(formatMeasure('moment', 1355.8179483314, 'us', { withUnit: true })).toBe('1,000.0 kip·ft');
    expect(formatMeasure('moment', 2712.36, 'si', { withUnit: true })).toBe('2,712.4 kN·m');
    expect(toStoredUnits('moment', 1000, 'us')).toBeCloseTo(1355.8179483314, 2);
  });

  it('shows a dash for a value that is not recorded', () => {
    expect(formatMeasure('spanLength', null, 'us')).toBe('—');
  });

  it('converts typed values back to the stored unit without float noise', () => {
    expect(toStoredUnits('spanLength', 100, 'us')).toBe(30.48);
    expect(toStoredUnits('sectionSize', 8, 'us')).toBe(203.2);
    expect(toStoredUnits('deckLayout', 8, 'us')).toBe(2438.4);
    expect(toStoredUnits('spanLength', 30.48, 'si')).toBe(30.48);
    expect(toShownUnits('spanLength', toStoredUnits('spanLength', 97.25, 'us'), 'us')).toBeCloseTo(97.25, 9);
  });

  it('writes input text as plain digits with one decimal more than the display', () => {
    expect(inputText('spanLength', 30.48, 'us')).toBe('100');
    expect(inputText('deckLayout', 12000, 'si')).toBe('12000');
    expect(inputText('deckLayout', 2400, 'us')).toBe('7.874');
    expect(inputText('spanLength', null, 'si')).toBe('');
  });

  it('labels units for headers and suffixes', () => {
    expect(unitLabel('spanLength', 'us')).toBe('ft');
    expect(unitLabels('si')).toMatchObject({ spanLength: 'm', sectionSize: 'mm', lineLoad: 'kN/m', pointLoad: 'kN', unitWeight: 'kN/m³', moment: 'kN·m' });
    expect(unitLabels('us')).toMatchObject({ spanLength: 'ft', sectionSize: 'in', deckLayout: 'ft', lineLoad: 'kip/ft', pointLoad: 'kip', strength: 'ksi', moment: 'kip·ft' });
  });
});
