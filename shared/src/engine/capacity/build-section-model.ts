import { polygonContainsPointMm, widthAtMm, type PolygonMm } from '../geometry';
import { ELASTIC_MODULUS_BASIS, elasticModulusMpa, type ElasticModulusFormula } from '../materials';
import { buildCompositeSection, flatTopWidthMm, sectionDepthMm, shapeToPolygons, transformedSectionProperties, type SectionShape } from '../section';
import { concreteLossPolygon } from '../calc-file/capacity-file';
import type { CapacityOptions, DamageEntry, Girder, StrandRow } from '../calc-file/girder';
import { applyStrandDamage, type StrandState } from '../calc-file/strand-damage';
import type { CompressionFlange, ConcreteMaterial, ConcreteRegion, SectionModel, StrandLayer } from './section-model';

/** What the model builder needs of a calculation file (the capacity file, or a rate file at one station). */
export interface SectionModelInput {
  readonly girder: Girder;
  readonly damage: readonly DamageEntry[];
  readonly options: Pick<CapacityOptions, 'haunchInSection' | 'elasticModulusFormula'>;
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

/** The strands that remain of one row, as one layer: lost strands out, section loss off their area. */
function strandLayer(row: StrandRow, index: number, states: readonly StrandState[], topYMm: number): StrandLayer {
  // Counted in strands, then multiplied once, so that ten whole strands are exactly ten.
  let effectiveStrands = 0;
  let exposedStrands = 0;
  for (const state of states) {
    if (state.lost) continue;
    effectiveStrands += state.areaFactor;
    if (state.exposed) exposedStrands += state.areaFactor;
  }
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

/**
 * Builds the strength model of one girder section with its damage applied (engineering.md §2,
 * §4, §5): girder polygons less spalled concrete, the haunch and deck on the flat top (deck
 * loss off its top), strand rows net of lost strands and section loss, and the elastic
 * properties of the damaged girder and composite sections. Expects a checked file.
 */
export function buildSectionModel(input: SectionModelInput): SectionModel {
  const { girder, damage, options } = input;
  const girderPolygons = shapeToPolygons(girder.section);
  const girderTopYMm = sectionDepthMm(girder.section);
  const girderConcrete = concreteMaterial(girder.concrete, options.elasticModulusFormula, girder.concrete.unitWeightKnM3);
  const losses = concreteLossPolygons(damage);
  const lossPolygons = losses.map((loss) => loss.polygon);
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

  const { states } = applyStrandDamage(girder.strandRows, damage);
  const strands = girder.strandRows.map((row, index) => strandLayer(row, index, states.get(row.id)!, topYMm));
  const bars = girder.bars.map((bar, index) => ({
    barId: bar.id,
    path: `girder.bars[${index}]`,
    yMm: bar.yMm,
    dMm: topYMm - bar.yMm,
    areaMm2: bar.areaMm2,
    fyMpa: bar.fyMpa,
    esMpa: bar.esMpa,
  }));
  const warnings = strandsInSpallWarnings(girder.strandRows, losses);
  return { topYMm, girderTopYMm, regions, strands, bars, girderConcrete, deckConcrete, girderSection, compositeSection, compressionFlange, tensioning: girder.tensioning, warnings };
}
