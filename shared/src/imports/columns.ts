import { FINDING_KINDS, FINDING_SEVERITIES } from '../inspections';
import { STRUCTURE_STATUSES } from '../inventory';
import { convert, type Unit } from '../units';

/**
 * The column contract of the bulk-import templates: for each template, the columns a file may
 * carry, in the template's order. Headers are our own snake_case names ending in their unit
 * (`span_length_m`); a measured column also accepts one US customary header (`span_length_ft`),
 * converted to SI through units.ts as the row is read. Each column names the place in the API
 * body its value goes to (`path`), which is also how a schema's complaint is traced back to it.
 */

export const IMPORT_TEMPLATE_NAMES = ['structures', 'spans', 'girders', 'strand-rows', 'findings', 'prior-ratings'] as const;
export type ImportTemplateName = (typeof IMPORT_TEMPLATE_NAMES)[number];

/** How a cell is read before the API schema judges it. Lists are separated by ";". */
export type CellType = 'text' | 'number' | 'whole-number' | 'date' | 'yes-no' | 'choice' | 'number-list' | 'whole-number-list';

/** A column's unit: one of units.ts for measured values, or a plain label (degrees) that has no US alternative. */
export interface ColumnUnit {
  /** The unit as the header ends (`mm2`, `kn_m3`). */
  readonly suffix: string;
  /** The unit as people write it (`mm²`, `kN/m³`). */
  readonly label: string;
}

export interface UsAlternative extends ColumnUnit {
  readonly header: string;
  /** The units.ts names the value converts between: US customary → the SI unit of the column. */
  readonly fromUnit: Unit;
  readonly toUnit: Unit;
}

export interface ImportColumn {
  readonly header: string;
  /** Where the value goes in the body the row becomes, e.g. `['span', 'lengthM']`. */
  readonly path: readonly string[];
  readonly required: boolean;
  /** What is measured or held: `length`, `stress`, `text`, `count` … */
  readonly quantity: string;
  readonly type: CellType;
  readonly unit: ColumnUnit | null;
  readonly us: UsAlternative | null;
  /** The values a `choice` column accepts. */
  readonly choices: readonly string[] | null;
  /** A list column whose items become objects, e.g. barrier loads `[{ loadKnM }]`. */
  readonly listItemKey: string | null;
  readonly description: string;
  /** An example value in the SI header's unit, as written in the template. */
  readonly example: string;
}

export interface ImportTemplate {
  readonly name: ImportTemplateName;
  /** For people: "Strand rows". */
  readonly title: string;
  /** What a row of this template is and how it lands. */
  readonly summary: string;
  /** The headers that identify a row; no two rows of a file may share them. */
  readonly keyHeaders: readonly string[];
  readonly columns: readonly ImportColumn[];
}

/** The SI and US units a measured column may be given in, keyed by the SI unit's header suffix. */
const MEASURES = {
  m: { si: { suffix: 'm', label: 'm', unit: 'm' }, us: { suffix: 'ft', label: 'ft', unit: 'ft' }, quantity: 'length' },
  mm: { si: { suffix: 'mm', label: 'mm', unit: 'mm' }, us: { suffix: 'in', label: 'in', unit: 'in' }, quantity: 'length' },
  mmAsFt: { si: { suffix: 'mm', label: 'mm', unit: 'mm' }, us: { suffix: 'ft', label: 'ft', unit: 'ft' }, quantity: 'length' },
  mm2: { si: { suffix: 'mm2', label: 'mm²', unit: 'mm2' }, us: { suffix: 'in2', label: 'in²', unit: 'in2' }, quantity: 'area' },
  mpa: { si: { suffix: 'mpa', label: 'MPa', unit: 'MPa' }, us: { suffix: 'ksi', label: 'ksi', unit: 'ksi' }, quantity: 'stress' },
  knPerM: { si: { suffix: 'kn_m', label: 'kN/m', unit: 'kN/m' }, us: { suffix: 'kip_ft', label: 'kip/ft', unit: 'kip/ft' }, quantity: 'line load' },
  knPerM3: { si: { suffix: 'kn_m3', label: 'kN/m³', unit: 'kN/m3' }, us: { suffix: 'pcf', label: 'lb/ft³', unit: 'pcf' }, quantity: 'unit weight' },
} as const;
type MeasureName = keyof typeof MEASURES;

interface ColumnOptions {
  readonly required?: boolean;
  readonly type?: CellType;
  readonly quantity?: string;
  readonly choices?: readonly string[];
  readonly listItemKey?: string;
  readonly unit?: ColumnUnit;
}

/** A column with no US alternative (text, counts, dates, choices, degrees). */
function column(header: string, path: readonly string[], description: string, example: string, options: ColumnOptions = {}): ImportColumn {
  return {
    header,
    path,
    required: options.required ?? false,
    quantity: options.quantity ?? 'text',
    type: options.type ?? 'text',
    unit: options.unit ?? null,
    us: null,
    choices: options.choices ?? null,
    listItemKey: options.listItemKey ?? null,
    description,
    example,
  };
}

/** A measured column `<base>_<si unit>` with its US alternative `<base>_<us unit>`. */
function measured(base: string, measure: MeasureName, path: readonly string[], description: string, example: string, options: ColumnOptions = {}): ImportColumn {
  const { si, us, quantity } = MEASURES[measure];
  return {
    ...column(`${base}_${si.suffix}`, path, description, example, { type: 'number', ...options, quantity }),
    unit: { suffix: si.suffix, label: si.label },
    us: { header: `${base}_${us.suffix}`, suffix: us.suffix, label: us.label, fromUnit: us.unit, toUnit: si.unit },
  };
}

/** A US customary value in the column's SI unit (units.ts constants). */
export function usToSi(column: ImportColumn, value: number): number {
  if (column.us === null) throw new RangeError(`column ${column.header} has no US customary alternative`);
  return convert(value, column.us.fromUnit, column.us.toUnit as never);
}

/** An SI value in the column's US customary unit, for documenting examples. */
export function siToUs(column: ImportColumn, value: number): number {
  if (column.us === null) throw new RangeError(`column ${column.header} has no US customary alternative`);
  return convert(value, column.us.toUnit, column.us.fromUnit as never);
}

const DEGREES: ColumnUnit = { suffix: 'deg', label: '°' };
const whole = (quantity = 'count'): ColumnOptions => ({ type: 'whole-number', quantity });
const required: ColumnOptions = { required: true };
const YES_NO: ColumnOptions = { type: 'yes-no', quantity: 'yes or no' };
const choice = (choices: readonly string[], extra: ColumnOptions = {}): ColumnOptions => ({ type: 'choice', quantity: 'choice', choices, ...extra });

const structureNumber = (path: readonly string[]) =>
  column('structure_number', path, "The owner's structure number: letters, digits, spaces and . _ / - (at most 30).", 'BV-S-0201', required);
const spanIndex = (path: readonly string[], isRequired = true) =>
  column('span_index', path, 'The span, numbered 1, 2, … from the start of the structure.', '1', { ...whole(), required: isRequired });
const girderNumber = (path: readonly string[]) =>
  column('girder_number', path, 'The girder across the span, numbered 1…n from the left edge of the plans.', '3', { ...whole(), required: true });
/** The key of the girder a strand row or a finding belongs to. */
const girderKeyColumns = () => [structureNumber(['structureNumber']), spanIndex(['spanIndex']), girderNumber(['girderNumber'])];

const structures: ImportTemplate = {
  name: 'structures',
  title: 'Structures',
  summary: 'One row per structure. A structure number already on file is updated with the values given; a new one is added.',
  keyHeaders: ['structure_number'],
  columns: [
    structureNumber(['structureNumber']),
    column('name', ['name'], 'The structure’s name, at most 200 characters.', 'Mill Creek Road over Mill Creek', required),
    column('route_carried', ['routeCarried'], 'The road the structure carries, at most 100 characters.', 'County Road 14', required),
    column('feature_crossed', ['featureCrossed'], 'What it crosses, at most 200 characters.', 'Mill Creek', required),
    column('district', ['district'], 'The owner’s district, at most 100 characters.', 'North District', required),
    column('longitude_deg', ['longitude'], 'WGS 84 longitude, −180 to 180.', '-96.512', { required: true, type: 'number', quantity: 'angle', unit: DEGREES }),
    column('latitude_deg', ['latitude'], 'WGS 84 latitude, −90 to 90.', '41.208', { required: true, type: 'number', quantity: 'angle', unit: DEGREES }),
    column('year_built', ['yearBuilt'], 'Year built, 1800 to 2200.', '1978', whole('year')),
    column('year_last_major_work', ['yearLastMajorWork'], 'Year of the last major work; not before the year built.', '2004', whole('year')),
    column('adt', ['adt'], 'Average daily traffic, vehicles a day.', '3200', whole()),
    column('adtt', ['adtt'], 'Average daily truck traffic; not more than the ADT.', '410', whole()),
    column('skew_deg', ['skewDeg'], 'Skew angle, at least 0 and under 90; 0 when left empty.', '15', { type: 'number', quantity: 'angle', unit: DEGREES }),
    column('deck_condition', ['deckCondition'], 'Condition rating of the deck, 0 to 9.', '6', whole('condition rating')),
    column('superstructure_condition', ['superstructureCondition'], 'Condition rating of the superstructure, 0 to 9.', '5', whole('condition rating')),
    column('substructure_condition', ['substructureCondition'], 'Condition rating of the substructure, 0 to 9.', '6', whole('condition rating')),
    column('condition_rated_on', ['conditionRatedOn'], 'The date the condition ratings were given, YYYY-MM-DD.', '2025-06-12', { type: 'date', quantity: 'date' }),
    column('status', ['status'], 'open, posted or closed; open when left empty.', 'open', choice(STRUCTURE_STATUSES)),
    column('notes', ['notes'], 'Free notes, at most 4000 characters.', 'Widened 2004', {}),
  ],
};

const spans: ImportTemplate = {
  name: 'spans',
  title: 'Spans',
  summary:
    'One row per span. The structure must be in the same upload or already on file. A span already on file is updated with the values given; the girder count follows the girders stored on the span.',
  keyHeaders: ['structure_number', 'span_index'],
  columns: [
    structureNumber(['structureNumber']),
    spanIndex(['spanIndex']),
    measured('span_length', 'm', ['span', 'lengthM'], 'Span length, bearing to bearing; more than 0, at most 300 m.', '24.4', required),
    measured('girder_spacing', 'mm', ['span', 'girderSpacingMm'], 'Centre-to-centre girder spacing; more than 0, at most 6000 mm.', '2400', required),
    measured('overhang', 'mm', ['span', 'overhangMm'], 'Deck overhang beyond the exterior girder’s centreline; 0 to 3000 mm.', '900', required),
    measured('roadway_width', 'mmAsFt', ['span', 'roadwayWidthMm'], 'Roadway width between barrier faces; more than 0, at most 60000 mm.', '11000', required),
    measured('barrier_face_to_girder', 'mm', ['span', 'barrierFaceToGirderMm'], 'Exterior girder centreline to the barrier’s traffic face, positive when the face is outboard; −3000 to 3000 mm.', '-150'),
    measured('deck_thickness', 'mm', ['span', 'deckThicknessMm'], 'Structural deck thickness, without a sacrificial wearing surface; more than 0, at most 600 mm.', '200', required),
    measured('haunch', 'mm', ['span', 'haunchMm'], 'Haunch between the girder top and the deck; 0 to 500 mm.', '25'),
    measured('wearing_surface_thickness', 'mm', ['span', 'wearingSurface', 'thicknessMm'], 'Wearing surface thickness; leave empty when there is none.', '50'),
    measured('wearing_surface_unit_weight', 'knPerM3', ['span', 'wearingSurface', 'unitWeightKnM3'], 'Wearing surface unit weight; the rating policy’s value when left empty.', '23'),
    column('wearing_surface_measured', ['span', 'wearingSurface', 'measured'], 'yes when the thickness was measured in the field (it earns the lower DW load factor).', 'no', YES_NO),
    column('wearing_surface_kind', ['span', 'wearingSurface', 'kind'], 'overlay (on the composite section) or integral (cast with the deck).', 'overlay', choice(['overlay', 'integral'])),
    measured('barrier_loads', 'knPerM', ['span', 'barriers'], 'The line load of each barrier, separated by ";".', '7.2;7.2', { type: 'number-list', listItemKey: 'loadKnM' }),
  ],
};

const girders: ImportTemplate = {
  name: 'girders',
  title: 'Girders',
  summary:
    'One row per girder. The span must be in the same upload or already on file. The section is a girder type of the catalogue by name, or a custom rectangle, tee or I-girder given by its dimensions (other shapes: add a girder type first). A girder already on file is replaced as a whole, except its strand rows, which only a strand-rows file replaces.',
  keyHeaders: ['structure_number', 'span_index', 'girder_number'],
  columns: [
    ...girderKeyColumns(),
    column('position', ['record', 'position'], 'interior or exterior.', 'interior', { ...choice(['interior', 'exterior']), required: true }),
    column('girder_type', ['girderTypeName'], 'The name of a girder type of the catalogue; leave empty for a custom section.', 'AASHTO Type III I-girder'),
    column('section_shape', ['record', 'customSection', 'shape'], 'A custom section: rectangle, tee or i-girder, with the dimensions its shape uses below.', '', choice(['rectangle', 'tee', 'i-girder'])),
    measured('section_width', 'mm', ['record', 'customSection', 'widthMm'], 'Rectangle: its width.', ''),
    measured('section_depth', 'mm', ['record', 'customSection', 'depthMm'], 'Every custom shape: overall depth.', ''),
    measured('section_flange_width', 'mm', ['record', 'customSection', 'flangeWidthMm'], 'Tee: flange width.', ''),
    measured('section_flange_thickness', 'mm', ['record', 'customSection', 'flangeThicknessMm'], 'Tee: flange thickness, less than the depth.', ''),
    measured('section_web_width', 'mm', ['record', 'customSection', 'webWidthMm'], 'Tee and I-girder: web width, no wider than the flanges.', ''),
    measured('section_top_flange_width', 'mm', ['record', 'customSection', 'topFlangeWidthMm'], 'I-girder: top flange width.', ''),
    measured('section_top_flange_thickness', 'mm', ['record', 'customSection', 'topFlangeThicknessMm'], 'I-girder: top flange thickness.', ''),
    measured('section_top_taper_height', 'mm', ['record', 'customSection', 'topTaperHeightMm'], 'I-girder: height of the taper from the web to the top flange (0: none).', ''),
    measured('section_bottom_flange_width', 'mm', ['record', 'customSection', 'bottomFlangeWidthMm'], 'I-girder: bottom flange width.', ''),
    measured('section_bottom_flange_thickness', 'mm', ['record', 'customSection', 'bottomFlangeThicknessMm'], 'I-girder: bottom flange thickness.', ''),
    measured('section_bottom_taper_height', 'mm', ['record', 'customSection', 'bottomTaperHeightMm'], 'I-girder: height of the taper from the bottom flange to the web (0: none).', ''),
    measured('concrete_strength', 'mpa', ['record', 'concrete', 'strengthMpa'], 'Girder concrete strength (f′c for cylinder, fck for cube); more than 0.', '41.4', required),
    column('concrete_basis', ['record', 'concrete', 'basis'], 'cylinder (f′c) or cube (fck): the basis of the strength.', 'cylinder', { ...choice(['cylinder', 'cube']), required: true }),
    measured('concrete_unit_weight', 'knPerM3', ['record', 'concrete', 'unitWeightKnM3'], 'Girder concrete unit weight; 24 kN/m³ when left empty.', '24'),
    measured('concrete_elastic_modulus', 'mpa', ['record', 'concrete', 'elasticModulusMpa'], 'Girder concrete Ec; from the policy’s formula when left empty.', ''),
    measured('deck_concrete_strength', 'mpa', ['record', 'deckConcrete', 'strengthMpa'], 'Deck concrete strength on the same basis rule; more than 0.', '27.6', required),
    column('deck_concrete_basis', ['record', 'deckConcrete', 'basis'], 'cylinder or cube.', 'cylinder', { ...choice(['cylinder', 'cube']), required: true }),
    measured('deck_concrete_unit_weight', 'knPerM3', ['record', 'deckConcrete', 'unitWeightKnM3'], 'Deck concrete unit weight; the girder concrete’s when left empty.', ''),
    column('tensioning', ['record', 'tensioning'], 'pre (pretensioned) or post (post-tensioned); pre when left empty.', 'pre', choice(['pre', 'post'])),
  ],
};

const strandRows: ImportTemplate = {
  name: 'strand-rows',
  title: 'Strand rows',
  summary:
    'One row per strand row of a girder. The girder must be in the same upload or already on file. The strand rows a file gives for a girder replace all of that girder’s stored rows; a girder the file gives no strand rows for keeps its own.',
  keyHeaders: ['structure_number', 'span_index', 'girder_number', 'row_id'],
  columns: [
    ...girderKeyColumns(),
    column('row_id', ['strandRow', 'id'], 'The row’s name within the girder; findings name strands by it.', 'R1', required),
    measured('y', 'mm', ['strandRow', 'yMm'], 'Height of the row’s strands above the soffit.', '50', required),
    column('strand_count', ['strandRow', 'count'], 'Strands in the row, a whole number more than 0.', '12', { ...whole(), required: true }),
    measured('strand_area', 'mm2', ['strandRow', 'strandAreaMm2'], 'Area of one strand; more than 0.', '98.7', required),
    measured('strand_diameter', 'mm', ['strandRow', 'strandDiameterMm'], 'Nominal diameter of one strand; more than 0.', '12.7', required),
    measured('fpu', 'mpa', ['strandRow', 'fpuMpa'], 'Specified tensile strength of the strand.', '1860', required),
    measured('fpy', 'mpa', ['strandRow', 'fpyMpa'], 'Yield strength of the strand.', '1674', required),
    measured('eps', 'mpa', ['strandRow', 'epsMpa'], 'Elastic modulus of the strand.', '196500', required),
    measured('fpe', 'mpa', ['strandRow', 'fpeMpa'], 'Effective prestress after all losses, 0 or more; a rating may compute it instead.', '1100'),
    column('bonded', ['strandRow', 'bonded'], 'no for unbonded tendons; yes when left empty.', 'yes', YES_NO),
    measured('unbonded_length', 'mm', ['strandRow', 'unbondedLengthMm'], 'Unbonded tendons: length between anchorages.', ''),
  ],
};

const findings: ImportTemplate = {
  name: 'findings',
  title: 'Findings',
  summary:
    'One row per finding of a girder, recorded in the structure’s inspection of the date given. The girder must be in the same upload or already on file. A finding names its strands by the strand row and either their indices (0…count−1) or a count.',
  keyHeaders: ['structure_number', 'span_index', 'girder_number', 'inspected_on', 'kind', 'from_m', 'to_m'],
  columns: [
    ...girderKeyColumns(),
    column('inspected_on', ['inspectedOn'], 'The date of the inspection the finding belongs to, YYYY-MM-DD.', '2025-06-12', { type: 'date', quantity: 'date', required: true }),
    column('kind', ['finding', 'kind'], `What was found: ${FINDING_KINDS.join(', ')}.`, 'exposed-strands', { ...choice(FINDING_KINDS), required: true }),
    column('severity', ['finding', 'severity'], `${FINDING_SEVERITIES.join(', ')}.`, 'moderate', { ...choice(FINDING_SEVERITIES), required: true }),
    measured('from', 'm', ['finding', 'fromM'], 'Where the finding starts, from the span’s start; 0 or more.', '3.2', required),
    measured('to', 'm', ['finding', 'toM'], 'Where it ends; not before from.', '4.1', required),
    column('strand_row_id', ['finding', 'strands', 'rowId'], 'Strand kinds (lost, section loss, broken wires, exposed): the strand row affected.', 'R1'),
    column('strand_indices', ['finding', 'strands', 'strands'], 'The strands of the row by index 0…count−1, separated by ";" — or give strand_count instead.', '0;11', { type: 'whole-number-list', quantity: 'strand indices' }),
    column('strand_count', ['finding', 'strands', 'count'], 'How many strands of the row, when they are not named one by one.', '', whole()),
    column('loss_fraction', ['finding', 'lossFraction'], 'Strand section loss: the fraction of each strand’s area gone, more than 0, at most 1.', '', { type: 'number', quantity: 'fraction' }),
    column('broken_wires', ['finding', 'brokenWires'], 'Broken wires: how many wires of each strand are broken, 1 to 6.', '', whole()),
    measured('spall_depth', 'mm', ['finding', 'spall', 'depthMm'], 'Spall of the bottom flange: its depth.', ''),
    measured('spall_width', 'mm', ['finding', 'spall', 'widthMm'], 'Spall of the bottom flange: its width across the flange.', ''),
    measured('deck_loss', 'mm', ['finding', 'deckLossMm'], 'Deck loss: thickness of deck lost over the girder.', ''),
    measured('crack_width', 'mm', ['finding', 'crackWidthMm'], 'Crack: width at the surface, for the record.', ''),
    column('notes', ['finding', 'notes'], 'Free notes, at most 4000 characters.', 'Cover spalled off, strands rusted', {}),
  ],
};

const priorRatings: ImportTemplate = {
  name: 'prior-ratings',
  title: 'Prior ratings',
  summary:
    'One row per rating already on file before Spanledger, for a whole structure (span_index empty) or one span, so that the change from the previous rating is known from the start. The structure (and span) must be in the same upload or already on file.',
  keyHeaders: ['structure_number', 'span_index'],
  columns: [
    structureNumber(['structureNumber']),
    spanIndex(['spanIndex'], false),
    column('lowest_legal_rf', ['lowestLegalRatingFactor'], 'Lowest rating factor of the legal loads; 0 or more.', '1.12', { type: 'number', quantity: 'rating factor' }),
    column('design_inventory_rf', ['designInventoryRatingFactor'], 'Design load rating factor at the inventory level; 0 or more. Give this or lowest_legal_rf, or both.', '0.94', { type: 'number', quantity: 'rating factor' }),
    column('approved_on', ['approvedOn'], 'The date the rating was approved, YYYY-MM-DD.', '2019-03-08', { type: 'date', quantity: 'date', required: true }),
    column('source_note', ['sourceNote'], 'Where the rating comes from (report, engineer, file), at most 1000 characters.', 'Rating report of March 2019, file BV-R-112', required),
  ],
};

export const IMPORT_TEMPLATES: Readonly<Record<ImportTemplateName, ImportTemplate>> = {
  structures,
  spans,
  girders,
  'strand-rows': strandRows,
  findings,
  'prior-ratings': priorRatings,
};
