import type { DamageEntry, RateOutput } from '@spanledger/shared';
import type { ChartDataset } from 'chart.js';

import { formatMeasure, toShownUnits, unitLabel, type UnitSystem } from '../units/measures';

/** One girder's factored capacity against factored demand along the span (x in m, moments in kN·m per girder). */
export type CapacityAlongSpan = RateOutput['summary']['capacityAlongSpan'];

/** A point of a line in the shown units, with the stored values beside it for tooltips. */
export interface RatingChartPoint {
  readonly x: number;
  readonly y: number;
  readonly xM: number;
  readonly momentKnm: number;
}

export type RatingChartDataset = ChartDataset<'line', RatingChartPoint[]>;

/**
 * Where a damaged zone's entry came from: a finding of the register, a what-if entry of this
 * rating, or an entry written into the calculation file by hand.
 */
export type ZoneOrigin = 'finding' | 'hypothetical' | 'entered';

/** A damaged stretch of the span to shade behind the lines, in the shown length unit. */
export interface ShadedZone {
  /** The entry's position in the calculation file's `damage` list. */
  readonly damageIndex: number;
  readonly fromX: number;
  readonly toX: number;
  readonly origin: ZoneOrigin;
  /** e.g. "Lost strands 12.00–15.00 m (finding 4)". */
  readonly label: string;
}

export interface RatingChartData {
  /** Factored capacity first, then each vehicle's factored demand, then nominal capacity when asked. */
  readonly datasets: readonly RatingChartDataset[];
  /** In the order of the engine's `damagedZonesM`, which is the calculation file's order. */
  readonly zones: readonly ShadedZone[];
  readonly axisTitles: { readonly x: string; readonly y: string };
  /** What the chart shows, in words, for people who cannot see it. */
  readonly summary: string;
}

export interface RatingChartInputs {
  readonly capacity: CapacityAlongSpan;
  /** The girder's calculation file `damage` list, which `capacity.damagedZonesM` indexes. */
  readonly damage: readonly DamageEntry[];
  /** Display names by vehicle id; a vehicle without one is shown by its id. */
  readonly vehicleNames: Readonly<Record<string, string>>;
  readonly system: UnitSystem;
  /** Draw the nominal (unfactored) capacity as a thin line; on unless turned off. */
  readonly showNominal?: boolean;
}

interface LineStyle {
  readonly colour: string;
  readonly widthPx: number;
  readonly dash: readonly number[];
}

/** Black, thick and solid: the line everything else is read against, in colour or greyscale. */
const CAPACITY_STYLE: LineStyle = { colour: '#000000', widthPx: 3, dash: [] };
/** Thin mid-grey (4.5:1 on white), solid, so it never looks like a vehicle's dashed demand. */
const NOMINAL_STYLE: LineStyle = { colour: '#767676', widthPx: 1.5, dash: [] };
/**
 * Okabe–Ito colours (Okabe & Ito, "Color Universal Design", 2008) without black (capacity) and
 * yellow (too faint on white), darkest first; each with its own dash so greyscale prints still tell them apart.
 */
const DEMAND_STYLES: readonly LineStyle[] = [
  { colour: '#D55E00', widthPx: 2, dash: [10, 4] },
  { colour: '#0072B2', widthPx: 2, dash: [2, 3] },
  { colour: '#009E73', widthPx: 2, dash: [10, 3, 2, 3] },
  { colour: '#CC79A7', widthPx: 2, dash: [4, 4] },
  { colour: '#E69F00', widthPx: 2, dash: [10, 3, 2, 3, 2, 3] },
  { colour: '#56B4E9', widthPx: 2, dash: [16, 3, 4, 3] },
];

const DAMAGE_KIND_NAMES: Readonly<Record<DamageEntry['kind'], string>> = {
  'lost-strands': 'Lost strands',
  'strand-area-loss': 'Strand section loss',
  'concrete-loss': 'Concrete loss',
  'deck-loss': 'Deck loss',
  'exposed-strands': 'Exposed strands',
};

/**
 * One girder's capacity and demand along the span as chart.js line datasets (x and moment in the
 * shown unit system) and its damaged zones as stretches to shade, with axis titles and a summary in words.
 */
export function ratingChartData(options: RatingChartInputs): RatingChartData {
  const { capacity, system } = options;
  const line = (label: string, momentsKnm: readonly number[], style: LineStyle, order: number) => lineDataset(label, pointsOf(capacity.xM, momentsKnm, system), style, order);
  const demands = Object.entries(capacity.factoredDemandKnm).map(([vehicleId, momentsKnm], index) =>
    // Later datasets draw underneath: demand under capacity, nominal under both.
    line(`Factored demand: ${vehicleName(options.vehicleNames, vehicleId)}`, momentsKnm, DEMAND_STYLES[index % DEMAND_STYLES.length]!, 1),
  );
  const nominal = options.showNominal === false ? [] : [line('Nominal capacity', capacity.nominalMomentKnm, NOMINAL_STYLE, 2)];
  const zones = capacity.damagedZonesM.map((zone) => shadedZone(zone, options.damage[zone.damage], system));
  return {
    datasets: [line('Factored capacity', capacity.factoredCapacityKnm, CAPACITY_STYLE, 0), ...demands, ...nominal],
    zones,
    axisTitles: {
      x: `Distance along span (${unitLabel('spanLength', system)})`,
      y: `Moment per girder (${unitLabel('moment', system)})`,
    },
    summary: `${demandSummary(options)} ${zoneSummary(zones)}`,
  };
}

function vehicleName(names: Readonly<Record<string, string>>, vehicleId: string): string {
  const name: string | undefined = names[vehicleId];
  return name ?? vehicleId;
}

function pointsOf(xM: readonly number[], momentsKnm: readonly number[], system: UnitSystem): RatingChartPoint[] {
  return momentsKnm.map((momentKnm, index) => {
    const stationM = xM[index]!;
    return { x: toShownUnits('spanLength', stationM, system), y: toShownUnits('moment', momentKnm, system), xM: stationM, momentKnm };
  });
}

function lineDataset(label: string, data: RatingChartPoint[], style: LineStyle, order: number): RatingChartDataset {
  return {
    type: 'line',
    label,
    data,
    order,
    borderColor: style.colour,
    backgroundColor: style.colour,
    borderWidth: style.widthPx,
    borderDash: [...style.dash],
    // Stations are close together: a line, no dots, except the one under the pointer.
    pointRadius: 0,
    pointHoverRadius: 4,
    fill: false,
    tension: 0,
  };
}

function shadedZone(zone: CapacityAlongSpan['damagedZonesM'][number], entry: DamageEntry | undefined, system: UnitSystem): ShadedZone {
  const [fromM, toM] = zone.fromM <= zone.toM ? [zone.fromM, zone.toM] : [zone.toM, zone.fromM];
  const origin: ZoneOrigin = entry?.hypothetical ? 'hypothetical' : entry?.findingId !== undefined ? 'finding' : 'entered';
  const kind = entry ? DAMAGE_KIND_NAMES[entry.kind] : 'Damage';
  const stretch = `${formatMeasure('spanLength', fromM, system)}–${formatMeasure('spanLength', toM, system, { withUnit: true })}`;
  const source = origin === 'hypothetical' ? ' (what-if)' : origin === 'finding' ? ` (finding ${entry!.findingId})` : '';
  return {
    damageIndex: zone.damage,
    fromX: toShownUnits('spanLength', fromM, system),
    toX: toShownUnits('spanLength', toM, system),
    origin,
    label: `${kind} ${stretch}${source}`,
  };
}

/** The station where one vehicle's factored demand comes nearest to (or furthest past) the factored capacity. */
interface ClosestApproach {
  readonly vehicle: string;
  readonly xM: number;
  readonly demandKnm: number;
  readonly capacityKnm: number;
  /** Demand over capacity; Infinity where demand meets no capacity at all. */
  readonly ratio: number;
}

function closestApproach(vehicle: string, capacity: CapacityAlongSpan, demandKnm: readonly number[]): ClosestApproach | null {
  let closest: ClosestApproach | null = null;
  for (const [index, demand] of demandKnm.entries()) {
    const capacityKnm = capacity.factoredCapacityKnm[index]!;
    const ratio = capacityKnm > 0 ? demand / capacityKnm : demand > 0 ? Infinity : 0;
    if (closest === null || ratio > closest.ratio) closest = { vehicle, xM: capacity.xM[index]!, demandKnm: demand, capacityKnm, ratio };
  }
  return closest;
}

function demandSummary({ capacity, vehicleNames, system }: RatingChartInputs): string {
  const approaches = Object.entries(capacity.factoredDemandKnm).flatMap(([vehicleId, demandKnm]) => closestApproach(vehicleName(vehicleNames, vehicleId), capacity, demandKnm) ?? []);
  if (approaches.length === 0) return 'Factored capacity along the span; no vehicle demand to compare.';
  const describe = (approach: ClosestApproach) => {
    const moments = `${formatMeasure('moment', approach.demandKnm, system)} against ${formatMeasure('moment', approach.capacityKnm, system, { withUnit: true })}`;
    const share = Number.isFinite(approach.ratio) ? `, ${percentOfCapacity(approach.ratio)} of capacity` : '';
    return `${approach.vehicle} at ${formatMeasure('spanLength', approach.xM, system, { withUnit: true })} (${moments}${share})`;
  };
  const exceeding = approaches.filter((approach) => approach.ratio > 1);
  if (exceeding.length === 0) {
    const closest = approaches.reduce((a, b) => (b.ratio > a.ratio ? b : a));
    return `Factored capacity stays above factored demand for every vehicle. Demand comes closest for ${describe(closest)}.`;
  }
  const below = approaches.filter((approach) => approach.ratio <= 1).map((approach) => approach.vehicle);
  const belowText = below.length > 0 ? ` It stays below capacity for ${below.join(', ')}.` : '';
  return `Factored demand exceeds factored capacity for ${exceeding.map(describe).join('; ')}.${belowText}`;
}

/** Demand as a share of capacity to one decimal; one just under or just over capacity never reads as exactly 100.0 %. */
function percentOfCapacity(ratio: number): string {
  const tenths = Math.round(ratio * 1000);
  const kept = ratio < 1 ? Math.min(tenths, 999) : ratio > 1 ? Math.max(tenths, 1001) : 1000;
  return `${(kept / 10).toFixed(1)} %`;
}

function zoneSummary(zones: readonly ShadedZone[]): string {
  return zones.length === 0 ? 'No damaged zones.' : `Damaged zones shaded: ${zones.map((zone) => zone.label).join('; ')}.`;
}
