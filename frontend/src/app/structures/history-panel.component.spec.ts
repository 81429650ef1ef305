import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import type { HistoryEvent } from '@spanledger/shared';

import { UnitsStore } from '../units/units.store';
import { HISTORY_PAGE_SIZE, HistoryPanelComponent } from './history-panel.component';
import { historyEvent } from './inventory.testing';

describe('HistoryPanelComponent', () => {
  let fixture: ComponentFixture<HistoryPanelComponent>;
  let server: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [HistoryPanelComponent], providers: [provideHttpClient(), provideHttpClientTesting()] });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(HistoryPanelComponent);
    fixture.componentRef.setInput('structureId', 41);
    await fixture.whenStable();
  });

  afterEach(() => {
    server.verify();
    localStorage.clear();
  });

  function historyRequest(): TestRequest {
    return server.expectOne((request) => request.url === 'api/structures/41/history');
  }

  async function answer(items: HistoryEvent[], total = items.length, offset = 0): Promise<void> {
    historyRequest().flush({ items, total, limit: HISTORY_PAGE_SIZE, offset });
    await fixture.whenStable();
  }

  function texts(testId: string): string[] {
    return [...fixture.nativeElement.querySelectorAll(`[data-testid="${testId}"]`)].map((node) => (node as HTMLElement).textContent!.replace(/\s+/g, ' ').trim());
  }

  it('lists who changed what, each field from before to after in the chosen units', async () => {
    await answer([
      historyEvent(),
      historyEvent({
        id: '76',
        action: 'structure.changed',
        subject: 'Structure',
        userName: null,
        changes: [
          { field: 'status', before: 'open', after: 'posted' },
          { field: 'notes', before: '', after: 'Posted after the spring inspection.' },
        ],
      }),
    ]);

    const rows = fixture.nativeElement.querySelectorAll('[data-testid="history-row"]');
    expect(rows).toHaveLength(2);
    expect(texts('history-what')).toEqual(['Span 1 changed', 'Structure changed']);
    expect(rows[0].textContent).toContain('Priya Halloran');
    expect(rows[0].textContent).toContain('2024');
    expect(rows[1].textContent).toContain('Data load');
    expect(texts('history-change')).toEqual(['Length: 30.00 m → 30.48 m', 'Status: Open → Posted', 'Notes: (empty) → Posted after the spring inspection.']);

    TestBed.inject(UnitsStore).use('us');
    await fixture.whenStable();
    expect(texts('history-change')[0]).toBe('Length: 98.43 ft → 100.00 ft');
  });

  it('shows what is worth reading of a finding or a rating: labelled fields, positions in the chosen units, no ids or whole runs', async () => {
    await answer([
      historyEvent({
        id: '90',
        action: 'finding.recorded',
        entityType: 'finding',
        subject: 'Finding on span 1, girder 1 (inspection of 2026-11-24)',
        changes: [
          { field: 'girderId', before: null, after: 4417 },
          { field: 'kind', before: null, after: 'spall' },
          { field: 'fromM', before: null, after: 4 },
          { field: 'inspectionId', before: null, after: 12 },
        ],
      }),
      historyEvent({
        id: '91',
        action: 'rating.run',
        entityType: 'rating',
        subject: 'Rating 12 of span 1',
        changes: [
          { field: 'run', before: null, after: { vehicleIds: ['hl93'] } },
          { field: 'lowestLegalRf', before: null, after: 1.08 },
        ],
      }),
    ]);

    expect(texts('history-what')).toEqual(['Finding on span 1, girder 1 (inspection of 2026-11-24) recorded', 'Rating 12 of span 1 run']);
    expect(texts('history-change')).toEqual(['Kind: — → spall', 'From: — → 4.00 m', 'Lowest legal-load rating factor: — → 1.08']);
  });

  it('asks for the first page, then the next one the user turns to', async () => {
    const first = historyRequest();
    expect(first.request.params.get('limit')).toBe(String(HISTORY_PAGE_SIZE));
    expect(first.request.params.get('offset')).toBe('0');
    first.flush({ items: [historyEvent()], total: 45, limit: HISTORY_PAGE_SIZE, offset: 0 });
    await fixture.whenStable();

    const paginator = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatPaginatorHarness);
    expect(await paginator.getRangeLabel()).toBe('1 – 20 of 45');
    await paginator.goToNextPage();

    const second = historyRequest();
    expect(second.request.params.get('offset')).toBe('20');
    second.flush({ items: [historyEvent({ id: '12' })], total: 45, limit: HISTORY_PAGE_SIZE, offset: 20 });
  });

  it('asks again when the page bumps the refresh count after a save', async () => {
    await answer([]);
    expect(texts('history-empty')).toEqual(['No changes are recorded for this structure yet.']);

    fixture.componentRef.setInput('refresh', 1);
    await fixture.whenStable();
    await answer([historyEvent()]);

    expect(texts('history-what')).toEqual(['Span 1 changed']);
  });

  it('explains when the history cannot be loaded', async () => {
    historyRequest().flush({ error: { code: 'internal_error', message: 'Something went wrong on our side.' }, requestId: 'r-2' }, { status: 500, statusText: 'Server Error' });
    await fixture.whenStable();

    expect(texts('history-error')[0]).toContain('Something went wrong on our side. (request r-2)');
  });
});
