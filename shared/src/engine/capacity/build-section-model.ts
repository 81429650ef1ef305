import { polygonContainsPointMm, widthAtMm, type PolygonMm } from '../geometry';
import { ELASTIC_MODULUS_BASIS, elasticModulusMpa, type ElasticModulusFormula } from '../materials';
import { buildCompositeSection, flatTopWidthMm, sectionDepthMm, shapeToPolygons, transformedSectionProperties, type SectionShape } from '../section';
import { concreteLossPolygon } from '../calc-file/capacity-file';
import type { CapacityOptions, DamageEntry, Girder, StrandRow } from '../calc-file/girder';
import { applyStrandDamage, type StrandState } from '../calc-file/strand-damage';
import type { DevelopingPart } from './development';
import type { CompressionFlange, ConcreteMaterial, ConcreteRegion, SectionModel, StrandLayer } from './section-model';

/** What the model builder needs of a calculation file (the capacity file, or a rate file at one station). */
export interface SectionModelInput {
  readonly girder: Girder;
  readonly damage: readonly DamageEntry[];
  readonly options: Pick<CapacityOptions, 'haunchInSection' | 'elasticModulusFormula'>;
  /** Along the span: each strand's development at this station; omitted for a section check. */
  readonly development?: StrandDevelopment;
}

const DEFAULT_FORMULA: Record<'cylinder' | 'cube', ElasticModulusFormula> = { cylinder: 'aashto-8', cube: 'is-456' };

/** Ec as given, else by the chosen formula for the strength's basis (engineering.md §2). */
function concreteMaterial(
  concrete: { strengthMpa: number; basis: 'cylinder' | 'cube'; unitWeightKnM3?: number; elasticModulusMpa?: number },
  formula: ElasticModulusFormula | undefined,
  fallbackUnitWeightKnM3: number,
): ConcreteMaterial {
  const chosen = formula ?? DEFAULT_FORMULA[concrete.basis];
  if (ELASTIC_MODULUS_BASIS[chosen] !== concrete.basis && concrete.elasticModulusMpa === undefined) {
    throw new RangeError(`${chosen} takes a ${ELASTIC_MODULUS_BASIS[chosen]} strength`);
  }
  const elasticModulus =
    concrete.elasticModulusMpa ??
    elasticModulusMpa(chosen, { fcMpa: concrete.strengthMpa, unitWeightKnM3: concrete.unitWeightKnM3 ?? fallbackUnitWeightKnM3 });
  return { strengthMpa: concrete.strengthMpa, basis: concrete.basis, elasticModulusMpa: elasticModulus };
}

function totalDeckLossMm(damage: readonly DamageEntry[]): number {
  return damage.reduce((sum, entry) => (entry.kind === 'deck-loss' ? sum + entry.thicknessMm : sum), 0);
}

function concreteLossPolygons(damage: readonly DamageEntry[]): { polygon: PolygonMm; damageIndex: number }[] {
  return damage.flatMap((entry, damageIndex) => (entry.kind === 'concrete-loss' ? [{ polygon: concreteLossPolygon(entry)!, damageIndex }] : []));
}

/**
 * Strands inside spalled concrete have lost their bond there, which a spall entry alone does
 * not say: the inspector records them as exposed or lost strands. Rows without strand
 * positions are flagged when the spall reaches their height at all.
 */
function strandsInSpallWarnings(rows: readonly StrandRow[], losses: readonly { polygon: PolygonMm; damageIndex: number }[]): string[] {
  return losses.flatMap(({ polygon, damageIndex }) =>
    rows.flatMap((row) => {
      const reached = row.xMm ? row.xMm.some((x) => polygonContainsPointMm(polygon, [x, row.yMm])) : widthAtMm(polygon, row.yMm) > 0;
      return reached
        ? [`strand row "${row.id}" lies in the spalled concrete of damage[${damageIndex}]: record its strands there as exposed-strands or lost-strands entries`]
        : [];
    }),
  );
}

/**
 * Where a strand stands at the section along the span (`rate`): how far it is from where its
 * bond begins and from an exposed zone, or null where it is fully developed.
 */
export type StrandDevelopment = (rowIndex: number, strandIndex: number) => Omit<DevelopingPart, 'areaMm2'> | null;

const SECTION_EXPOSED: Omit<DevelopingPart, 'areaMm2'> = { bondDistanceMm: Number.POSITIVE_INFINITY, exposedDistanceMm: 0, kappa: 1 };

/** Strands with the same development share one part, so a row has few parts however many strands. */
function addDevelopingPart(parts: DevelopingPart[], development: Omit<DevelopingPart, 'areaMm2'>, areaMm2: number): void {
  for (let i = 0; i < parts.length; i++) {
    const part = parts[i]!;
    if (part.bondDistanceMm === development.bondDistanceMm && part.exposedDistanceMm === development.exposedDistanceMm && part.kappa === development.kappa) {
      parts[i] = { ...part, areaMm2: part.areaMm2 + areaMm2 };
      return;
    }
  }
  parts.push({ ...development, areaMm2 });
}

function mergedDevelopment(exposedHere: boolean, alongSpan: Omit<DevelopingPart, 'areaMm2'> | null): Omit<DevelopingPart, 'areaMm2'> | null {
  if (!exposedHere) return alongSpan;
  return alongSpan ? { ...alongSpan, exposedDistanceMm: 0 } : SECTION_EXPOSED;
}

/** The strands that remain of one row, as one layer: lost strands out, section loss off their area. */
function strandLayer(row: StrandRow, index: number, states: readonly StrandState[], topYMm: number, development: StrandDevelopment | undefined): StrandLayer {
  // Counted in strands, then multiplied once, so that ten whole strands are exactly ten.
  let effectiveStrands = 0;
  let exposedStrands = 0;
  const developingParts: DevelopingPart[] = [];
  states.forEach((state, strandIndex) => {
    if (state.lost) return;
    effectiveStrands += state.areaFactor;
    if (state.exposed) exposedStrands += state.areaFactor;
    const limit = mergedDevelopment(state.exposed, development?.(index, strandIndex) ?? null);
    if (limit) addDevelopingPart(developingParts, limit, state.areaFactor * row.strandAreaMm2);
  });
  return {
    rowId: row.id,
    path: `girder.strandRows[${index}]`,
    yMm: row.yMm,
    dpMm: topYMm - row.yMm,
    strandAreaMm2: row.strandAreaMm2,
    strandDiameterMm: row.strandDiameterMm,
    originalCount: row.count,
    effectiveStrands,
    areaMm2: effectiveStrands * row.strandAreaMm2,
    exposedAreaMm2: exposedStrands * row.strandAreaMm2,
    developingParts,
    material: { epsMpa: row.epsMpa, fpuMpa: row.fpuMpa, fpyMpa: row.fpyMpa },
    fpeMpa: row.fpeMpa ?? 0,
    bonded: row.bonded,
    unbondedLengthMm: row.bonded ? null : (row.unbondedLengthMm ?? null),
  };
}

/**
 * The girder's own top flange as the AASHTO and IS hand methods see it: width b, thickness hf
 * and the width bw below it. A rectangle is its own flange (never flanged behaviour); a custom
 * polygon, or a profile whose top is not level, has none a hand method could use.
 */
function girderFlange(shape: SectionShape): Omit<CompressionFlange, 'concrete' | 'source'> | null {
  switch (shape.shape) {
    case 'rectangle':
      return { widthMm: shape.widthMm, thicknessMm: shape.depthMm, webWidthMm: shape.widthMm };
    case 'tee':
      return { widthMm: shape.flangeWidthMm, thicknessMm: shape.flangeThicknessMm, webWidthMm: shape.webWidthMm };
    case 'i-girder':
      return { widthMm: shape.topFlangeWidthMm, thicknessMm: shape.topFlangeThicknessMm, webWidthMm: shape.webWidthMm };
    case 'double-tee':
      // bw: both stems at their mean width, 2 × (top + bottom)/2.
      return { widthMm: shape.flangeWidthMm, thicknessMm: shape.flangeThicknessMm, webWidthMm: shape.stemTopWidthMm + shape.stemBottomWidthMm };
    case 'box':
      return { widthMm: shape.widthMm, thicknessMm: shape.depthMm - shape.voidBottomMm - shape.voidDepthMm, webWidthMm: shape.widthMm - shape.voidWidthMm };
    case 'voided-slab':
      return {
        widthMm: shape.widthMm,
        thicknessMm: shape.depthMm - shape.voidCentreYMm - shape.voidDiameterMm / 2,
        webWidthMm: shape.widthMm - shape.voidCount * shape.voidDiameterMm,
      };
    case 'profile':
      return profileFlange(shape.widthsMm);
    case 'polygon':
      return null;
  }
}

/** A profile's flange: the level top part where the width stays at the top width; bw the narrowest width. */
function profileFlange(widthsMm: readonly (readonly [number, number])[]): Omit<CompressionFlange, 'concrete' | 'source'> | null {
  const [topY, topWidth] = widthsMm[widthsMm.length - 1]!;
  let flangeBottomY = topY;
  for (let i = widthsMm.length - 2; i >= 0 && widthsMm[i]![1] === topWidth; i--) flangeBottomY = widthsMm[i]![0];
  if (flangeBottomY === topY || topWidth <= 0) return null;
  return { widthMm: topWidth, thicknessMm: topY - flangeBottomY, webWidthMm: Math.min(...widthsMm.map(([, width]) => width)) };
}

/** The concrete of a section with its damage: everything of a SectionModel but the steel. */
export type SectionGeometry = Omit<SectionModel, 'strands' | 'bars' | 'warnings'> & { readonly concreteLosses: ReturnType<typeof concreteLossPolygons> };

/**
 * The concrete part of the strength model (engineering.md §2, §5): girder polygons less spalled
 * concrete, the haunch and deck on the flat top (deck loss off its top), and the elastic
 * properties of the damaged girder and composite sections. Strand damage is not read here.
 */
export function buildSectionGeometry(input: Omit<SectionModelInput, 'development'>): SectionGeometry {
  const { girder, damage, options } = input;
  const girderPolygons = shapeToPolygons(girder.section);
  const girderTopYMm = sectionDepthMm(girder.section);
  const girderConcrete = concreteMaterial(girder.concrete, options.elasticModulusFormula, girder.concrete.unitWeightKnM3);
  const concreteLosses = concreteLossPolygons(damage);
  const lossPolygons = concreteLosses.map((loss) => loss.polygon);
  const netGirderParts = [
    { polygons: girderPolygons, modularRatio: 1 },
    ...(lossPolygons.length > 0 ? [{ polygons: lossPolygons, modularRatio: -1 }] : []),
  ];
  const regions: ConcreteRegion[] = [
    { region: 'girder', polygons: girderPolygons, concrete: girderConcrete, sign: 1 },
    ...(lossPolygons.length > 0 ? [{ region: 'concrete-loss' as const, polygons: lossPolygons, concrete: girderConcrete, sign: -1 as const }] : []),
  ];
  const girderSection = transformedSectionProperties(netGirderParts);

  let topYMm = girderTopYMm;
  let deckConcrete: ConcreteMaterial | null = null;
  let compositeSection = null;
  let compressionFlange: CompressionFlange | null = null;
  if (girder.deck) {
    deckConcrete = concreteMaterial(girder.deck, options.elasticModulusFormula, girder.concrete.unitWeightKnM3);
    const deckThicknessMm = girder.deck.thicknessMm - totalDeckLossMm(damage);
    const topWidthMm = flatTopWidthMm(girder.section);
    const nDeckToGirder = deckConcrete.elasticModulusMpa / girderConcrete.elasticModulusMpa;
    const composite = buildCompositeSection({
      girderPolygons,
      girderTopYMm,
      topWidthMm,
      deck: { widthMm: girder.deck.widthMm, thicknessMm: deckThicknessMm, haunchMm: girder.deck.haunchMm },
      nDeckToGirder,
      haunchInSection: options.haunchInSection,
    });
    for (const region of composite.regions) {
      if (region.region === 'girder' || (region.region === 'haunch' && !options.haunchInSection)) continue;
      regions.push({ region: region.region, polygons: region.polygons, concrete: deckConcrete, sign: 1 });
    }
    const deckAndHaunch = composite.regions
      .filter((region) => region.region === 'deck' || (region.region === 'haunch' && options.haunchInSection))
      .map((region) => ({ polygons: region.polygons, modularRatio: nDeckToGirder }));
    compositeSection = transformedSectionProperties([...netGirderParts, ...deckAndHaunch]);
    topYMm = girderTopYMm + girder.deck.haunchMm + deckThicknessMm;
    compressionFlange = { source: 'deck', widthMm: girder.deck.widthMm, thicknessMm: deckThicknessMm, webWidthMm: topWidthMm ?? 0, concrete: deckConcrete };
  } else {
    const flange = girderFlange(girder.section);
    compressionFlange = flange && { source: 'girder', ...flange, concrete: girderConcrete };
  }
  return { topYMm, girderTopYMm, regions, girderConcrete, deckConcrete, girderSection, compositeSection, compressionFlange, tensioning: girder.tensioning, concreteLosses };
}

/**
 * Adds the steel to a section's concrete: each strand row as the strands that remain in the
 * given states (lost strands out, section loss off their area, exposed ones limited), at the
 * row's height, and the bars. Along the span, `development` says how far each strand is from
 * where its bond begins.
 */
export function withSteel(
  geometry: SectionGeometry,
  girder: Pick<Girder, 'strandRows' | 'bars'>,
  states: ReadonlyMap<string, readonly StrandState[]>,
  development?: StrandDevelopment,
): SectionModel {
  const { topYMm, concreteLosses, ...concrete } = geometry;
  const strands = girder.strandRows.map((row, index) => strandLayer(row, index, states.get(row.id)!, topYMm, development));
  const bars = girder.bars.map((bar, index) => ({
    barId: bar.id,
    path: `girder.bars[${index}]`,
    yMm: bar.yMm,
    dMm: topYMm - bar.yMm,
    areaMm2: bar.areaMm2,
    fyMpa: bar.fyMpa,
    esMpa: bar.esMpa,
  }));
  const warnings = strandsInSpallWarnings(girder.strandRows, concreteLosses);
  return { ...concrete, topYMm, strands, bars, warnings };
}

/**
 * Builds the strength model of one girder section with its damage applied (engineering.md §2,
 * §4, §5): the damaged concrete (`buildSectionGeometry`) and the strands that the damage leaves.
 * Expects a checked file.
 */
export function buildSectionModel(input: SectionModelInput): SectionModel {
  const { states } = applyStrandDamage(input.girder.strandRows, input.damage);
  return withSteel(buildSectionGeometry(input), input.girder, states, input.development);
}
