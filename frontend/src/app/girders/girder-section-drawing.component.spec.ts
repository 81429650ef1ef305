import { ComponentFixture, TestBed } from '@angular/core/testing';

import { GirderSectionDrawingComponent } from './girder-section-drawing.component';
import { DEMO_I_GIRDER_SECTION, strandRow } from './girders.testing';
import type { StrandRef, StrandStates } from './strand-states';

const ROWS = [strandRow({ id: 'r1', count: 4 }), strandRow({ id: 'r2', yMm: 110, count: 2, xMm: [-100, 100] })];

describe('GirderSectionDrawingComponent', () => {
  let fixture: ComponentFixture<GirderSectionDrawingComponent>;
  let toggled: StrandRef[];

  async function draw(inputs: Partial<Record<'section' | 'strandRows' | 'strandStates' | 'selectable' | 'selected' | 'deck', unknown>> = {}): Promise<void> {
    fixture = TestBed.createComponent(GirderSectionDrawingComponent);
    fixture.componentRef.setInput('section', DEMO_I_GIRDER_SECTION);
    fixture.componentRef.setInput('strandRows', ROWS);
    for (const [name, value] of Object.entries(inputs)) fixture.componentRef.setInput(name, value);
    toggled = [];
    fixture.componentInstance.strandToggled.subscribe((strand) => toggled.push(strand));
    await fixture.whenStable();
  }

  function strand(rowId: string, index: number): SVGGElement {
    return fixture.nativeElement.querySelector(`[data-testid="strand"][data-row-id="${rowId}"][data-index="${index}"]`);
  }

  function numberAttribute(element: Element | null, name: string): number {
    return Number(element?.getAttribute(name));
  }

  function press(element: Element, key: string): KeyboardEvent {
    const event = new KeyboardEvent('keydown', { key, bubbles: true, cancelable: true });
    element.dispatchEvent(event);
    return event;
  }

  it('draws every strand of every row at its place, y up, with the row positions given', async () => {
    await draw();

    expect(fixture.nativeElement.querySelectorAll('[data-testid="strand"]')).toHaveLength(6);
    // Row r1 spreads over the 600 mm bottom flange, 1.5 diameters in from each edge; y = 60 mm is drawn at −60.
    const first = strand('r1', 0).querySelector('.mark');
    expect(numberAttribute(first, 'cx')).toBeCloseTo(-300 + 1.5 * 15.2);
    expect(numberAttribute(first, 'cy')).toBe(-60);
    expect(numberAttribute(strand('r2', 1).querySelector('.mark'), 'cx')).toBe(100);
    expect(fixture.nativeElement.querySelector('[data-testid="concrete"]').getAttribute('d')).toContain('M300,0L300,-160');
  });

  it('crosses out lost strands, hatches those with section loss and outlines exposed ones', async () => {
    const states: StrandStates = { r1: ['lost', 'section-loss', 'exposed'] };
    await draw({ strandStates: states });

    expect(strand('r1', 0).dataset['state']).toBe('lost');
    expect(strand('r1', 0).querySelector('[data-testid="strand-cross"]')).not.toBeNull();
    const hatched = strand('r1', 1).querySelector<SVGCircleElement>('.mark')!;
    expect(strand('r1', 1).dataset['state']).toBe('section-loss');
    expect(hatched.style.fill).toMatch(/^url\(["']?#sl-strand-hatch-\d+["']?\)$/);
    expect(fixture.nativeElement.querySelector(hatched.style.fill.replace(/^url\(["']?(#[^"')]+)["']?\)$/, '$1'))?.tagName.toLowerCase()).toBe('pattern');
    expect(strand('r1', 2).dataset['state']).toBe('exposed');
    expect(strand('r1', 2).querySelector('[data-testid="strand-cross"]')).toBeNull();
    expect(strand('r1', 2).querySelector<SVGCircleElement>('.mark')!.style.fill).toBe('');
    // A strand the states leave out, and a row they do not name, are intact.
    expect(strand('r1', 3).dataset['state']).toBe('intact');
    expect(strand('r2', 0).dataset['state']).toBe('intact');
    expect(fixture.nativeElement.querySelectorAll('[data-testid="strand-cross"]')).toHaveLength(1);
    expect(fixture.nativeElement.querySelector('[data-testid="section-drawing"]').getAttribute('aria-label')).toBe(
      'Girder cross-section with 6 strands in 2 rows: 1 lost, 1 section loss, 1 exposed',
    );
  });

  it('keys each state in a legend under the drawing', async () => {
    await draw();

    const legend = [...fixture.nativeElement.querySelectorAll('[data-testid="drawing-legend"] li')].map((item: Element) => item.textContent?.trim());
    expect(legend).toEqual(['Intact strand', 'Lost strand (crossed out)', 'Section loss, corroded (hatched)', 'Exposed strand (outlined)']);
  });

  it('draws the deck and haunch on the flat top when given', async () => {
    await draw({ deck: { widthMm: 2400, thicknessMm: 200, haunchMm: 25 } });

    const deck = fixture.nativeElement.querySelector('[data-testid="deck"]');
    expect([numberAttribute(deck, 'x'), numberAttribute(deck, 'y'), numberAttribute(deck, 'width'), numberAttribute(deck, 'height')]).toEqual([-1200, -1425, 2400, 200]);
    const haunch = fixture.nativeElement.querySelector('[data-testid="haunch"]');
    expect([numberAttribute(haunch, 'x'), numberAttribute(haunch, 'width'), numberAttribute(haunch, 'height')]).toEqual([-250, 500, 25]);
  });

  it('cuts the view to the girder, so a wide deck runs off its edges rather than shrinking the strands', async () => {
    await draw({ deck: { widthMm: 6000, thicknessMm: 200, haunchMm: 0 } });

    const [x, , width] = fixture.nativeElement.querySelector('[data-testid="section-drawing"]').getAttribute('viewBox').split(' ').map(Number);
    // The 600 mm bottom flange is the widest part; the margin is 5 % of the 1400 mm height with the deck.
    expect([x, width]).toEqual([-370, 740]);
    expect(numberAttribute(fixture.nativeElement.querySelector('[data-testid="deck"]'), 'width')).toBe(6000);
  });

  it('names the problem of a section it cannot draw', async () => {
    await draw({ section: { ...DEMO_I_GIRDER_SECTION, depthMm: 300 } });

    expect(fixture.nativeElement.querySelector('[data-testid="section-drawing"]')).toBeNull();
    expect(fixture.nativeElement.querySelector('[data-testid="drawing-problem"]').textContent).toContain('depthMm: depth must exceed the flanges and tapers stacked');
  });

  it('offers nothing to tap unless selectable', async () => {
    await draw();

    const first = strand('r1', 0);
    expect(first.getAttribute('role')).toBeNull();
    expect(first.getAttribute('tabindex')).toBeNull();
    expect(first.querySelector('[data-testid="strand-hit"]')).toBeNull();
    first.dispatchEvent(new MouseEvent('click', { bubbles: true }));
    press(first, 'Enter');
    expect(toggled).toEqual([]);
  });

  describe('selectable', () => {
    it('makes each strand a focusable toggle button showing whether it is selected', async () => {
      await draw({ selectable: true, selected: [{ rowId: 'r1', index: 2 }] });

      expect(strand('r1', 2).getAttribute('role')).toBe('button');
      expect(strand('r1', 2).getAttribute('tabindex')).toBe('0');
      expect(strand('r1', 2).getAttribute('aria-pressed')).toBe('true');
      expect(strand('r1', 2).querySelector('.selection-ring')).not.toBeNull();
      expect(strand('r1', 1).getAttribute('aria-pressed')).toBe('false');
      expect(strand('r1', 1).getAttribute('aria-label')).toBe('Row r1, strand 1: intact');
      expect(fixture.nativeElement.querySelector('[data-testid="legend-selected"]').textContent.trim()).toBe('Selected');
    });

    it('emits the strand tapped, or pressed with Enter or Space, without scrolling the page', async () => {
      await draw({ selectable: true });

      strand('r1', 3).dispatchEvent(new MouseEvent('click', { bubbles: true }));
      const enter = press(strand('r2', 0), 'Enter');
      const space = press(strand('r1', 0), ' ');

      expect(toggled).toEqual([
        { rowId: 'r1', index: 3 },
        { rowId: 'r2', index: 0 },
        { rowId: 'r1', index: 0 },
      ]);
      expect(enter.defaultPrevented).toBe(true);
      expect(space.defaultPrevented).toBe(true);
    });

    it('leaves the selection to its owner: a toggle changes nothing until the new selection comes back', async () => {
      await draw({ selectable: true });

      strand('r1', 1).dispatchEvent(new MouseEvent('click', { bubbles: true }));
      await fixture.whenStable();
      expect(strand('r1', 1).getAttribute('aria-pressed')).toBe('false');

      fixture.componentRef.setInput('selected', toggled);
      await fixture.whenStable();
      expect(strand('r1', 1).getAttribute('aria-pressed')).toBe('true');
    });

    it('gives every strand a tap circle at least 44 px across at the size it is shown', async () => {
      await draw({ selectable: true });

      const svg: SVGSVGElement = fixture.nativeElement.querySelector('[data-testid="section-drawing"]');
      const [, , viewBoxWidthMm, viewBoxHeightMm] = svg.getAttribute('viewBox')!.split(' ').map(Number);
      // However the box sizes it, the drawing is at least this large both ways, so at least at this scale.
      const pxPerMm = Math.min(parseFloat(svg.style.minWidth) / viewBoxWidthMm!, parseFloat(svg.style.minHeight) / viewBoxHeightMm!);
      const hitRadiiMm = [...fixture.nativeElement.querySelectorAll('[data-testid="strand-hit"]')].map((hit: Element) => numberAttribute(hit, 'r'));
      const drawnRadiiMm = [...fixture.nativeElement.querySelectorAll('[data-testid="strand"] .mark')].map((mark: Element) => numberAttribute(mark, 'r'));

      expect(hitRadiiMm).toHaveLength(6);
      expect(Math.min(...hitRadiiMm) * 2 * pxPerMm).toBeGreaterThanOrEqual(44);
      hitRadiiMm.forEach((hitRadius, index) => expect(hitRadius).toBeGreaterThan(drawnRadiiMm[index]!));
    });

  });
});
