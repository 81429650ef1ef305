import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { FindingDetail } from '@spanledger/shared';

import { GirderElevationStripComponent } from './girder-elevation-strip.component';
import { findingDetail } from './girders.testing';

describe('GirderElevationStripComponent', () => {
  let fixture: ComponentFixture<GirderElevationStripComponent>;

  async function strip(findings: readonly FindingDetail[], spanLengthM = 30): Promise<void> {
    fixture = TestBed.createComponent(GirderElevationStripComponent);
    fixture.componentRef.setInput('spanLengthM', spanLengthM);
    fixture.componentRef.setInput('findings', findings);
    await fixture.whenStable();
  }

  function label(findingId: number): SVGTextElement {
    return fixture.nativeElement.querySelector(`[data-testid="elevation-label"][data-finding-id="${findingId}"]`);
  }

  function bandRect(findingId: number): SVGRectElement {
    return fixture.nativeElement.querySelector(`[data-testid="elevation-band"][data-finding-id="${findingId}"] rect`);
  }

  afterEach(() => localStorage.clear());

  it('draws each finding from its start to its end along the span', async () => {
    await strip([findingDetail({ id: 1, fromM: 6, toM: 9 })]);

    // 720 units for 30 m: 24 a metre.
    expect(Number(bandRect(1).getAttribute('x'))).toBe(144);
    expect(Number(bandRect(1).getAttribute('width'))).toBe(72);
  });

  it('puts labels that would overlap in separate lanes, the first next to the girder', async () => {
    await strip([findingDetail({ id: 1, fromM: 6, toM: 9 }), findingDetail({ id: 2, kind: 'crack', strands: null, crackWidthMm: 0.3, fromM: 7, toM: 8 }), findingDetail({ id: 3, fromM: 20, toM: 21 })]);

    const y = (id: number) => Number(label(id).getAttribute('y'));
    expect(y(2)).toBeLessThan(y(1));
    // Far enough along to share the first lane.
    expect(y(3)).toBe(y(1));
  });

  it('ends a label at its band when it would run off the far end', async () => {
    await strip([findingDetail({ id: 1, kind: 'strand-section-loss', lossFraction: 0.1, fromM: 29, toM: 30 })]);

    expect(label(1).getAttribute('text-anchor')).toBe('end');
    expect(Number(label(1).getAttribute('x'))).toBe(720);
  });

  it('says so when there is nothing open', async () => {
    await strip([]);

    expect(fixture.nativeElement.querySelector('[data-testid="elevation-none"]').textContent).toBe('No open findings along this girder.');
    expect(fixture.nativeElement.querySelector('[data-testid="elevation-strip"]').getAttribute('aria-label')).toBe('Girder along its 30.00 m span, no open findings');
  });
});
