import type { PolygonMm } from '../geometry';
import type { StrengthBasis, StrandMaterial } from '../materials';
import type { SectionProperties } from '../section';
import { EngineInputError } from '../materials/errors';
import { prestressFraction, type DevelopingPart } from './development';

/**
 * The strength model of one girder section with its damage applied: what every flexural
 * method works from. Built once per calculation from the calculation file (`buildSectionModel`);
 * all lengths in mm from the girder soffit (y up), stresses in MPa, areas in mm².
 */

export interface ConcreteMaterial {
  readonly strengthMpa: number;
  readonly basis: StrengthBasis;
  readonly elasticModulusMpa: number;
}

/**
 * A region of concrete that may carry compression. A concrete-loss region has `sign` −1: it is
 * subtracted from the region it lies in, for strength and for elastic properties alike.
 */
export interface ConcreteRegion {
  readonly region: 'girder' | 'haunch' | 'deck' | 'concrete-loss';
  readonly polygons: readonly PolygonMm[];
  readonly concrete: ConcreteMaterial;
  readonly sign: 1 | -1;
}

/** One strand row after damage: the strands that remain, as an area at the row's height. */
export interface StrandLayer {
  readonly rowId: string;
  /** Path of the row in the calculation file, for messages: `girder.strandRows[2]`. */
  readonly path: string;
  readonly yMm: number;
  /** Depth below the top of the (composite) section, after any deck loss. */
  readonly dpMm: number;
  readonly strandAreaMm2: number;
  readonly strandDiameterMm: number;
  readonly originalCount: number;
  /** Strands that remain, section loss counted as a fraction of a strand: effective area ÷ one strand's area. */
  readonly effectiveStrands: number;
  /** Area of the strands that remain, net of lost strands and section loss. */
  readonly areaMm2: number;
  /** Part of `areaMm2` whose bond is lost (exposed strands): its stress is capped at fpe. */
  readonly exposedAreaMm2: number;
  /**
   * Parts of `areaMm2` not fully developed here (exposed strands, strands near a point where bond
   * begins); the rest carries what the strand curve gives. Strain compatibility limits each.
   */
  readonly developingParts: readonly DevelopingPart[];
  readonly material: StrandMaterial;
  readonly fpeMpa: number;
  readonly bonded: boolean;
  /** Length between anchorages of an unbonded tendon, for the AASHTO unbonded stress; null when bonded. */
  readonly unbondedLengthMm: number | null;
}

export interface BarLayer {
  readonly barId: string;
  readonly path: string;
  readonly yMm: number;
  readonly dMm: number;
  readonly areaMm2: number;
  readonly fyMpa: number;
  readonly esMpa: number;
}

/**
 * The top flange the AASHTO approximate and IS methods treat as the compression flange: the
 * deck when there is one, else the girder's own top flange (null for a shape that has none
 * a hand method could recognise, such as a custom polygon).
 */
export interface CompressionFlange {
  readonly source: 'deck' | 'girder';
  /** b: flange width. */
  readonly widthMm: number;
  /** hf: flange thickness. */
  readonly thicknessMm: number;
  /** bw: the width below the flange (web, stems or girder top under a deck). */
  readonly webWidthMm: number;
  readonly concrete: ConcreteMaterial;
}

export interface SectionModel {
  /** Height of the top compression fibre above the soffit: deck top after deck loss, else girder top. */
  readonly topYMm: number;
  readonly girderTopYMm: number;
  readonly regions: readonly ConcreteRegion[];
  readonly strands: readonly StrandLayer[];
  readonly bars: readonly BarLayer[];
  readonly girderConcrete: ConcreteMaterial;
  readonly deckConcrete: ConcreteMaterial | null;
  /** Non-composite girder, net of concrete loss (calc-file `girderSection`). */
  readonly girderSection: SectionProperties;
  /** Composite, deck transformed by nDeckToGirder; null without a deck (calc-file `compositeSection`). */
  readonly compositeSection: SectionProperties | null;
  readonly compressionFlange: CompressionFlange | null;
  readonly tensioning: 'pre' | 'post';
  /** What the builder noticed about the damage, for the result's warnings. */
  readonly warnings: readonly string[];
}

/** Concrete at the top fibre: the deck's when there is one, which sets β1 of the whole block. */
export function topFibreConcrete(model: SectionModel): ConcreteMaterial {
  return model.deckConcrete ?? model.girderConcrete;
}

/** What every capacity method returns (calc-file.md "Output of capacity", less the sections). */
export interface FlexuralStrength {
  readonly method: 'strain-compatibility' | 'aashto-approximate' | 'is1343';
  readonly neutralAxisDepthMm: number;
  /** Depth of the rectangular stress block; null for curved stress models. */
  readonly blockDepthMm: number | null;
  readonly nominalMomentKnm: number;
  readonly phi: number;
  readonly factoredMomentKnm: number;
  readonly extremeTensionStrain: number | null;
  readonly rows: readonly StrandRowResult[];
  /** |ΣT − C| / ΣT at the solution, for methods that solve for equilibrium. */
  readonly relativeForceResidual?: number;
  readonly warnings: readonly string[];
}

export interface StrandRowResult {
  readonly rowId: string;
  readonly yMm: number;
  /** Effective area ÷ one strand's area. */
  readonly effectiveStrands: number;
  readonly totalStrain: number | null;
  readonly stressMpa: number;
}

/**
 * The effective prestress force a layer puts on the concrete here: fpe on every remaining
 * strand, less where a strand is still within its transfer length (engineering.md §5).
 */
export function effectivePrestressForceN(layer: StrandLayer): number {
  let shortfallMm2 = 0;
  for (const part of layer.developingParts) shortfallMm2 += part.areaMm2 * (1 - prestressFraction(part, layer.strandDiameterMm));
  return layer.fpeMpa * (layer.areaMm2 - shortfallMm2);
}

/** The compression flange a hand method needs, or bad input naming the method when the section has none. */
export function requireCompressionFlange(model: SectionModel, methodName: string): CompressionFlange {
  if (model.compressionFlange === null) {
    throw new EngineInputError(
      'options.method',
      `${methodName} needs a rectangular or flanged compression zone (a rectangle, tee, I-girder or a deck); ` +
        'this section has none it can recognise: use strain-compatibility',
    );
  }
  return model.compressionFlange;
}
