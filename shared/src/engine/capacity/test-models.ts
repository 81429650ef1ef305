import type { PolygonMm } from '../geometry';
import type { StrengthBasis } from '../materials';
import { buildCompositeSection, flatTopWidthMm, sectionDepthMm, sectionProperties, shapeToPolygons } from '../section';
import type { RectangleSection, PolygonSection, TeeSection } from '../section';
import type { BarLayer, CompressionFlange, ConcreteMaterial, ConcreteRegion, SectionModel, StrandLayer } from './section-model';

/**
 * Hand-built section models for the capacity tests: a rectangle, a tee or a custom polygon,
 * optionally under a deck (no haunch), with undamaged strand rows and bars. Not part of the
 * public API; the calculation file's own builder is `buildSectionModel`.
 */

/** One 12.7 mm seven-wire strand's nominal area (ASTM A416 [R]). */
export const STRAND_AREA_MM2 = 98.7;

/** A concrete of the given strength and basis with Ec = 4700 √f'c (ACI 318 [R]; the modulus does not enter the hand methods). */
export function testConcrete(strengthMpa: number, basis: StrengthBasis = 'cylinder'): ConcreteMaterial {
  return { strengthMpa, basis, elasticModulusMpa: 4700 * Math.sqrt(strengthMpa) };
}

export interface TestStrandRow {
  readonly yMm: number;
  readonly count: number;
  /** Default {@link STRAND_AREA_MM2}. */
  readonly strandAreaMm2?: number;
  /** Default 1860 MPa, Grade 270 strand (ASTM A416 [R]). */
  readonly fpuMpa?: number;
  /** Default 0.9 fpu, low-relaxation strand (ASTM A416 [R]). */
  readonly fpyMpa?: number;
  /** Default 1100 MPa, engineering.md §8 row C13's effective prestress. */
  readonly fpeMpa?: number;
  readonly bonded?: boolean;
  readonly unbondedLengthMm?: number;
  /** Strands of the row whose bond is lost at the section. */
  readonly exposedCount?: number;
}

export interface TestBar {
  readonly yMm: number;
  readonly areaMm2: number;
  /** Default 420 MPa (Grade 60 bar, ASTM A615 [R]). */
  readonly fyMpa?: number;
}

export interface TestDeck {
  readonly widthMm: number;
  readonly thicknessMm: number;
  readonly concrete: ConcreteMaterial;
}

export interface TestModelSpec {
  readonly section: RectangleSection | TeeSection | PolygonSection;
  readonly concrete: ConcreteMaterial;
  readonly strandRows: readonly TestStrandRow[];
  readonly bars?: readonly TestBar[];
  readonly deck?: TestDeck;
  readonly tensioning?: 'pre' | 'post';
}

/** A SectionModel as the builder would give for an undamaged girder of the spec. */
export function testSectionModel(spec: TestModelSpec): SectionModel {
  const girderPolygons = shapeToPolygons(spec.section);
  const girderTopYMm = sectionDepthMm(spec.section);
  const topYMm = girderTopYMm + (spec.deck?.thicknessMm ?? 0);
  const composite = spec.deck ? compositeSection(spec.deck, spec.concrete, girderPolygons, spec.section, girderTopYMm) : null;
  const girderRegion: ConcreteRegion = { region: 'girder', polygons: girderPolygons, concrete: spec.concrete, sign: 1 };
  const deckPolygons = composite?.regions.find((region) => region.region === 'deck')?.polygons;
  const deckRegions: ConcreteRegion[] =
    spec.deck && deckPolygons ? [{ region: 'deck', polygons: deckPolygons, concrete: spec.deck.concrete, sign: 1 }] : [];
  return {
    topYMm,
    girderTopYMm,
    regions: [girderRegion, ...deckRegions],
    strands: spec.strandRows.map((row, index) => strandLayer(row, index, topYMm)),
    bars: (spec.bars ?? []).map((bar, index) => barLayer(bar, index, topYMm)),
    girderConcrete: spec.concrete,
    deckConcrete: spec.deck?.concrete ?? null,
    girderSection: sectionProperties(girderPolygons),
    compositeSection: composite?.properties ?? null,
    compressionFlange: compressionFlange(spec),
    tensioning: spec.tensioning ?? 'pre',
    warnings: [],
  };
}

function compositeSection(
  deck: TestDeck,
  girderConcrete: ConcreteMaterial,
  girderPolygons: readonly PolygonMm[],
  section: TestModelSpec['section'],
  girderTopYMm: number,
) {
  return buildCompositeSection({
    girderPolygons,
    girderTopYMm,
    topWidthMm: flatTopWidthMm(section),
    deck: { widthMm: deck.widthMm, thicknessMm: deck.thicknessMm, haunchMm: 0 },
    nDeckToGirder: deck.concrete.elasticModulusMpa / girderConcrete.elasticModulusMpa,
    haunchInSection: false,
  });
}

/** The deck over the girder's top; a tee's own flange; a rectangle as a flange as deep as the section; none for a polygon. */
function compressionFlange(spec: TestModelSpec): CompressionFlange | null {
  const { section, deck } = spec;
  if (deck) {
    return {
      source: 'deck',
      widthMm: deck.widthMm,
      thicknessMm: deck.thicknessMm,
      webWidthMm: flatTopWidthMm(section)!,
      concrete: deck.concrete,
    };
  }
  switch (section.shape) {
    case 'rectangle':
      return {
        source: 'girder',
        widthMm: section.widthMm,
        thicknessMm: section.depthMm,
        webWidthMm: section.widthMm,
        concrete: spec.concrete,
      };
    case 'tee':
      return {
        source: 'girder',
        widthMm: section.flangeWidthMm,
        thicknessMm: section.flangeThicknessMm,
        webWidthMm: section.webWidthMm,
        concrete: spec.concrete,
      };
    case 'polygon':
      return null;
  }
}

function strandLayer(row: TestStrandRow, index: number, topYMm: number): StrandLayer {
  const fpuMpa = row.fpuMpa ?? 1860;
  const strandAreaMm2 = row.strandAreaMm2 ?? STRAND_AREA_MM2;
  const bonded = row.bonded ?? true;
  return {
    rowId: `r${index + 1}`,
    path: `girder.strandRows[${index}]`,
    yMm: row.yMm,
    dpMm: topYMm - row.yMm,
    strandAreaMm2,
    strandDiameterMm: 12.7,
    originalCount: row.count,
    effectiveStrands: row.count,
    areaMm2: row.count * strandAreaMm2,
    exposedAreaMm2: (row.exposedCount ?? 0) * strandAreaMm2,
    developingParts: row.exposedCount
      ? [{ areaMm2: row.exposedCount * strandAreaMm2, bondDistanceMm: Number.POSITIVE_INFINITY, exposedDistanceMm: 0, kappa: 1 }]
      : [],
    material: { epsMpa: 196_500, fpuMpa, fpyMpa: row.fpyMpa ?? 0.9 * fpuMpa },
    fpeMpa: row.fpeMpa ?? 1100,
    bonded,
    unbondedLengthMm: bonded ? null : (row.unbondedLengthMm ?? null),
  };
}

function barLayer(bar: TestBar, index: number, topYMm: number): BarLayer {
  return {
    barId: `b${index + 1}`,
    path: `girder.bars[${index}]`,
    yMm: bar.yMm,
    dMm: topYMm - bar.yMm,
    areaMm2: bar.areaMm2,
    fyMpa: bar.fyMpa ?? 420,
    esMpa: 200_000,
  };
}
