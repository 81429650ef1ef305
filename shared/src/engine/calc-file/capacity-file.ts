import { z } from 'zod';
import { polygonContainsPointMm, polygonMm, widthAtMm, type PointMm, type PolygonMm } from '../geometry';
import { ELASTIC_MODULUS_BASIS, EngineInputError, pciStrandCurveFor } from '../materials';
import { flatTopWidthMm, shapeToPolygons } from '../section';
import { capacityOptionsSchema, damageEntrySchema, girderSchema, type CapacityOptions, type DamageEntry, type Girder } from './girder';
import { describeIssues, type CalcFileIssue } from './json-path';
import { applyStrandDamage } from './strand-damage';

/**
 * The calculation file of `spanledger capacity` (calc-file.md): one girder section, its damage
 * and the method options. The schema is both the validator and the type; `parseCapacityFile`
 * reports every problem at its JSON path.
 */
export const capacityFileSchema = z
  .strictObject({
    units: z.literal('si', 'must be "si": convert US customary values at the edge'),
    girder: girderSchema,
    damage: z.array(damageEntrySchema).default([]),
    options: capacityOptionsSchema.default(capacityOptionsSchema.parse({})),
  })
  .superRefine((file, ctx) => {
    for (const issue of capacityFileIssues(file)) ctx.addIssue({ code: 'custom', path: pathKeys(issue.path), message: issue.message });
  });
export type CapacityFile = z.output<typeof capacityFileSchema>;

export type ParseResult<T> = { readonly ok: true; readonly file: T } | { readonly ok: false; readonly issues: readonly CalcFileIssue[] };

/** Parses and checks a capacity calculation file; never throws for bad input. */
export function parseCapacityFile(input: unknown): ParseResult<CapacityFile> {
  const result = capacityFileSchema.safeParse(input);
  return result.success ? { ok: true, file: result.data } : { ok: false, issues: describeIssues(result.error) };
}

/** Turns `girder.strandRows[2].yMm` back into zod's path keys. */
export function pathKeys(path: string): (string | number)[] {
  return path.split(/\.|(?=\[)/).map((part) => (part.startsWith('[') ? Number(part.slice(1, -1)) : part));
}

/** Every cross-field rule of a capacity file that the per-field schemas cannot see. */
export function capacityFileIssues(
  file: { girder: Girder; damage: readonly DamageEntry[]; options: CapacityOptions },
  { effectivePrestressGiven = true }: { effectivePrestressGiven?: boolean } = {},
): CalcFileIssue[] {
  const polygons = shapeToPolygons(file.girder.section);
  return [
    ...girderIssues(file.girder, polygons),
    ...applyStrandDamage(file.girder.strandRows, file.damage).issues,
    ...concreteDamageIssues(file, polygons),
    ...optionIssues(file),
    ...(effectivePrestressGiven ? effectivePrestressIssues(file.girder) : []),
  ];
}

function girderIssues(girder: Girder, polygons: readonly PolygonMm[]): CalcFileIssue[] {
  const issues: CalcFileIssue[] = [];
  if (girder.strandRows.length === 0 && girder.bars.length === 0) {
    issues.push({ path: 'girder.strandRows', message: 'the girder needs at least one strand row or bar' });
  }
  issues.push(...duplicateIds(girder.strandRows, 'girder.strandRows'), ...duplicateIds(girder.bars, 'girder.bars'));
  girder.strandRows.forEach((row, index) => {
    const path = `girder.strandRows[${index}]`;
    if (row.fpyMpa >= row.fpuMpa) issues.push({ path: `${path}.fpyMpa`, message: `must be less than fpuMpa (${row.fpuMpa})` });
    if (row.fpeMpa !== undefined && row.fpeMpa >= row.fpyMpa) issues.push({ path: `${path}.fpeMpa`, message: `must be less than fpyMpa (${row.fpyMpa})` });
    if (!row.bonded && row.unbondedLengthMm === undefined) issues.push({ path: `${path}.unbondedLengthMm`, message: 'required for an unbonded row' });
    if (row.xMm !== undefined && row.xMm.length !== row.count) {
      issues.push({ path: `${path}.xMm`, message: `has ${row.xMm.length} positions for ${row.count} strands` });
    }
    issues.push(...steelPositionIssues(polygons, row.yMm, row.xMm, path));
  });
  girder.bars.forEach((bar, index) => issues.push(...steelPositionIssues(polygons, bar.yMm, undefined, `girder.bars[${index}]`)));
  if (girder.deck !== undefined && flatTopWidthMm(girder.section) === null) {
    issues.push({ path: 'girder.deck', message: `a "${girder.section.shape}" section has no flat top for a deck to sit on` });
  }
  return issues;
}

function duplicateIds(items: readonly { id: string }[], path: string): CalcFileIssue[] {
  return items.flatMap((item, index) =>
    items.findIndex((other) => other.id === item.id) === index ? [] : [{ path: `${path}[${index}].id`, message: `id "${item.id}" is used twice` }],
  );
}

const inMaterial = (polygons: readonly PolygonMm[], point: PointMm) => polygons.some((polygon) => polygonContainsPointMm(polygon, point));

/** Steel must sit in concrete: each named strand position, or at least the row's height. */
function steelPositionIssues(polygons: readonly PolygonMm[], yMm: number, xMm: readonly number[] | undefined, path: string): CalcFileIssue[] {
  if (xMm === undefined) {
    const width = polygons.reduce((sum, polygon) => sum + widthAtMm(polygon, yMm), 0);
    return width > 0 ? [] : [{ path: `${path}.yMm`, message: `${yMm} mm is not inside the girder section` }];
  }
  return xMm.flatMap((x, index) => (inMaterial(polygons, [x, yMm]) ? [] : [{ path: `${path}.xMm[${index}]`, message: `(${x}, ${yMm}) mm is not inside the girder section` }]));
}

/** The spalled region of a concrete-loss entry, as a polygon in section coordinates. */
export function concreteLossPolygon(entry: Extract<DamageEntry, { kind: 'concrete-loss' }>): PolygonMm | null {
  if (entry.polygonMm) return polygonMm(entry.polygonMm.map(([x, y]) => [x, y] as const));
  if (entry.bottomFlange) {
    const half = entry.bottomFlange.widthMm / 2;
    const depth = entry.bottomFlange.depthMm;
    return polygonMm([[-half, 0], [half, 0], [half, depth], [-half, depth]]);
  }
  return null;
}

function concreteDamageIssues(file: { girder: Girder; damage: readonly DamageEntry[] }, polygons: readonly PolygonMm[]): CalcFileIssue[] {
  const issues: CalcFileIssue[] = [];
  let deckLossMm = 0;
  file.damage.forEach((entry, index) => {
    const path = `damage[${index}]`;
    if (entry.fromM !== undefined && entry.toM !== undefined && entry.fromM > entry.toM) {
      issues.push({ path: `${path}.toM`, message: `must not be less than fromM (${entry.fromM})` });
    }
    if (entry.kind === 'deck-loss') {
      deckLossMm += entry.thicknessMm;
      if (file.girder.deck === undefined) issues.push({ path: `${path}.thicknessMm`, message: 'deck loss on a girder without a deck' });
      else if (deckLossMm >= file.girder.deck.thicknessMm) {
        issues.push({ path: `${path}.thicknessMm`, message: `deck loss adds up to ${deckLossMm} mm of a ${file.girder.deck.thicknessMm} mm deck` });
      }
    }
    if (entry.kind === 'concrete-loss') issues.push(...concreteLossIssues(entry, polygons, path));
  });
  return issues;
}

/**
 * A spall must lie within the girder: every corner in the concrete and, at every corner's
 * height, no wider than the section there (which catches a region that bridges a void).
 */
function concreteLossIssues(entry: Extract<DamageEntry, { kind: 'concrete-loss' }>, polygons: readonly PolygonMm[], path: string): CalcFileIssue[] {
  if ((entry.polygonMm === undefined) === (entry.bottomFlange === undefined)) {
    return [{ path, message: 'give either "polygonMm" or "bottomFlange", not both or neither' }];
  }
  const loss = concreteLossPolygon(entry)!;
  const where = entry.polygonMm ? `${path}.polygonMm` : `${path}.bottomFlange`;
  const outside = loss.outer.findIndex((point) => !inMaterial(polygons, point));
  if (outside >= 0) {
    const [x, y] = loss.outer[outside]!;
    return [{ path: where, message: `corner (${x}, ${y}) mm lies outside the girder concrete` }];
  }
  for (const [, y] of loss.outer) {
    const sectionWidth = polygons.reduce((sum, polygon) => sum + widthAtMm(polygon, y), 0);
    if (widthAtMm(loss, y) > sectionWidth + 1e-6) return [{ path: where, message: `wider than the girder at y = ${y} mm` }];
  }
  return [];
}

function optionIssues(file: { girder: Girder; options: CapacityOptions }): CalcFileIssue[] {
  const { girder, options } = file;
  const issues: CalcFileIssue[] = [];
  const concretes = [
    { path: 'girder.concrete', concrete: girder.concrete },
    ...(girder.deck ? [{ path: 'girder.deck', concrete: girder.deck }] : []),
  ];
  const wantsCube = options.method === 'is1343' || options.concreteModel === 'is1343';
  for (const { path, concrete } of concretes) {
    if (wantsCube && concrete.basis !== 'cube') {
      issues.push({ path: `${path}.basis`, message: 'the IS 1343 method and concrete curve take a cube strength (fck); convert by the owner\'s policy' });
    }
    if (!wantsCube && concrete.basis !== 'cylinder') {
      issues.push({ path: `${path}.basis`, message: `the ${options.concreteModel} concrete model takes a cylinder strength (f'c); convert by the owner's policy` });
    }
    if (concrete.elasticModulusMpa === undefined && options.elasticModulusFormula !== undefined && ELASTIC_MODULUS_BASIS[options.elasticModulusFormula] !== concrete.basis) {
      issues.push({ path: 'options.elasticModulusFormula', message: `${options.elasticModulusFormula} takes a ${ELASTIC_MODULUS_BASIS[options.elasticModulusFormula]} strength, but ${path} gives a ${concrete.basis} strength` });
    }
  }
  if (options.method === 'is1343' && options.strandCurve === 'pci') {
    issues.push({ path: 'options.strandCurve', message: 'the IS 1343 method does not use the PCI strand curves' });
  }
  if (options.haunchInSection && girder.deck === undefined) issues.push({ path: 'options.haunchInSection', message: 'there is no deck, so no haunch' });
  if (options.strandCurve === 'pci') issues.push(...pciCurveIssues(girder));
  return issues;
}

/** A section check starts from the effective prestress; only `rate` can compute it from losses. */
function effectivePrestressIssues(girder: Girder): CalcFileIssue[] {
  return girder.strandRows.flatMap((row, index) =>
    row.fpeMpa === undefined ? [{ path: `girder.strandRows[${index}].fpeMpa`, message: 'required for a capacity calculation' }] : [],
  );
}

function pciCurveIssues(girder: Girder): CalcFileIssue[] {
  return girder.strandRows.flatMap((row, index) => {
    try {
      pciStrandCurveFor(row.fpuMpa, row.epsMpa, `girder.strandRows[${index}]`);
      return [];
    } catch (error) {
      if (error instanceof EngineInputError) return [{ path: error.path, message: error.problem }];
      throw error;
    }
  });
}

