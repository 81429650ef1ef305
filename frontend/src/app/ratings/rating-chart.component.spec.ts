import { ComponentFixture, TestBed } from '@angular/core/testing';
import { By } from '@angular/platform-browser';
import type { DamageEntry } from '@spanledger/shared';
import type { Chart, ChartOptions } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';

import { UnitsStore } from '../units/units.store';
import type { CapacityAlongSpan, ShadedZone } from './rating-chart-data';
import { RatingChartComponent, damagedZonesPlugin } from './rating-chart.component';

// Invented moments along a 30 m span: the component only hands them on, converted.
const capacity: CapacityAlongSpan = {
  xM: [0, 15, 30],
  nominalMomentKnm: [1700, 3300, 1700],
  factoredCapacityKnm: [1500, 3000, 1500],
  factoredDemandKnm: { hl93: [0, 2400, 0] },
  damagedZonesM: [{ fromM: 5, toM: 6, damage: 0 }],
};
const whatIf: DamageEntry[] = [{ kind: 'concrete-loss', bottomFlange: { depthMm: 50, widthMm: 200 }, fromM: 5, toM: 6, hypothetical: true }];

describe('RatingChartComponent', () => {
  let fixture: ComponentFixture<RatingChartComponent>;

  beforeEach(() => {
    // jsdom draws nothing: with no 2D context the chart directive keeps its inputs and renders no chart.
    jest.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(null);
  });

  afterEach(() => {
    jest.restoreAllMocks();
    localStorage.clear();
  });

  async function chart(damage: readonly DamageEntry[] = whatIf, data: CapacityAlongSpan = capacity): Promise<void> {
    fixture = TestBed.createComponent(RatingChartComponent);
    fixture.componentRef.setInput('capacity', data);
    fixture.componentRef.setInput('damage', damage);
    fixture.componentRef.setInput('vehicleNames', { hl93: 'HL-93' });
    await fixture.whenStable();
  }

  function chartDirective(): BaseChartDirective<'line'> {
    return fixture.debugElement.query(By.directive(BaseChartDirective)).injector.get(BaseChartDirective);
  }

  function axisTitle(options: ChartOptions<'line'> | undefined, axis: 'x' | 'y'): unknown {
    const scale = options?.scales?.[axis] as { title?: { text?: unknown } } | undefined;
    return scale?.title?.text;
  }

  function text(testId: string): string {
    return fixture.nativeElement.querySelector(`[data-testid="${testId}"]`)?.textContent.trim() ?? '';
  }

  it('hands the chart a line per series and axis titles in the current units', async () => {
    await chart();

    const directive = chartDirective();
    expect(directive.type).toBe('line');
    expect(directive.data?.datasets.map((dataset) => dataset.label)).toEqual(['Factored capacity', 'Factored demand: HL-93', 'Nominal capacity']);
    expect(axisTitle(directive.options, 'x')).toBe('Distance along span (m)');
    expect(axisTitle(directive.options, 'y')).toBe('Moment per girder (kN·m)');
    expect(directive.plugins.map((plugin) => plugin.id)).toEqual(['slDamagedZones']);
  });

  it('follows the units switch', async () => {
    await chart();

    TestBed.inject(UnitsStore).use('us');
    await fixture.whenStable();

    const directive = chartDirective();
    expect(axisTitle(directive.options, 'x')).toBe('Distance along span (ft)');
    expect(axisTitle(directive.options, 'y')).toBe('Moment per girder (kip·ft)');
    // 30 m over 0.3048 m/ft (exact by definition of the foot).
    expect(directive.data?.datasets[0]!.data[2]).toMatchObject({ x: expect.closeTo(98.4252, 4), xM: 30 });
    expect(text('rating-chart-summary')).toContain('HL-93 at 49.21 ft');
  });

  it('leaves nominal capacity out when asked', async () => {
    await chart();
    fixture.componentRef.setInput('showNominal', false);
    await fixture.whenStable();

    expect(chartDirective().data?.datasets.map((dataset) => dataset.label)).toEqual(['Factored capacity', 'Factored demand: HL-93']);
  });

  it('describes the chart in words beside the canvas', async () => {
    await chart();

    const canvas: HTMLCanvasElement = fixture.nativeElement.querySelector('[data-testid="rating-chart"] canvas');
    const summary = fixture.nativeElement.querySelector('[data-testid="rating-chart-summary"]');
    expect(canvas.getAttribute('role')).toBe('img');
    expect(canvas.getAttribute('aria-describedby')).toBe(summary.id);
    // 2400 / 3000 at midspan.
    expect(summary.textContent.trim()).toBe(
      'Factored capacity stays above factored demand for every vehicle. Demand comes closest for HL-93 at 15.00 m (2,400.0 against 3,000.0 kN·m, 80.0 % of capacity). ' +
        'Damaged zones shaded: Concrete loss 5.00–6.00 m (what-if).',
    );
  });

  it('keys only the kinds of zone it shades', async () => {
    await chart();
    expect(text('rating-chart-zone-key')).toBe('What-if damage');

    await chart([{ ...whatIf[0]!, hypothetical: undefined, findingId: 7 }]);
    expect(text('rating-chart-zone-key')).toBe('Damaged zone');

    await chart([], { ...capacity, damagedZonesM: [] });
    expect(fixture.nativeElement.querySelector('[data-testid="rating-chart-zone-key"]')).toBeNull();
  });
});

describe('damagedZonesPlugin', () => {
  /** A chart whose x axis puts 0–30 at pixels 50–350 and a 2D context that records what is drawn. */
  function fakeChart() {
    const calls: { fillRect: number[][]; fillStyles: string[]; strokes: number } = { fillRect: [], fillStyles: [], strokes: 0 };
    const ctx = {
      fillStyle: '',
      save: jest.fn(),
      restore: jest.fn(),
      beginPath: jest.fn(),
      rect: jest.fn(),
      clip: jest.fn(),
      moveTo: jest.fn(),
      lineTo: jest.fn(),
      fillRect(x: number, y: number, width: number, height: number) {
        calls.fillRect.push([x, y, width, height]);
        calls.fillStyles.push(this.fillStyle);
      },
      stroke: () => calls.strokes++,
    };
    const chart = {
      ctx,
      chartArea: { left: 50, right: 350, top: 10, bottom: 210 },
      scales: { x: { getPixelForValue: (value: number) => 50 + value * 10 } },
    };
    return { chart: chart as unknown as Chart<'line'>, calls };
  }

  function zone(fromX: number, toX: number, origin: ShadedZone['origin']): ShadedZone {
    return { damageIndex: 0, fromX, toX, origin, label: '' };
  }

  function draw(zones: ShadedZone[]) {
    const { chart, calls } = fakeChart();
    const plugin = damagedZonesPlugin(() => zones);
    (plugin.beforeDatasetsDraw as (chart: Chart<'line'>) => void).call(plugin, chart);
    return calls;
  }

  it('shades each zone over the full height of the plot, across its stretch of the span', () => {
    const calls = draw([zone(20, 25, 'finding'), zone(5, 6, 'entered')]);

    expect(calls.fillRect).toEqual([
      [250, 10, 50, 200],
      [100, 10, 10, 200],
    ]);
    expect(calls.strokes).toBe(0);
  });

  it('hatches what-if zones and washes them paler than damage in the rating', () => {
    const calls = draw([zone(20, 25, 'finding'), zone(5, 6, 'hypothetical')]);

    expect(calls.strokes).toBe(1);
    const alpha = (style: string) => Number(/([\d.]+)\)$/.exec(style)![1]);
    expect(alpha(calls.fillStyles[1]!)).toBeLessThan(alpha(calls.fillStyles[0]!));
  });

  it('keeps zones inside the plot and a zone at one point visible', () => {
    const calls = draw([zone(28, 40, 'finding'), zone(10, 10, 'finding')]);

    expect(calls.fillRect).toEqual([
      [330, 10, 20, 200],
      [148.5, 10, 3, 200],
    ]);
  });
});
