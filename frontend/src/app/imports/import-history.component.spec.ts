import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router, provideRouter } from '@angular/router';
import type { ImportSummary } from '@spanledger/shared';

import { ImportHistoryComponent } from './import-history.component';
import { importSummary } from './imports.testing';

// Material harnesses on a busy two-core machine can pass Jest's 5 s default.
jest.setTimeout(30_000);

@Component({ template: '' })
class BlankPage {}

const CHECKED_BEFORE_REFUSED_ROWS_WERE_COUNTED = { structures: { rows: 5, create: 3, update: 2, unchanged: 0 }, spans: { rows: 8, create: 8, update: 0, unchanged: 0 } };

/** Newest first, as the server sends them: a failed commit, one set aside, one imported (uploaded by a data load, checked before refused rows were counted), one still checked with refused rows. */
const HISTORY: ImportSummary[] = [
  importSummary({ id: 15, fileName: 'girders.csv', fileKind: 'csv', state: 'failed', counts: { girders: { rows: 9, create: 9, update: 0, unchanged: 0, refused: 0 } }, problemCount: 1, uploaded: { at: '2026-11-04T12:00:00.000Z', by: 'Greer Ashdown' } }),
  importSummary({ id: 14, state: 'discarded', counts: {}, uploaded: { at: '2026-11-03T12:00:00.000Z', by: 'Priya Halloran' } }),
  importSummary({ id: 12, state: 'committed', counts: CHECKED_BEFORE_REFUSED_ROWS_WERE_COUNTED, uploaded: { at: '2026-11-02T12:00:00.000Z', by: null }, committed: { at: '2026-11-02T12:10:00.000Z', by: 'Priya Halloran' } }),
  importSummary({ id: 11, fileName: 'findings.csv', fileKind: 'csv', counts: { findings: { rows: 1_500, create: 700, update: 0, unchanged: 0, refused: 800 } }, problemCount: 1_500, uploaded: { at: '2026-11-01T12:00:00.000Z', by: 'Tomasz Reyes' } }),
];

describe('ImportHistoryComponent', () => {
  let fixture: ComponentFixture<ImportHistoryComponent>;

  async function show(imports: readonly ImportSummary[], openedId: number | null = null): Promise<void> {
    TestBed.configureTestingModule({ imports: [ImportHistoryComponent], providers: [provideRouter([{ path: 'imports/:id', component: BlankPage }])] });
    fixture = TestBed.createComponent(ImportHistoryComponent);
    fixture.componentRef.setInput('imports', imports);
    fixture.componentRef.setInput('openedId', openedId);
    await fixture.whenStable();
  }

  const rowOf = (importId: number) => fixture.nativeElement.querySelector(`[data-testid="import-history-row"][data-import-id="${importId}"]`) as HTMLElement;

  it('lists every import, newest first: who, when, the file, what it held, its state and its problems', async () => {
    await show(HISTORY);

    const table = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatTableHarness);
    const rows = await Promise.all((await table.getRows()).map((row) => row.getCellTextByColumnName()));
    expect(rows.map(({ number, file, uploadedBy, state, counts, problems }) => [number, file, uploadedBy, state, counts, problems])).toEqual([
      ['15', 'girders.csv', 'Greer Ashdown', 'Not imported', 'Girders: 9 new, 0 changed, 0 unchanged', '1 problem CSV'],
      ['14', 'west-district.xlsx', 'Priya Halloran', 'Set aside', 'No rows', 'None'],
      ['12', 'west-district.xlsx', '—', 'Imported', 'Structures: 3 new, 2 changed, 0 unchanged; Spans: 8 new, 0 changed, 0 unchanged', 'None'],
      ['11', 'findings.csv', 'Tomasz Reyes', 'Checked', 'Findings: 700 new, 0 changed, 0 unchanged, 800 refused', '1,500 problems CSV'],
    ]);
    // Midday UTC falls on the same day in any zone a test machine is likely to use.
    expect(rows[0]!['uploadedAt']).toMatch(/Nov 4, 2026/);
    expect([...fixture.nativeElement.querySelectorAll('[data-testid="import-history-row"]')].map((row: Element) => row.getAttribute('data-state'))).toEqual(['failed', 'discarded', 'committed', 'checked']);
  });

  it('links the error report of an import with problems, and only then', async () => {
    await show(HISTORY);

    const report = rowOf(15).querySelector('[data-testid="history-report-link"]') as HTMLAnchorElement;
    expect(report.getAttribute('href')).toBe('api/imports/15/problems.csv');
    expect(report.getAttribute('aria-label')).toBe('Error report of girders.csv (CSV)');
    expect(rowOf(12).querySelector('[data-testid="history-report-link"]')).toBeNull();
  });

  it('opens an import from its row or its Open link, and marks the one open', async () => {
    await show(HISTORY, 12);
    const router = TestBed.inject(Router);

    expect(rowOf(12).classList).toContain('selected');
    expect(rowOf(12).querySelector('[data-testid="open-import"]')?.getAttribute('aria-current')).toBe('true');
    expect(rowOf(14).classList).not.toContain('selected');
    expect(rowOf(14).querySelector('[data-testid="open-import"]')?.getAttribute('href')).toBe('/imports/14');

    (rowOf(15).querySelector('.mat-column-file') as HTMLElement).click();
    await fixture.whenStable();
    expect(router.url).toBe('/imports/15');
  });

  it('says so when nothing has been imported yet', async () => {
    await show([]);

    expect(fixture.nativeElement.querySelector('[data-testid="import-history-empty"]')?.textContent?.trim()).toBe('No files have been imported yet.');
    expect(fixture.nativeElement.querySelector('[data-testid="import-history"]')).toBeNull();
  });
});
