import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router, provideRouter } from '@angular/router';
import type { ImportDetail, ImportProblem } from '@spanledger/shared';

import { ImportCheckComponent } from './import-check.component';
import { GIRDER_PROBLEMS, importDetail, importWithProblems } from './imports.testing';

// Material harnesses on a busy two-core machine can pass Jest's 5 s default.
jest.setTimeout(30_000);

describe('ImportCheckComponent', () => {
  let fixture: ComponentFixture<ImportCheckComponent>;
  let commits: number;
  let discards: number;

  async function show(detail: ImportDetail, inputs: { busyStep?: 'commit' | 'discard' | null; stepFailure?: string | null; progressTrouble?: string | null } = {}): Promise<void> {
    TestBed.configureTestingModule({ imports: [ImportCheckComponent], providers: [provideRouter([])] });
    fixture = TestBed.createComponent(ImportCheckComponent);
    fixture.componentRef.setInput('detail', detail);
    for (const [name, value] of Object.entries(inputs)) fixture.componentRef.setInput(name, value);
    commits = 0;
    discards = 0;
    fixture.componentInstance.commit.subscribe(() => commits++);
    fixture.componentInstance.discard.subscribe(() => discards++);
    await fixture.whenStable();
  }

  const element = (testId: string) => fixture.nativeElement.querySelector(`[data-testid="${testId}"]`) as HTMLElement | null;
  const textOf = (testId: string) => element(testId)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';

  async function tableRows(testId: string): Promise<Record<string, string>[]> {
    const table = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatTableHarness.with({ selector: `[data-testid="${testId}"]` }));
    return Promise.all((await table.getRows()).map((row) => row.getCellTextByColumnName()));
  }

  it('shows per template what the rows would create, change and leave alone, and offers Commit and Set aside to the uploader of a clean check', async () => {
    await show(importDetail());

    expect(textOf('import-state')).toBe('Checked');
    expect(textOf('import-meta')).toMatch(/^Uploaded Nov 2, 2026, .* by Priya Halloran$/);
    expect(await tableRows('import-check-summary')).toEqual([
      { template: 'Structures', rows: '5', create: '3', update: '2', unchanged: '0', refused: '0' },
      { template: 'Spans', rows: '8', create: '8', update: '0', unchanged: '0', refused: '0' },
    ]);
    expect([...fixture.nativeElement.querySelectorAll('[data-testid="import-count-row"]')].map((row: Element) => row.getAttribute('data-template'))).toEqual(['structures', 'spans']);
    expect(element('commit-ready')).not.toBeNull();
    expect(element('import-problems')).toBeNull();

    element('commit-import')!.click();
    element('discard-import')!.click();
    expect([commits, discards]).toEqual([1, 1]);
  });

  it('shows a check kept before refused rows were counted with the rows it judged and a dash for refused', async () => {
    await show(importDetail({ counts: { spans: { rows: 8, create: 8, update: 0, unchanged: 0 } } }));

    expect(await tableRows('import-check-summary')).toEqual([{ template: 'Spans', rows: '8', create: '8', update: '0', unchanged: '0', refused: '—' }]);
  });

  it('lists every problem by sheet, row, column and value, links the error report, and offers only Set aside', async () => {
    await show(importWithProblems());

    expect(textOf('problems-heading')).toBe('2 problems');
    expect(await tableRows('import-check-summary')).toEqual([{ template: 'Girders', rows: '9', create: '5', update: '1', unchanged: '1', refused: '2' }]);
    expect(await tableRows('import-problems')).toEqual([
      { sheet: 'girders', row: '4', column: 'concrete_strength_mpa', value: '520', message: 'must be at most 150 MPa' },
      { sheet: 'girders', row: '7', column: '(whole row)', value: '—', message: 'structure WD-0107 has no span 3' },
    ]);
    expect(fixture.nativeElement.querySelectorAll('[data-testid="import-problem-row"]')).toHaveLength(2);
    const report = element('problems-report-link') as HTMLAnchorElement;
    expect(report.getAttribute('href')).toBe('api/imports/13/problems.csv');
    expect(report.hasAttribute('download')).toBe(true);
    expect(textOf('problems-report')).toBe('Download the error report (CSV)');

    expect(element('commit-import')).toBeNull();
    expect(textOf('commit-blocked')).toBe('The file has 2 problems, so none of it can be imported. Fix the file and upload it again.');
    element('discard-import')!.click();
    expect(discards).toBe(1);
  });

  it('says when only the first problems are listed', async () => {
    const many: ImportProblem[] = Array.from({ length: 3 }, (_, index) => ({ ...GIRDER_PROBLEMS[0]!, row: index + 2 }));
    await show(importWithProblems({ problems: many, problemCount: 1_204, problemsTruncated: true }));

    expect(textOf('problems-heading')).toBe('1,204 problems');
    expect(textOf('problems-report')).toBe('Only the first 3 of 1,204 problems are listed here; the error report has every one. Download the error report (CSV)');
  });

  it('offers no step to someone who did not upload the file, and says why', async () => {
    await show(importDetail({ allowed: { commit: false, discard: false } }));

    expect(element('commit-import')).toBeNull();
    expect(element('discard-import')).toBeNull();
    expect(textOf('commit-blocked')).toBe('Only the person who uploaded this file may commit it or set it aside.');
  });

  it('holds both buttons while a step is on its way, and shows why a step failed', async () => {
    await show(importDetail(), { busyStep: 'commit', stepFailure: 'Nothing was imported. The server could not be reached.' });

    expect(textOf('commit-import')).toBe('Committing…');
    expect((element('commit-import') as HTMLButtonElement).disabled).toBe(true);
    expect((element('discard-import') as HTMLButtonElement).disabled).toBe(true);
    element('commit-import')!.click();
    expect(commits).toBe(0);
    expect(textOf('step-error')).toBe('Nothing was imported. The server could not be reached.');
  });

  it('shows how far a running commit is, rows written of rows to write', async () => {
    await show(importDetail({ state: 'committing', progress: { done: 3_120, total: 12_480 }, allowed: { commit: false, discard: false } }));

    expect(textOf('import-state')).toBe('Importing');
    expect(textOf('commit-progress-text')).toBe('Importing: 3,120 of 12,480 rows written (25 %)');
    const bar = element('commit-progress')!;
    expect(bar.getAttribute('mode')).toBe('determinate');
    expect(bar.getAttribute('aria-valuenow')).toBe('25');
    expect(element('commit-blocked')).toBeNull();
    expect(element('commit-import')).toBeNull();
  });

  it('shows a committed import with what it wrote, and links the structures now due for re-rating', async () => {
    await show(importDetail({ state: 'committed', committed: { at: '2026-11-02T12:05:00.000Z', by: 'Priya Halloran' }, allowed: { commit: false, discard: false } }));

    expect(textOf('import-state')).toBe('Imported');
    const outcome = [...element('import-committed')!.querySelectorAll('p')].map((line) => line.textContent?.replace(/\s+/g, ' ').trim());
    expect(outcome[0]).toMatch(/^Imported Nov 2, 2026, .*\. Structures: 3 new, 2 changed, 0 unchanged; Spans: 8 new, 0 changed, 0 unchanged\.$/);
    expect(outcome[1]).toBe('The spans it touched are due for re-rating. See them on the network map');
    element('open-network-map')!.click();
    await fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/?reratingDue=true');
  });

  it('says nothing was written when the commit failed or the import was set aside', async () => {
    await show(importWithProblems({ state: 'failed', allowed: { commit: false, discard: false } }));
    expect(textOf('import-failed')).toBe('Nothing was imported: writing the file into the register found 2 problems, listed below. Fix the file and upload it again.');
    expect(fixture.nativeElement.querySelectorAll('[data-testid="import-problem-row"]')).toHaveLength(2);
    expect(element('discard-import')).toBeNull();

    TestBed.resetTestingModule();
    await show(importDetail({ state: 'discarded', allowed: { commit: false, discard: false } }));
    expect(textOf('import-discarded')).toBe('Set aside. Nothing from this file was written.');
  });
});
