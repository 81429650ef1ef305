import { polygonMm, type PolygonMm } from '../geometry';
import { rectangleRing } from './polygons';
import { transformedSectionProperties, type SectionProperties, type WeightedPolygons } from './properties';

/** One material region of a composite section, for strength integration region by region. */
export interface CompositeRegion {
  readonly region: 'girder' | 'haunch' | 'deck';
  readonly polygons: readonly PolygonMm[];
}

export interface CompositeSectionOptions {
  readonly girderPolygons: readonly PolygonMm[];
  /** Height of the girder's flat top above its soffit. */
  readonly girderTopYMm: number;
  /** Width of that flat top (`flatTopWidthMm`); null when the girder has none. */
  readonly topWidthMm: number | null;
  /** Effective width and structural thickness of the deck slab, and the haunch height under it. */
  readonly deck: { readonly widthMm: number; readonly thicknessMm: number; readonly haunchMm: number };
  /** Ec,deck / Ec,girder. */
  readonly nDeckToGirder: number;
  /** Whether the haunch counts in the section properties (policy; default in the product: not). */
  readonly haunchInSection: boolean;
}

export interface CompositeSection {
  /** Girder, then haunch (when haunchMm > 0), then deck; y = 0 at the girder soffit. */
  readonly regions: readonly CompositeRegion[];
  /** Transformed to girder concrete: the deck, and the haunch when it counts, weighted by nDeckToGirder. */
  readonly properties: SectionProperties;
}

/**
 * The composite section of engineering reference §2: a haunch of the girder's top width on its
 * flat top and the deck slab above it, both centred on x = 0, and the elastic properties of the
 * transformed section (the transformed-section method of elastic beam theory, the deck's
 * area weighted by n = Ec,deck/Ec,girder). The haunch is always returned as a region (it is dead load);
 * it counts in the properties only when haunchInSection, and the deck sits on it either way.
 * Throws a RangeError for a girder without a flat top or a non-positive dimension or ratio.
 */
export function buildCompositeSection(options: CompositeSectionOptions): CompositeSection {
  const { girderPolygons, girderTopYMm, topWidthMm, deck, nDeckToGirder, haunchInSection } = options;
  if (topWidthMm === null) throw new RangeError('a deck needs a girder with a flat top');
  checkPositive({ topWidthMm, deckWidthMm: deck.widthMm, deckThicknessMm: deck.thicknessMm, nDeckToGirder });
  if (!(deck.haunchMm >= 0)) throw new RangeError(`deck.haunchMm must be >= 0, not ${deck.haunchMm}`);

  const deckBottomYMm = girderTopYMm + deck.haunchMm;
  const deckPolygons = [polygonMm(rectangleRing(deck.widthMm, deckBottomYMm, deckBottomYMm + deck.thicknessMm))];
  const haunchPolygons = deck.haunchMm > 0 ? [polygonMm(rectangleRing(topWidthMm, girderTopYMm, deckBottomYMm))] : [];

  const regions: CompositeRegion[] = [
    { region: 'girder', polygons: girderPolygons },
    ...(haunchPolygons.length > 0 ? [{ region: 'haunch' as const, polygons: haunchPolygons }] : []),
    { region: 'deck', polygons: deckPolygons },
  ];
  const parts: WeightedPolygons[] = [
    { polygons: girderPolygons, modularRatio: 1 },
    ...(haunchInSection ? [{ polygons: haunchPolygons, modularRatio: nDeckToGirder }] : []),
    { polygons: deckPolygons, modularRatio: nDeckToGirder },
  ];
  return { regions, properties: transformedSectionProperties(parts) };
}

function checkPositive(values: Record<string, number>): void {
  for (const [name, value] of Object.entries(values)) {
    if (!(value > 0)) throw new RangeError(`${name} must be > 0, not ${value}`);
  }
}
