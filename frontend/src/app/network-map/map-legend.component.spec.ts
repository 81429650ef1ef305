import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { RatingBasis } from '@spanledger/shared';

import { MapLegendComponent } from './map-legend.component';
import { NOT_RATED_COLOUR } from './rating-colour-scale';

describe('MapLegendComponent', () => {
  let fixture: ComponentFixture<MapLegendComponent>;
  let loader: HarnessLoader;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [MapLegendComponent] });
    fixture = TestBed.createComponent(MapLegendComponent);
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.componentRef.setInput('ratingBasis', 'legal');
    await fixture.whenStable();
  });

  function all(testId: string): HTMLElement[] {
    return Array.from(fixture.nativeElement.querySelectorAll(`[data-testid="${testId}"]`));
  }

  function entry(key: string): HTMLElement {
    return fixture.nativeElement.querySelector(`[data-testid="legend-entry"][data-entry="${key}"]`);
  }

  it('labels the colour scale at its ends, at 1.00 and at 1.50, in order along the bar', () => {
    const ticks = all('legend-tick');
    expect(ticks.map((tick) => tick.textContent?.trim())).toEqual(['≤ 0.50', '1.00', '1.50', '≥ 2.00']);
    const positions = ticks.map((tick) => Number.parseFloat(tick.style.left));
    expect(positions[0]).toBe(0);
    expect(positions[1]).toBeCloseTo(100 / 3, 6);
    expect(positions[3]).toBe(100);
  });

  it('paints the bar with the scale, described for screen readers', () => {
    const bar: HTMLElement = fixture.nativeElement.querySelector('.bar');
    expect(bar.getAttribute('role')).toBe('img');
    expect(bar.getAttribute('aria-label')).toContain('0.50');
    expect(bar.style.background).toContain('linear-gradient');
  });

  it('shows the grey of "Not rated" and the heavy outline below 1.00', () => {
    expect(entry('not-rated').textContent?.trim()).toBe('Not rated');
    expect(entry('not-rated').querySelector('path')?.getAttribute('fill')).toBe(NOT_RATED_COLOUR);
    expect(entry('below-1').textContent?.trim()).toBe('Below 1.00: heavy outline');
    const heavy = Number(entry('below-1').querySelector('path')?.getAttribute('stroke-width'));
    const plain = Number(entry('not-rated').querySelector('path')?.getAttribute('stroke-width'));
    expect(heavy).toBeGreaterThan(plain);
  });

  it('shows a different shape for each status, with its name', () => {
    const names = ['open', 'posted', 'closed'].map((status) => entry(status).textContent?.trim());
    expect(names).toEqual(['Open', 'Posted', 'Closed']);
    const outlines = ['open', 'posted', 'closed'].map((status) => entry(status).querySelector('path')?.getAttribute('d'));
    expect(new Set(outlines).size).toBe(3);
    // The closed square carries a cross over its fill.
    expect(entry('closed').querySelectorAll('path')).toHaveLength(3);
  });

  it('names the basis and switches the colouring between legal loads and design inventory', async () => {
    const asked: RatingBasis[] = [];
    fixture.componentInstance.ratingBasisChange.subscribe((basis) => asked.push(basis));
    const toggle = await loader.getHarness(MatSlideToggleHarness);
    const basisText = () => fixture.nativeElement.querySelector('[data-testid="legend-basis"]').textContent.trim();

    expect(await toggle.getLabelText()).toBe('Colour by design inventory');
    expect(await toggle.isChecked()).toBe(false);
    expect(basisText()).toBe('Legal loads');
    await toggle.toggle();
    expect(asked).toEqual(['design-inventory']);

    fixture.componentRef.setInput('ratingBasis', 'design-inventory');
    await fixture.whenStable();
    expect(await toggle.isChecked()).toBe(true);
    expect(basisText()).toBe('Design inventory');
    await toggle.toggle();
    expect(asked).toEqual(['design-inventory', 'legal']);
  });
});
