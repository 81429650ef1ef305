import { sectionShapeSchema, type SectionShape } from '@spanledger/shared';
import { z } from 'zod';

export type SectionShapeName = SectionShape['shape'];

/** How a section dimension is typed: a length, a whole count, or a list of points (one per line, holes apart by a blank line). */
export type SectionFieldKind = 'length' | 'count' | 'points' | 'rings';

/** One dimension of a section shape, by its key in the calculation file. */
export interface SectionField {
  readonly key: string;
  readonly label: string;
  readonly kind: SectionFieldKind;
  readonly optional: boolean;
}

export const SECTION_SHAPE_NAMES: Readonly<Record<SectionShapeName, string>> = {
  rectangle: 'Rectangle',
  tee: 'T-beam',
  'i-girder': 'I-girder',
  profile: 'Profile (widths up the height, e.g. a bulb-tee)',
  box: 'Box',
  'voided-slab': 'Voided slab',
  'double-tee': 'Double-tee',
  polygon: 'Custom polygon',
};

const SECTION_KEY_LABELS: Readonly<Record<string, string>> = {
  widthMm: 'Width',
  depthMm: 'Depth',
  flangeWidthMm: 'Flange width',
  flangeThicknessMm: 'Flange thickness',
  webWidthMm: 'Web width',
  topFlangeWidthMm: 'Top flange width',
  topFlangeThicknessMm: 'Top flange thickness',
  topTaperHeightMm: 'Top taper height',
  bottomTaperHeightMm: 'Bottom taper height',
  bottomFlangeWidthMm: 'Bottom flange width',
  bottomFlangeThicknessMm: 'Bottom flange thickness',
  widthsMm: 'Widths up the height (y, width on each line)',
  voidWidthMm: 'Void width',
  voidDepthMm: 'Void depth',
  voidBottomMm: 'Void bottom above the soffit',
  voidFilletMm: 'Void corner fillet',
  voidDiameterMm: 'Void diameter',
  voidCount: 'Number of voids',
  voidCentreYMm: 'Void centre above the soffit',
  stemSpacingMm: 'Stem spacing',
  stemTopWidthMm: 'Stem width at the top',
  stemBottomWidthMm: 'Stem width at the soffit',
  pointsMm: 'Outline (x, y on each line)',
  holesMm: 'Holes (x, y on each line; a blank line between holes)',
};

const shapeSchemas = new Map(sectionShapeSchema.options.map((schema) => [schema.shape.shape.value as SectionShapeName, schema]));

function fieldKind(key: string, schema: z.ZodType): SectionFieldKind {
  const inner = schema instanceof z.ZodOptional ? (schema.unwrap() as z.ZodType) : schema;
  if (inner instanceof z.ZodArray) return inner.element instanceof z.ZodArray ? 'rings' : 'points';
  return key.endsWith('Mm') ? 'length' : 'count';
}

/** Every dimension a shape takes, in the calculation file's order. */
export function sectionFieldsOf(shape: SectionShapeName): SectionField[] {
  const schema = shapeSchemas.get(shape);
  if (!schema) return [];
  return Object.entries(schema.shape as Record<string, z.ZodType>)
    .filter(([key]) => key !== 'shape')
    .map(([key, field]) => ({ key, label: sectionKeyLabel(key), kind: fieldKind(key, field), optional: field instanceof z.ZodOptional }));
}

/** The dimensions of a catalogue section a girder may override: its numbers. */
export function overridableFieldsOf(section: Readonly<Record<string, unknown>>): SectionField[] {
  const shape = section['shape'] as SectionShapeName;
  const known = sectionFieldsOf(shape).filter((field) => typeof section[field.key] === 'number');
  const others = Object.keys(section).filter((key) => key !== 'shape' && typeof section[key] === 'number' && !known.some((field) => field.key === key));
  return [...known, ...others.map((key): SectionField => ({ key, label: sectionKeyLabel(key), kind: key.endsWith('Mm') ? 'length' : 'count', optional: false }))];
}

function sectionKeyLabel(key: string): string {
  return SECTION_KEY_LABELS[key] ?? key;
}

const GROUP_LABELS: Readonly<Record<string, string>> = {
  sectionOverrides: 'Section',
  customSection: 'Custom section',
  concrete: 'Girder concrete',
  deckConcrete: 'Deck concrete',
  strandRows: 'Strand row',
  profiles: 'Profile',
  debonding: 'Debonding',
  losses: 'Losses',
  bars: 'Bar',
};

const FIELD_LABELS: Readonly<Record<string, string>> = {
  version: 'Version',
  position: 'Position',
  girderTypeId: 'Girder type',
  tensioning: 'Tensioning',
  strengthMpa: 'Strength',
  basis: 'Strength basis',
  unitWeightKnM3: 'Unit weight',
  elasticModulusMpa: 'Modulus of elasticity',
  id: 'Row id',
  yMm: 'Height y',
  count: 'Strands',
  xMm: 'Positions x',
  strandAreaMm2: 'Strand area',
  strandDiameterMm: 'Strand diameter',
  fpuMpa: 'fpu',
  fpyMpa: 'fpy',
  epsMpa: 'Eps',
  fpeMpa: 'fpe',
  bonded: 'Bonded',
  unbondedLengthMm: 'Unbonded length',
  rowId: 'Strand row',
  shape: 'Shape',
  endYMm: 'Height at the ends',
  holdDownM: 'Hold-down points',
  strands: 'Strands',
  lengthM: 'Length from each end',
  method: 'Method',
  jackingStressMpa: 'Jacking stress',
  fciMpa: 'Concrete strength at transfer',
  relativeHumidityPct: 'Relative humidity',
  strandType: 'Strand type',
  eciMpa: 'Modulus at transfer',
};

/**
 * A girder record's field path as people read it: `strandRows.2.yMm` is "Strand row 3 · Height y",
 * `sectionOverrides.depthMm` is "Section · Depth"; list positions deeper down follow in brackets.
 */
export function girderFieldLabel(path: string): string {
  const segments = path === '' ? [] : path.split('.');
  const isIndex = (segment: string | undefined) => segment !== undefined && /^\d+$/.test(segment);
  const parts: string[] = [];
  let next = 0;
  const group = GROUP_LABELS[segments[0] ?? ''];
  if (group) {
    const indexed = isIndex(segments[1]);
    parts.push(indexed ? `${group} ${Number(segments[1]) + 1}` : group);
    next = indexed ? 2 : 1;
  }
  const leaf = segments[next];
  if (leaf !== undefined) {
    const inSection = segments[0] === 'sectionOverrides' || segments[0] === 'customSection';
    parts.push(inSection ? sectionKeyLabel(leaf) : (FIELD_LABELS[leaf] ?? leaf));
    next += 1;
  }
  const label = parts.length > 0 ? parts.join(' · ') : 'Girder';
  const deeper = segments.slice(next).map((segment) => (isIndex(segment) ? String(Number(segment) + 1) : segment));
  return deeper.length > 0 ? `${label} (${deeper.join(', ')})` : label;
}
