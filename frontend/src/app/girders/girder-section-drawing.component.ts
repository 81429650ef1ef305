import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { sectionShapeSchema, type GirderDetail } from '@spanledger/shared';

import { schemaProblems } from '../structures/field-problems';
import { sectionDrawingLayout, type DeckOutline, type PlacedStrand } from './section-drawing-layout';
import type { DrawnStrandRow } from './strand-positions';
import { STRAND_DRAW_STATES, STRAND_DRAW_STATE_NAMES, type StrandDrawState, type StrandRef, type StrandStates } from './strand-states';

/** A strand as the template draws it. */
interface DrawnStrand extends PlacedStrand {
  readonly key: string;
  readonly state: StrandDrawState;
  readonly selected: boolean;
  readonly label: string;
  /** The two strokes that cross out a lost strand. */
  readonly crossPath: string | null;
}

interface LegendEntry {
  readonly key: string;
  readonly label: string;
  readonly state: StrandDrawState;
  readonly selected: boolean;
}

/** Half of the 44 px a finger needs (WCAG 2.5.5 target size). */
const MIN_HIT_RADIUS_PX = 22;
/** A tap-to-select drawing is never scaled past this, whatever the spacing, so strands at one spot cannot blow it up. */
const MAX_PX_PER_MM = 3;
/** The crossing strokes reach a little past the circle. */
const CROSS_REACH = 1.35;

const LEGEND_LABELS: Readonly<Record<StrandDrawState, string>> = {
  intact: 'Intact strand',
  lost: 'Lost strand (crossed out)',
  'section-loss': 'Section loss, corroded (hatched)',
  exposed: 'Exposed strand (outlined)',
};

let drawingCount = 0;

/**
 * A girder's cross-section in SVG, to scale in mm with y up: the concrete from the engine's own
 * polygons, the deck and haunch when given (cut at the girder's width), and every strand of every
 * row with its state — lost
 * strands crossed out, strands with section loss hatched, exposed strands outlined — and a
 * legend. In selectable mode each strand is a button (Space or Enter, `aria-pressed`) with a tap
 * circle at least 44 px across, for marking strands on a tablet: the drawing is then shown at
 * least at the scale that needs (larger than its box where strands are close together, the box
 * scrolling sideways).
 */
@Component({
  selector: 'sl-girder-section-drawing',
  templateUrl: './girder-section-drawing.component.html',
  styleUrl: './girder-section-drawing.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GirderSectionDrawingComponent {
  /** The section as the engine uses it (`GirderDetail.section`); one that fails the section schema is named, not drawn. */
  readonly section = input.required<GirderDetail['section']>();
  readonly strandRows = input.required<readonly DrawnStrandRow[]>();
  readonly deck = input<DeckOutline | null>(null);
  readonly strandStates = input<StrandStates>({});
  readonly selectable = input(false);
  readonly selected = input<readonly StrandRef[]>([]);
  /** A strand tapped, clicked or pressed with Space or Enter in selectable mode. */
  readonly strandToggled = output<StrandRef>();

  protected readonly hatchId = `sl-strand-hatch-${++drawingCount}`;
  protected readonly legendHatchId = `${this.hatchId}-legend`;

  private readonly checkedSection = computed(() => sectionShapeSchema.safeParse(this.section()));

  /** Why the section cannot be drawn, or null when it can. */
  protected readonly sectionProblem = computed(() => {
    const checked = this.checkedSection();
    return checked.success ? null : schemaProblems(checked.error).map((p) => (p.field ? `${p.field}: ${p.message}` : p.message)).join('; ');
  });

  protected readonly layout = computed(() => {
    const checked = this.checkedSection();
    return checked.success ? sectionDrawingLayout(checked.data, this.strandRows(), this.deck()) : null;
  });

  protected readonly strands = computed<readonly DrawnStrand[]>(() => {
    const states = this.strandStates();
    const selected = new Set(this.selected().map(strandKey));
    return (this.layout()?.strands ?? []).map((strand) => {
      const state = states[strand.rowId]?.[strand.index] ?? 'intact';
      const key = strandKey(strand);
      return {
        ...strand,
        key,
        state,
        selected: selected.has(key),
        label: `Row ${strand.rowId}, strand ${strand.index}: ${STRAND_DRAW_STATE_NAMES[state].toLowerCase()}`,
        crossPath: state === 'lost' ? crossPath(strand) : null,
      };
    });
  });

  /** Big enough both ways that the smallest tap circle is 44 px across whatever the box; null when nothing is tapped. */
  protected readonly minSizePx = computed(() => {
    const layout = this.layout();
    if (!this.selectable() || !layout || layout.strands.length === 0) return null;
    const pxPerMm = Math.min(MIN_HIT_RADIUS_PX / layout.smallestHitRadiusMm, MAX_PX_PER_MM);
    return { width: Math.ceil(layout.widthMm * pxPerMm), height: Math.ceil(layout.heightMm * pxPerMm) };
  });

  protected readonly description = computed(() => {
    const strands = this.strands();
    const counts = STRAND_DRAW_STATES.filter((state) => state !== 'intact')
      .map((state) => ({ state, count: strands.filter((strand) => strand.state === state).length }))
      .filter(({ count }) => count > 0)
      .map(({ state, count }) => `${count} ${STRAND_DRAW_STATE_NAMES[state].toLowerCase()}`);
    const rows = this.strandRows().length;
    const summary = `Girder cross-section with ${strands.length} strands in ${rows} ${rows === 1 ? 'row' : 'rows'}`;
    return counts.length > 0 ? `${summary}: ${counts.join(', ')}` : summary;
  });

  protected readonly legend = computed<readonly LegendEntry[]>(() => [
    ...STRAND_DRAW_STATES.map((state) => ({ key: state, label: LEGEND_LABELS[state], state, selected: false })),
    ...(this.selectable() ? [{ key: 'selected', label: 'Selected', state: 'intact' as const, selected: true }] : []),
  ]);

  protected toggle(strand: DrawnStrand, event?: Event): void {
    if (!this.selectable()) return;
    // Space would also scroll the page.
    event?.preventDefault();
    this.strandToggled.emit({ rowId: strand.rowId, index: strand.index });
  }
}

function strandKey(strand: StrandRef): string {
  return `${strand.rowId}\u0000${strand.index}`;
}

function crossPath({ x, y, radiusMm }: PlacedStrand): string {
  const reach = CROSS_REACH * radiusMm * Math.SQRT1_2;
  return `M${x - reach},${y - reach}L${x + reach},${y + reach}M${x - reach},${y + reach}L${x + reach},${y - reach}`;
}
