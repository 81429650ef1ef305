import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router, provideRouter } from '@angular/router';
import type { RatingSummary, SignedInUser } from '@spanledger/shared';

import { SessionStore } from '../session/session.store';
import { ReviewQueuePage } from './review-queue.page';

// Each case reads the table through Material harnesses; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

/** The invented demo authority's people: a rating engineer of North District, a colleague there, and a manager of the whole network. */
const RATER: SignedInUser = { id: 7, email: 'r@example.org', displayName: 'Priya Halloran', role: 'rater', districts: ['North District'], admin: false };
const MANAGER: SignedInUser = { id: 11, email: 'm@example.org', displayName: 'Greer Ashdown', role: 'manager', districts: [], admin: true };
const COLLEAGUE = { id: 9, name: 'Tomasz Brenek' };

/** A submitted rating of span 1 of NP-0041, run by the colleague; the figures are only what the table shows. */
function ratingSummary(overrides: Partial<RatingSummary> = {}): RatingSummary {
  return {
    id: 501,
    structureId: 41,
    structureNumber: 'NP-0041',
    structureName: 'Willow Bend Overpass',
    district: 'North District',
    spanId: 301,
    spanIndex: 1,
    state: 'submitted',
    girderCount: 5,
    hypothetical: false,
    lowestLegalRf: 1.234,
    lowestInventoryRf: 0.956,
    created: { at: '2026-11-01T12:00:00.000Z', by: COLLEAGUE.name, byUserId: COLLEAGUE.id },
    submitted: { at: '2026-11-02T12:00:00.000Z', by: COLLEAGUE.name },
    reviewed: null,
    version: 2,
    ...overrides,
  };
}

/** As the server sends them, oldest submission first: the rater's own, one in another district, then two of the colleague's. */
const WAITING: RatingSummary[] = [
  ratingSummary({ id: 502, created: { at: '2026-10-30T12:00:00.000Z', by: RATER.displayName, byUserId: RATER.id }, submitted: { at: '2026-10-31T12:00:00.000Z', by: RATER.displayName } }),
  ratingSummary({ id: 503, structureId: 52, structureNumber: 'EV-0052', structureName: 'Larkspur Creek Bridge', district: 'East District', spanId: 410, submitted: { at: '2026-11-01T12:00:00.000Z', by: COLLEAGUE.name } }),
  ratingSummary({ id: 501 }),
  ratingSummary({ id: 504, spanId: 302, spanIndex: 2, hypothetical: true, lowestLegalRf: 0.871, lowestInventoryRf: 0.64, submitted: { at: '2026-11-03T12:00:00.000Z', by: COLLEAGUE.name } }),
];

@Component({ template: '' })
class BlankPage {}

describe('ReviewQueuePage', () => {
  let fixture: ComponentFixture<ReviewQueuePage>;
  let server: HttpTestingController;

  async function openPage(user: SignedInUser): Promise<void> {
    TestBed.configureTestingModule({
      imports: [ReviewQueuePage],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([
          { path: 'ratings/:id', component: BlankPage },
          { path: 'structures/:id', component: BlankPage },
        ]),
        { provide: SessionStore, useValue: { user: signal(user) } },
      ],
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReviewQueuePage);
    await fixture.whenStable();
  }

  function queueRequest(): TestRequest {
    return server.expectOne('api/ratings/waiting-for-review');
  }

  async function openWith(user: SignedInUser, ratings: RatingSummary[]): Promise<void> {
    await openPage(user);
    queueRequest().flush(ratings);
    await fixture.whenStable();
  }

  afterEach(() => server.verify());

  const element = (testId: string) => fixture.nativeElement.querySelector(`[data-testid="${testId}"]`) as HTMLElement | null;
  const textOf = (testId: string) => element(testId)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const rowOf = (ratingId: number) => fixture.nativeElement.querySelector(`[data-testid="review-row"][data-rating-id="${ratingId}"]`) as HTMLElement;

  async function tableRows(): Promise<Record<string, string>[]> {
    const table = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatTableHarness.with({ selector: '[data-testid="review-queue-table"]' }));
    const rows = await table.getRows();
    return Promise.all(rows.map((row) => row.getCellTextByColumnName()));
  }

  it('puts the ratings the user may review first, then their own, then those of other districts, each marked', async () => {
    await openWith(RATER, WAITING);

    const rows = await tableRows();
    expect(rows.map((row) => [row['structure'], row['span'], row['district'], row['ranBy'], row['part']])).toEqual([
      ['NP-0041 Willow Bend Overpass', 'Span 1', 'North District', 'Tomasz Brenek', 'rate_review Yours to review'],
      ['NP-0041 Willow Bend Overpass', 'Span 2 what-if', 'North District', 'Tomasz Brenek', 'rate_review Yours to review'],
      ['NP-0041 Willow Bend Overpass', 'Span 1', 'North District', 'Priya Halloran', 'You ran this: another engineer reviews it'],
      ['EV-0052 Larkspur Creek Bridge', 'Span 1', 'East District', 'Tomasz Brenek', 'Outside your districts'],
    ]);
    expect([...fixture.nativeElement.querySelectorAll('[data-testid="review-row"]')].map((row: Element) => row.getAttribute('data-part'))).toEqual([
      'reviewable',
      'reviewable',
      'own',
      'elsewhere',
    ]);
    expect(textOf('review-queue-summary')).toBe('4 ratings are waiting; 2 for you to review.');
  });

  it('shows the rating factors to two decimals with a legal factor below 1.0 emphasised, and when each was submitted', async () => {
    await openWith(RATER, WAITING);

    const rows = await tableRows();
    expect(rows.map((row) => [row['legal'], row['inventory']])).toEqual([
      ['1.23', '0.96'],
      ['0.87', '0.64'],
      ['1.23', '0.96'],
      ['1.23', '0.96'],
    ]);
    const legalCell = (ratingId: number) => rowOf(ratingId).querySelector('.mat-column-legal') as HTMLElement;
    expect(legalCell(504).classList).toContain('below-one');
    expect(legalCell(501).classList).not.toContain('below-one');
    // Midday UTC falls on the same day in any zone a test machine is likely to use.
    expect(rows[0]['submitted']).toMatch(/Nov 2, 2026/);
    expect(rows[2]['submitted']).toMatch(/Oct 31, 2026/);
    expect(rowOf(504).querySelector('[data-testid="what-if"]')).not.toBeNull();
    expect(rowOf(501).querySelector('[data-testid="what-if"]')).toBeNull();
  });

  it('lets a manager of the whole network review every rating but their own', async () => {
    const ownRating = ratingSummary({ id: 505, created: { at: '2026-11-01T12:00:00.000Z', by: MANAGER.displayName, byUserId: MANAGER.id } });
    await openWith(MANAGER, [ownRating, ...WAITING]);

    const parts = (await tableRows()).map((row) => row['part']);
    expect(parts).toEqual(['rate_review Yours to review', 'rate_review Yours to review', 'rate_review Yours to review', 'rate_review Yours to review', 'You ran this: another engineer reviews it']);
    expect(rowOf(505).getAttribute('data-part')).toBe('own');
    expect(textOf('review-queue-summary')).toBe('5 ratings are waiting; 4 for you to review.');
  });

  it('links each row to its structure and its rating, and the whole row opens the rating', async () => {
    await openWith(RATER, WAITING);
    const router = TestBed.inject(Router);

    const structureLink = rowOf(503).querySelector('[data-testid="structure-link"]') as HTMLAnchorElement;
    const openLink = rowOf(503).querySelector('[data-testid="open-rating"]') as HTMLAnchorElement;
    expect(structureLink.getAttribute('href')).toBe('/structures/52');
    expect(openLink.getAttribute('href')).toBe('/ratings/503');
    expect(openLink.textContent?.trim()).toBe('Open');

    (rowOf(504).querySelector('.mat-column-district') as HTMLElement).click();
    await fixture.whenStable();
    expect(router.url).toBe('/ratings/504');

    // The structure link goes to the structure, not through the row to the rating.
    structureLink.click();
    await fixture.whenStable();
    expect(router.url).toBe('/structures/52');
  });

  it('says so when no rating is waiting', async () => {
    await openWith(RATER, []);

    expect(textOf('review-queue-empty')).toBe('No ratings are waiting for review.');
    expect(element('review-queue-table')).toBeNull();
    expect(element('review-queue-summary')).toBeNull();
  });

  it('shows progress while loading and the reason when the list cannot be loaded', async () => {
    await openPage(RATER);
    const loader = TestbedHarnessEnvironment.loader(fixture);
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(1);

    queueRequest().flush({ error: { code: 'internal_error', message: 'Something went wrong on our side.' }, requestId: 'r-9' }, { status: 500, statusText: 'Server Error' });
    await fixture.whenStable();

    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(0);
    expect(textOf('review-queue-error')).toBe('The ratings to review could not be loaded. Something went wrong on our side. (request r-9)');
    expect(element('review-queue-table')).toBeNull();
    expect(element('review-queue-empty')).toBeNull();
  });
});
