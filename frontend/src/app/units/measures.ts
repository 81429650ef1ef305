import { convert, type Unit } from '@spanledger/shared';

/** The unit system the user reads and types in; values are stored and sent in SI whatever it is. */
export type UnitSystem = 'si' | 'us';
export const UNIT_SYSTEMS: readonly UnitSystem[] = ['si', 'us'];

interface MeasureDefinition {
  /** The unit the API stores and answers the value in, as its field name says (`lengthM`, `…Mm`). */
  readonly stored: Unit;
  readonly shown: Readonly<Record<UnitSystem, Unit>>;
}

/**
 * The kinds of value the pages show, each with its stored unit and the unit people read
 * in either system. All pairs are of one quantity, so `convert` accepts them.
 */
const MEASURES = {
  /** Span lengths and positions along a span. */
  spanLength: { stored: 'm', shown: { si: 'm', us: 'ft' } },
  /** Dimensions across the deck: girder spacing, overhang, roadway width, barrier offset. */
  deckLayout: { stored: 'mm', shown: { si: 'mm', us: 'ft' } },
  /** Section and deck sizes: deck thickness, haunch, wearing surface thickness. */
  sectionSize: { stored: 'mm', shown: { si: 'mm', us: 'in' } },
  /** Line loads along the span, such as a barrier's weight. */
  lineLoad: { stored: 'kN/m', shown: { si: 'kN/m', us: 'kip/ft' } },
  /** Point loads, such as a diaphragm's weight. */
  pointLoad: { stored: 'kN', shown: { si: 'kN', us: 'kip' } },
  /** Concrete and steel strengths. */
  strength: { stored: 'MPa', shown: { si: 'MPa', us: 'ksi' } },
  /** Unit weights of concrete and overlays. */
  unitWeight: { stored: 'kN/m3', shown: { si: 'kN/m3', us: 'pcf' } },
  /** Bending moments per girder: capacity and demand along the span. */
  moment: { stored: 'kNm', shown: { si: 'kNm', us: 'kipFt' } },
} as const satisfies Record<string, MeasureDefinition>;

export type MeasureKind = keyof typeof MEASURES;

/** Decimals of a displayed value, and of a value in an input (one finer, so typing round-trips). */
const DECIMALS: Partial<Record<Unit, number>> = {
  m: 2,
  ft: 2,
  mm: 0,
  in: 2,
  'kN/m': 2,
  'kip/ft': 3,
  kN: 1,
  kip: 2,
  MPa: 1,
  ksi: 2,
  'kN/m3': 1,
  pcf: 1,
  kNm: 1,
  kipFt: 1,
};
const DEFAULT_DECIMALS = 2;
/** A typed US customary value is stored to a thousandth of a millimetre (or the like): no float noise like 30.479999999. */
const STORED_DECIMALS = 6;

const UNIT_LABELS: Partial<Record<Unit, string>> = { 'kN/m3': 'kN/m³', kNm: 'kN·m', kipFt: 'kip·ft' };

/** The unit a kind of value is shown in, e.g. `unitOf('spanLength', 'us')` is 'ft'. */
export function unitOf(kind: MeasureKind, system: UnitSystem): Unit {
  return MEASURES[kind].shown[system];
}

/** How a unit is written for people: 'kN/m³' and 'kN·m' rather than the conversion table's 'kN/m3' and 'kNm'. */
export function unitLabel(kind: MeasureKind, system: UnitSystem): string {
  const unit = unitOf(kind, system);
  return UNIT_LABELS[unit] ?? unit;
}

/** Every kind's unit label in one system, for table headers and input suffixes. */
export function unitLabels(system: UnitSystem): Readonly<Record<MeasureKind, string>> {
  return Object.fromEntries(Object.keys(MEASURES).map((kind) => [kind, unitLabel(kind as MeasureKind, system)])) as Record<MeasureKind, string>;
}

/** A stored (SI) value in the unit people read it in. */
export function toShownUnits(kind: MeasureKind, storedValue: number, system: UnitSystem): number {
  return between(storedValue, MEASURES[kind].stored, unitOf(kind, system));
}

/** A value typed in the shown unit, back in the stored (SI) unit the API takes. */
export function toStoredUnits(kind: MeasureKind, shownValue: number, system: UnitSystem): number {
  const stored = between(shownValue, unitOf(kind, system), MEASURES[kind].stored);
  return Number(stored.toFixed(STORED_DECIMALS));
}

/** A stored value for reading, e.g. "100.00" (30.48 m in feet), with the unit when asked; a dash when there is none. */
export function formatMeasure(kind: MeasureKind, storedValue: number | null, system: UnitSystem, options: { withUnit?: boolean } = {}): string {
  if (storedValue === null) return '—';
  const decimals = decimalsOf(unitOf(kind, system));
  const text = toShownUnits(kind, storedValue, system).toLocaleString('en', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
  return options.withUnit ? `${text} ${unitLabel(kind, system)}` : text;
}

/** A stored value as an input shows it: plain digits, no grouping, no trailing zeros ("100", "30.48"). */
export function inputText(kind: MeasureKind, storedValue: number | null, system: UnitSystem): string {
  if (storedValue === null) return '';
  const decimals = decimalsOf(unitOf(kind, system)) + 1;
  return String(Number(toShownUnits(kind, storedValue, system).toFixed(decimals)));
}

function decimalsOf(unit: Unit): number {
  return DECIMALS[unit] ?? DEFAULT_DECIMALS;
}

/** The table above pairs units of one quantity; `convert` checks that again at run time. */
function between(value: number, from: Unit, to: Unit): number {
  return convert(value, from, to as never);
}
