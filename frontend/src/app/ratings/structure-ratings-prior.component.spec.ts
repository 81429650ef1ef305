import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatExpansionPanelHarness } from '@angular/material/expansion/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { provideRouter } from '@angular/router';
import { RESULT_CAUTION, type PriorRatingSummary, type SignedInUser } from '@spanledger/shared';

import { SessionStore } from '../session/session.store';
import { StructureRatingsComponent } from './structure-ratings.component';

// The table and the panel are read through Material harnesses; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

/** An invented inspector of the demo authority: everyone may read the ratings on file. */
const INSPECTOR: SignedInUser = { id: 3, email: 'i@example.org', displayName: 'Dana Whitcombe', role: 'inspector', districts: ['North District'], admin: false };

/** Prior ratings as the server sends them, newest first; the figures are invented, only what the table shows. */
const stamp = { at: '2026-11-30T12:00:00.000Z', by: 'Greer Ashdown' };
const ON_FILE: PriorRatingSummary[] = [
  {
    id: 22, structureId: 41, spanId: 301, spanIndex: 2, lowestLegalRf: 0.96, lowestInventoryRf: 0.88, approvedOn: '2018-06-07', sourceNote: 'Span 2 of the June 2018 rating report.',
    importId: 9, previous: { id: 21, approvedOn: '2012-04-26', lowestLegalRf: 1.22, lowestInventoryRf: null }, created: stamp,
  },
  { id: 21, structureId: 41, spanId: null, spanIndex: null, lowestLegalRf: 1.22, lowestInventoryRf: null, approvedOn: '2012-04-26', sourceNote: 'Legal loads only, from the 2012 posting review.', importId: 8, previous: null, created: stamp },
];

describe('StructureRatingsComponent: ratings on file from before Spanledger', () => {
  let fixture: ComponentFixture<StructureRatingsComponent>;
  let server: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [StructureRatingsComponent],
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), { provide: SessionStore, useValue: { user: signal(INSPECTOR) } }],
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(StructureRatingsComponent);
    fixture.componentRef.setInput('structureId', 41);
    fixture.componentRef.setInput('district', 'North District');
    fixture.componentRef.setInput('spans', []);
    await fixture.whenStable();
    server.expectOne('api/structures/41/ratings').flush([]);
    await fixture.whenStable();
  });
  afterEach(() => server.verify());

  const element = (testId: string) => fixture.nativeElement.querySelector(`[data-testid="${testId}"]`) as HTMLElement | null;
  const textOf = (testId: string) => element(testId)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';

  async function openPanel(answer: PriorRatingSummary[] | 'fails'): Promise<void> {
    const panel = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatExpansionPanelHarness.with({ title: 'Ratings on file from before Spanledger' }));
    await panel.expand();
    const request = server.expectOne('api/structures/41/prior-ratings');
    if (answer === 'fails') request.flush({ error: { code: 'internal', message: 'Something went wrong on the server.' } }, { status: 500, statusText: 'Server Error' });
    else request.flush(answer);
    await fixture.whenStable();
  }

  it('reads the ratings on file only when the panel is opened', async () => {
    server.expectNone('api/structures/41/prior-ratings');
    expect(element('prior-ratings-table')).toBeNull();
    await openPanel([]);
    expect(textOf('prior-ratings-empty')).toBe('No ratings from before Spanledger are on file for this structure.');
    expect(element('prior-ratings-caution')).toBeNull();
  });

  it('lists each with its day, what it rated, its figures and the change from the one before, its source and the caution', async () => {
    await openPanel(ON_FILE);

    const table = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatTableHarness.with({ selector: '[data-testid="prior-ratings-table"]' }));
    const rows = await Promise.all((await table.getRows()).map((row) => row.getCellTextByColumnName()));
    // 0.96 − 1.22 = −0.26 (hand check); an inventory factor the earlier rating did not give has no change.
    expect(rows).toEqual([
      { approved: 'Jun 7, 2018', part: 'Span 2', legal: '0.96 −0.26', inventory: '0.88 —', source: 'Span 2 of the June 2018 rating report.' },
      { approved: 'Apr 26, 2012', part: 'Whole structure', legal: '1.22 first on file', inventory: 'Not rated first on file', source: 'Legal loads only, from the 2012 posting review.' },
    ]);
    const firstRow = fixture.nativeElement.querySelector('[data-prior-rating-id="22"]') as HTMLElement;
    expect(firstRow.querySelector('[data-testid="prior-legal"]')!.classList).toContain('below-one');
    expect(firstRow.querySelector('[data-testid="prior-legal-change"]')!.getAttribute('title')).toBe('Change from the rating of Apr 26, 2012');
    expect(textOf('prior-ratings-caution')).toBe(RESULT_CAUTION);
  });

  it('says so when the ratings on file cannot be read', async () => {
    await openPanel('fails');
    expect(textOf('prior-ratings-error')).toMatch(/^The ratings on file could not be loaded\./);
  });
});
