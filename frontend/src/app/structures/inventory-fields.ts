import { STRUCTURE_STATUS_NAMES, type SpanDetail, type StructureStatus } from '@spanledger/shared';

import { MeasureKind, UnitSystem, formatMeasure } from '../units/measures';

interface InventoryField {
  readonly label: string;
  /** Set for a value stored in SI that is shown in the user's units. */
  readonly measure?: MeasureKind;
  /** How a value that is not a plain number or text reads. */
  readonly describe?: (value: unknown, system: UnitSystem) => string;
}

type WearingSurface = NonNullable<SpanDetail['wearingSurface']>;

/**
 * The names people read for the API's field names, shared by the forms' labels and the history,
 * so a change reads in the history as it was typed.
 */
const INVENTORY_FIELDS: Readonly<Record<string, InventoryField>> = {
  structureNumber: { label: 'Structure number' },
  name: { label: 'Name' },
  routeCarried: { label: 'Route carried' },
  featureCrossed: { label: 'Feature crossed' },
  district: { label: 'District' },
  longitude: { label: 'Longitude' },
  latitude: { label: 'Latitude' },
  yearBuilt: { label: 'Year built' },
  yearLastMajorWork: { label: 'Year of last major work' },
  adt: { label: 'ADT' },
  adtt: { label: 'ADTT' },
  skewDeg: { label: 'Skew', describe: (value) => `${String(value)}°` },
  deckCondition: { label: 'Deck condition' },
  superstructureCondition: { label: 'Superstructure condition' },
  substructureCondition: { label: 'Substructure condition' },
  conditionRatedOn: { label: 'Condition rated on' },
  status: { label: 'Status', describe: (value) => STRUCTURE_STATUS_NAMES[value as StructureStatus] ?? String(value) },
  notes: { label: 'Notes' },
  lengthM: { label: 'Length', measure: 'spanLength' },
  girderSpacingMm: { label: 'Girder spacing', measure: 'deckLayout' },
  overhangMm: { label: 'Overhang', measure: 'deckLayout' },
  roadwayWidthMm: { label: 'Roadway width', measure: 'deckLayout' },
  barrierFaceToGirderMm: { label: 'Barrier face to exterior girder', measure: 'deckLayout' },
  deckThicknessMm: { label: 'Deck thickness', measure: 'sectionSize' },
  haunchMm: { label: 'Haunch', measure: 'sectionSize' },
  wearingSurface: { label: 'Wearing surface', describe: (value, system) => describeWearingSurface(value as WearingSurface, system) },
  barriers: { label: 'Barriers', describe: (value, system) => describeBarriers(value as SpanDetail['barriers'], system) },
  diaphragms: { label: 'Diaphragms', describe: (value, system) => describeDiaphragms(value as SpanDetail['diaphragms'], system) },
};

/** The label of an API field, or the field name itself for one this page does not know. */
export function fieldLabel(field: string): string {
  return INVENTORY_FIELDS[field]?.label ?? field;
}

/** A field's value as people read it, lengths and loads in the user's units; a dash for none. */
export function describeFieldValue(field: string, value: unknown, system: UnitSystem): string {
  if (value === null || value === undefined) return '—';
  const known = INVENTORY_FIELDS[field];
  if (known?.measure && typeof value === 'number') return formatMeasure(known.measure, value, system, { withUnit: true });
  if (known?.describe) return known.describe(value, system);
  if (typeof value === 'string') return value === '' ? '(empty)' : value;
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  return typeof value === 'number' ? String(value) : JSON.stringify(value);
}

/** "50 mm overlay, measured"; "None" when the span has no wearing surface. */
export function describeWearingSurface(surface: WearingSurface | null | undefined, system: UnitSystem): string {
  if (!surface) return 'None';
  const thickness = formatMeasure('sectionSize', surface.thicknessMm, system, { withUnit: true });
  return `${thickness} ${surface.kind === 'integral' ? 'integral' : 'overlay'}${surface.measured ? ', measured' : ''}`;
}

function describeBarriers(barriers: SpanDetail['barriers'], system: UnitSystem): string {
  return barriers.length === 0 ? 'None' : barriers.map((barrier) => formatMeasure('lineLoad', barrier.loadKnM, system, { withUnit: true })).join(', ');
}

function describeDiaphragms(diaphragms: SpanDetail['diaphragms'], system: UnitSystem): string {
  if (diaphragms.length === 0) return 'None';
  return diaphragms
    .map((d) => `${formatMeasure('pointLoad', d.loadKn, system, { withUnit: true })} at ${formatMeasure('spanLength', d.xM, system, { withUnit: true })}`)
    .join(', ');
}
