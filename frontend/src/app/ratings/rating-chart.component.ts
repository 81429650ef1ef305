import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import type { DamageEntry } from '@spanledger/shared';
import { Legend, LineController, LineElement, LinearScale, PointElement, Tooltip, type ChartData, type ChartOptions, type FontSpec, type Plugin } from 'chart.js';
import { BaseChartDirective, provideCharts } from 'ng2-charts';

import { formatMeasure } from '../units/measures';
import { UnitsStore } from '../units/units.store';
import { ratingChartData, type CapacityAlongSpan, type RatingChartPoint, type ShadedZone } from './rating-chart-data';

/** Only what a line chart on linear axes with a legend and tooltips needs, so the bundle carries no other chart types. */
const RATING_CHART_PIECES = [LineController, LineElement, PointElement, LinearScale, Legend, Tooltip];

const FONT: Partial<FontSpec> = { family: 'Lato, Arial, sans-serif', size: 13 };
const TEXT_COLOUR = '#1f1f1f';
const GRID_COLOUR = 'rgba(0, 0, 0, 0.1)';
/** Damage in the rating (findings, hand-entered entries): a plain grey wash. */
const DAMAGED_FILL = 'rgba(0, 0, 0, 0.12)';
/** What-if damage: a paler wash with diagonal hatching, told apart without colour. */
const HYPOTHETICAL_FILL = 'rgba(0, 0, 0, 0.04)';
const HATCH_STROKE = 'rgba(0, 0, 0, 0.4)';
const HATCH_SPACING_PX = 7;
/** A zone at a single point is still shaded wide enough to see. */
const MIN_ZONE_WIDTH_PX = 3;

let nextChartId = 0;

/**
 * One girder's factored flexural capacity against each vehicle's factored demand along the span,
 * with the damaged zones shaded behind the lines, in the unit system the user chose.
 */
@Component({
  selector: 'sl-rating-chart',
  imports: [BaseChartDirective],
  providers: [provideCharts({ registerables: RATING_CHART_PIECES })],
  templateUrl: './rating-chart.component.html',
  styleUrl: './rating-chart.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RatingChartComponent {
  /** The girder's `output.summary.capacityAlongSpan`. */
  readonly capacity = input.required<CapacityAlongSpan>();
  /** The girder's `calcFile.damage`, which the capacity's damaged zones index. */
  readonly damage = input.required<readonly DamageEntry[]>();
  /** Display names by vehicle id, e.g. from the record's `vehicles`. */
  readonly vehicleNames = input.required<Readonly<Record<string, string>>>();
  /** Draw nominal capacity as a thin grey line. */
  readonly showNominal = input(true);

  private readonly units = inject(UnitsStore);
  protected readonly summaryId = `rating-chart-summary-${nextChartId++}`;

  private readonly chart = computed(() =>
    ratingChartData({ capacity: this.capacity(), damage: this.damage(), vehicleNames: this.vehicleNames(), system: this.units.system(), showNominal: this.showNominal() }),
  );
  protected readonly data = computed<ChartData<'line', RatingChartPoint[]>>(() => ({ datasets: [...this.chart().datasets] }));
  protected readonly options = computed(() => chartOptions(this.chart().axisTitles, (kind, value) => formatMeasure(kind, value, this.units.system(), { withUnit: true })));
  protected readonly summary = computed(() => this.chart().summary);
  protected readonly hasDamagedZones = computed(() => this.chart().zones.some((zone) => zone.origin !== 'hypothetical'));
  protected readonly hasHypotheticalZones = computed(() => this.chart().zones.some((zone) => zone.origin === 'hypothetical'));
  /** One plugin for the component's life: it reads the zones when it draws, so new inputs need no new plugin. */
  protected readonly plugins = [damagedZonesPlugin(() => this.chart().zones)];
}

function chartOptions(axisTitles: { x: string; y: string }, format: (kind: 'spanLength' | 'moment', value: number) => string): ChartOptions<'line'> {
  const axis = (title: string) => ({
    type: 'linear' as const,
    title: { display: true, text: title, font: FONT, color: TEXT_COLOUR },
    ticks: { font: FONT, color: TEXT_COLOUR },
    grid: { color: GRID_COLOUR },
  });
  return {
    responsive: true,
    maintainAspectRatio: false,
    // Drawn at once: no motion to sit through or to switch off for people who prefer less.
    animation: false,
    // Every line's value at the station under the pointer, anywhere in its column.
    interaction: { mode: 'index', intersect: false },
    scales: {
      x: { ...axis(axisTitles.x), bounds: 'data' },
      y: { ...axis(axisTitles.y), beginAtZero: true },
    },
    plugins: {
      legend: {
        position: 'bottom',
        // A stretch of each line, dash and all, rather than a filled box.
        labels: { usePointStyle: true, pointStyle: 'line', pointStyleWidth: 36, font: FONT, color: TEXT_COLOUR },
      },
      tooltip: {
        titleFont: FONT,
        bodyFont: FONT,
        callbacks: {
          title: (items) => (items[0] ? format('spanLength', (items[0].raw as RatingChartPoint).xM) : ''),
          label: (item) => `${item.dataset.label}: ${format('moment', (item.raw as RatingChartPoint).momentKnm)}`,
        },
      },
    },
  };
}

/**
 * A chart.js plugin shading each damaged zone across the plot, under the lines: a grey wash for
 * damage in the rating, a paler hatched one for what-if entries.
 */
export function damagedZonesPlugin(zonesNow: () => readonly ShadedZone[]): Plugin<'line'> {
  return {
    id: 'slDamagedZones',
    beforeDatasetsDraw(chart) {
      const xScale = chart.scales['x'];
      if (!xScale) return;
      const { ctx, chartArea } = chart;
      const height = chartArea.bottom - chartArea.top;
      for (const zone of zonesNow()) {
        const from = xScale.getPixelForValue(zone.fromX);
        const to = xScale.getPixelForValue(zone.toX);
        const middle = (from + to) / 2;
        const halfWidth = Math.max(Math.abs(to - from), MIN_ZONE_WIDTH_PX) / 2;
        const left = Math.max(middle - halfWidth, chartArea.left);
        const right = Math.min(middle + halfWidth, chartArea.right);
        if (right <= left) continue;
        ctx.save();
        ctx.fillStyle = zone.origin === 'hypothetical' ? HYPOTHETICAL_FILL : DAMAGED_FILL;
        ctx.fillRect(left, chartArea.top, right - left, height);
        if (zone.origin === 'hypothetical') hatch(ctx, left, right, chartArea.top, chartArea.bottom);
        ctx.restore();
      }
    },
  };
}

/** Diagonal lines across the rectangle, clipped to it. */
function hatch(ctx: CanvasRenderingContext2D, left: number, right: number, top: number, bottom: number): void {
  ctx.beginPath();
  ctx.rect(left, top, right - left, bottom - top);
  ctx.clip();
  ctx.beginPath();
  const rise = bottom - top;
  for (let start = left - rise; start < right; start += HATCH_SPACING_PX) {
    ctx.moveTo(start, bottom);
    ctx.lineTo(start + rise, top);
  }
  ctx.strokeStyle = HATCH_STROKE;
  ctx.lineWidth = 1;
  ctx.stroke();
}
