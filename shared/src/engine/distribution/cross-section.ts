import { EngineInputError } from '../materials';
import type { SectionShape } from '../section';
import { DISTRIBUTION_METHOD_PATH } from './formulas';

/**
 * Cross-section types of AASHTO LRFD Table 4.6.2.2.1-1 [R] the product recognises: k precast I
 * or bulb-tee beams under a cast-in-place deck; i double-tees made to act as a unit (here by a
 * cast-in-place deck); b closed precast boxes under a cast-in-place deck, spread apart; f and g
 * adjacent boxes or slabs with shear keys, f with a cast-in-place deck (overlay), g without.
 */
export type CrossSectionType = 'k' | 'i' | 'b' | 'f' | 'g';

/** The row of Tables 4.6.2.2.2b-1, d-1 and e-1 a type reads from: types a, e, k (and i, j as a unit) share one row. */
export type TableRow = 'beam-slab' | 'spread-box' | 'adjacent';

export const TABLE_ROW: Readonly<Record<CrossSectionType, TableRow>> = { k: 'beam-slab', i: 'beam-slab', b: 'spread-box', f: 'adjacent', g: 'adjacent' };

/**
 * Widest joint between neighbouring beams for them to count as adjacent (side by side with
 * shear keys) rather than spread (common practice, no source: keyed joints are tens of mm,
 * spread beams are hundreds apart).
 */
export const ADJACENT_GAP_LIMIT_MM = 150;

export interface CrossSectionContext {
  readonly girderSpacingMm: number;
  /** Whether a cast-in-place deck sits on the girders (`girder.deck`). */
  readonly hasDeck: boolean;
}

export interface CrossSectionChoice {
  readonly type: CrossSectionType;
  readonly warnings: readonly string[];
}

const choose = (type: CrossSectionType, ...warnings: string[]): CrossSectionChoice => ({ type, warnings });

function refuse(problem: string): never {
  throw new EngineInputError(DISTRIBUTION_METHOD_PATH, `${problem}; choose "lever" or a user value ({ "method": "user", "moment": … })`);
}

function requireDeck(shape: string, context: CrossSectionContext): void {
  if (!context.hasDeck) refuse(`a ${shape} girder without a cast-in-place deck has no formula here (the table's beam-slab row needs the deck thickness ts)`);
}

/** Beams whose joint is at most ADJACENT_GAP_LIMIT_MM: laid side by side. */
const isAdjacent = (widthMm: number, context: CrossSectionContext): boolean => context.girderSpacingMm - widthMm <= ADJACENT_GAP_LIMIT_MM;

/**
 * The Table 4.6.2.2.1-1 cross-section type of a girder from its calculation-file shape, for the
 * formula method: i-girder, profile (bulb-tee) and tee under a deck → k; double-tee under a deck
 * → i; box → b when spread, f/g when adjacent; voided slab → f/g (adjacent only); rectangle →
 * f/g when adjacent, k under a deck when spread. Refuses shapes the table has no row for.
 */
export function crossSectionTypeOf(section: SectionShape, context: CrossSectionContext): CrossSectionChoice {
  const adjacentType = context.hasDeck ? 'f' : 'g';
  switch (section.shape) {
    case 'i-girder':
    case 'profile':
    case 'tee':
      requireDeck(section.shape, context);
      return choose('k');
    case 'double-tee':
      requireDeck(section.shape, context);
      return choose(
        'i',
        'double-tees are taken as type i acting as a unit through the deck, S the spacing of the units and I, A those of a whole unit — from memory — verify; units joined only against relative vertical displacement need the table\'s S/D row, not implemented: choose "lever" or a user value for them',
      );
    case 'box':
      if (isAdjacent(section.widthMm, context)) return choose(adjacentType);
      return choose('b');
    case 'voided-slab':
      if (!isAdjacent(section.widthMm, context)) refuse(`voided slabs are laid side by side: the joint (girderSpacingMm − widthMm) exceeds ${ADJACENT_GAP_LIMIT_MM} mm`);
      return choose(adjacentType);
    case 'rectangle':
      if (isAdjacent(section.widthMm, context)) return choose(adjacentType);
      requireDeck('spread rectangular', context);
      return choose('k', 'a spread rectangular beam under a cast-in-place deck is taken as type k (beam and slab) — from memory — verify');
    case 'polygon':
      return refuse('a custom polygon section has no cross-section type in AASHTO LRFD Table 4.6.2.2.1-1');
  }
}
