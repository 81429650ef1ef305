import { ELASTIC_MODULUS_BASIS, EngineInputError, elasticModulusMpa, type ElasticModulusFormula } from '../materials';
import type { GrossSection } from './elastic-shortening';
import { STRAND_TYPES, type StrandType } from './long-term';

/** A strand row as the loss calculation sees it: `areaMm2` is the row's total strand area. */
export interface LossStrandRow {
  readonly rowId: string;
  readonly yMm: number;
  readonly areaMm2: number;
  readonly epsMpa: number;
}

/** Eci from the policy's formula on f'ci, when no measured Eci is given. */
export interface EciFromFormula {
  readonly formula: ElasticModulusFormula;
  /** Unit weight of the girder concrete. The AASHTO forms use it. */
  readonly unitWeightKnM3: number;
  readonly k1?: number;
}

export interface EffectivePrestressInput {
  readonly rows: readonly LossStrandRow[];
  readonly section: GrossSection;
  /** One jacking stress for every row, or one per row keyed by `rowId`. */
  readonly jackingStressMpa: number | Readonly<Record<string, number>>;
  /** f'ci: the cylinder strength at transfer. */
  readonly fciMpa: number;
  /** Eci, measured or given. When present it is used in preference to `eciFormula`. */
  readonly eciMpa?: number;
  readonly eciFormula?: EciFromFormula;
  readonly relativeHumidityPct: number;
  readonly strandType: StrandType;
  /** Girder self-weight moment at the section (by default the midspan moment w L²/8 of a simple span), sagging positive. */
  readonly selfWeightMomentNmm: number;
}

const ROOT = 'losses';

function requirePositive(value: number, path: string): void {
  if (!Number.isFinite(value) || value <= 0) throw new EngineInputError(path, `must be a number > 0, got ${value}`);
}

function requireFinite(value: number, path: string): void {
  if (!Number.isFinite(value)) throw new EngineInputError(path, `must be a finite number, got ${value}`);
}

/** Refuses any input that the method, or the arithmetic, cannot take. Paths are under `losses.`. */
export function checkInput(input: EffectivePrestressInput): void {
  checkSection(input.section);
  checkRows(input.rows, input.section);
  requirePositive(input.fciMpa, `${ROOT}.fciMpa`);
  const humidity = input.relativeHumidityPct;
  if (!Number.isFinite(humidity) || humidity < 0 || humidity > 100) {
    throw new EngineInputError(`${ROOT}.relativeHumidityPct`, `must be between 0 and 100 %, got ${humidity}`);
  }
  if (!STRAND_TYPES.includes(input.strandType)) {
    throw new EngineInputError(`${ROOT}.strandType`, `must be one of ${STRAND_TYPES.join(', ')}, got ${input.strandType}`);
  }
  // A simple span sags under its own weight; a negative moment here is almost always a sign slip.
  requireFinite(input.selfWeightMomentNmm, `${ROOT}.selfWeightMomentNmm`);
  if (input.selfWeightMomentNmm < 0) {
    throw new EngineInputError(`${ROOT}.selfWeightMomentNmm`, 'must be >= 0 (sagging positive, as at midspan of a simple span)');
  }
}

function checkSection(section: GrossSection): void {
  requirePositive(section.areaMm2, `${ROOT}.section.areaMm2`);
  requirePositive(section.centroidFromSoffitMm, `${ROOT}.section.centroidFromSoffitMm`);
  requirePositive(section.inertiaMm4, `${ROOT}.section.inertiaMm4`);
}

function checkRows(rows: readonly LossStrandRow[], section: GrossSection): void {
  if (rows.length === 0) throw new EngineInputError(`${ROOT}.rows`, 'needs at least one strand row');
  const seen = new Set<string>();
  rows.forEach((row, index) => {
    const path = `${ROOT}.rows[${index}]`;
    if (seen.has(row.rowId)) throw new EngineInputError(`${path}.rowId`, `repeats the row id "${row.rowId}"`);
    seen.add(row.rowId);
    requireFinite(row.yMm, `${path}.yMm`);
    if (row.yMm < 0) throw new EngineInputError(`${path}.yMm`, 'must be >= 0: y is measured up from the soffit');
    requirePositive(row.areaMm2, `${path}.areaMm2`);
    requirePositive(row.epsMpa, `${path}.epsMpa`);
    // The article takes one Ep for the group of strands, so the rows must agree on it.
    if (row.epsMpa !== rows[0]!.epsMpa) {
      throw new EngineInputError(`${path}.epsMpa`, `must equal the first row's ${rows[0]!.epsMpa} MPa: the approximate method takes one Ep`);
    }
  });
  const steelAreaMm2 = rows.reduce((total, row) => total + row.areaMm2, 0);
  if (steelAreaMm2 >= section.areaMm2) {
    throw new EngineInputError(`${ROOT}.rows`, `the strand area ${steelAreaMm2} mm² must be less than the gross area ${section.areaMm2} mm²`);
  }
}

/** Each row's jacking stress, in row order; a per-row record must name every row and no other. */
export function jackingStressesMpa(input: EffectivePrestressInput): number[] {
  const given = input.jackingStressMpa;
  const path = `${ROOT}.jackingStressMpa`;
  if (typeof given === 'number') {
    requirePositive(given, path);
    return input.rows.map(() => given);
  }
  const rowIds = new Set(input.rows.map((row) => row.rowId));
  const stray = Object.keys(given).find((rowId) => !rowIds.has(rowId));
  if (stray !== undefined) throw new EngineInputError(`${path}.${stray}`, 'names no strand row');
  return input.rows.map((row) => {
    const stressMpa = given[row.rowId];
    if (stressMpa === undefined) throw new EngineInputError(`${path}.${row.rowId}`, 'is missing: give every row a jacking stress');
    requirePositive(stressMpa, `${path}.${row.rowId}`);
    return stressMpa;
  });
}

/** Eci: the given value, else the policy's formula on f'ci. The formula must take a cylinder strength, as f'ci is one. */
export function resolveEciMpa(input: EffectivePrestressInput): number {
  if (input.eciMpa !== undefined) {
    requirePositive(input.eciMpa, `${ROOT}.eciMpa`);
    return input.eciMpa;
  }
  const fromFormula = input.eciFormula;
  if (fromFormula === undefined) {
    throw new EngineInputError(`${ROOT}.eciMpa`, 'is missing: give Eci, or a formula and unit weight to compute it from f\'ci');
  }
  if (ELASTIC_MODULUS_BASIS[fromFormula.formula] !== 'cylinder') {
    throw new EngineInputError(`${ROOT}.eciFormula.formula`, `${fromFormula.formula} takes a cube strength; f'ci is a cylinder strength`);
  }
  requirePositive(fromFormula.unitWeightKnM3, `${ROOT}.eciFormula.unitWeightKnM3`);
  if (fromFormula.k1 !== undefined) requirePositive(fromFormula.k1, `${ROOT}.eciFormula.k1`);
  return elasticModulusMpa(fromFormula.formula, { fcMpa: input.fciMpa, unitWeightKnM3: fromFormula.unitWeightKnM3, k1: fromFormula.k1 });
}
