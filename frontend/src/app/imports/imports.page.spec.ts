import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { ActivatedRoute, ParamMap, Router, convertToParamMap, provideRouter } from '@angular/router';
import type { ImportDetail, ImportSummary, SignedInUser } from '@spanledger/shared';
import { BehaviorSubject } from 'rxjs';

import { SessionStore } from '../session/session.store';
import { COMMIT_POLL_MS, ImportsPage } from './imports.page';
import { INSPECTOR, MANAGER, RATER, importDetail, importSummary, importWithProblems, serverError } from './imports.testing';

// Each case drives the whole page; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

@Component({ template: '' })
class BlankPage {}

const HISTORY: ImportSummary[] = [importSummary(), importSummary({ id: 9, fileName: 'structures.csv', fileKind: 'csv', state: 'committed', committed: { at: '2026-10-01T12:00:00.000Z', by: RATER.displayName } })];

/** Commit of import 12 as a background job: 12,480 rows, the counts of `importSummary` standing for them. */
const committing = (done: number): ImportDetail => importDetail({ state: 'committing', progress: { done, total: 12_480 }, allowed: { commit: false, discard: false }, version: 2 });
const committed = (): ImportDetail => importDetail({ state: 'committed', committed: { at: '2026-11-02T12:10:00.000Z', by: RATER.displayName }, allowed: { commit: false, discard: false }, version: 3 });

/** Fakes the clock but not the microtasks the router and HttpClient lean on. */
const fakeClock = () => jest.useFakeTimers({ doNotFake: ['queueMicrotask', 'nextTick', 'setImmediate'] });

describe('ImportsPage', () => {
  let fixture: ComponentFixture<ImportsPage>;
  let server: HttpTestingController;
  let params: BehaviorSubject<ParamMap>;

  function create(user: SignedInUser, importId: number | null = null): void {
    params = new BehaviorSubject(convertToParamMap(importId === null ? {} : { id: String(importId) }));
    TestBed.configureTestingModule({
      imports: [ImportsPage],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([
          { path: '', component: BlankPage },
          { path: 'imports', component: BlankPage },
          { path: 'imports/:id', component: BlankPage },
        ]),
        { provide: ActivatedRoute, useValue: { paramMap: params } },
        { provide: SessionStore, useValue: { user: signal(user) } },
      ],
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ImportsPage);
  }

  afterEach(() => {
    jest.useRealTimers();
    server.verify();
  });

  const element = (testId: string) => fixture.nativeElement.querySelector(`[data-testid="${testId}"]`) as HTMLElement | null;
  const all = (testId: string) => [...fixture.nativeElement.querySelectorAll(`[data-testid="${testId}"]`)] as HTMLElement[];
  const textOf = (testId: string) => element(testId)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const request = (method: string, url: string): TestRequest => server.expectOne((each) => each.method === method && each.url === url);
  const historyRequest = () => request('GET', 'api/imports');

  /** Opens the page and answers its first requests: the history, and the import the address names. */
  async function openPage(user: SignedInUser, opened: ImportDetail | null = null): Promise<void> {
    create(user, opened?.id ?? null);
    await fixture.whenStable();
    historyRequest().flush(HISTORY);
    if (opened) request('GET', `api/imports/${opened.id}`).flush(opened);
    await fixture.whenStable();
  }

  /** The same, for a fake clock: change detection is run by hand. */
  function openPageNow(user: SignedInUser, opened: ImportDetail): void {
    create(user, opened.id);
    fixture.detectChanges();
    historyRequest().flush(HISTORY);
    request('GET', `api/imports/${opened.id}`).flush(opened);
    fixture.detectChanges();
  }

  async function choose(file: File): Promise<void> {
    const input = element('import-file-input') as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [file], configurable: true });
    input.dispatchEvent(new Event('change'));
    await fixture.whenStable();
  }

  it('lists the history, offers every template as CSV and XLSX, and the upload', async () => {
    create(RATER);
    await fixture.whenStable();
    expect(element('history-loading')).not.toBeNull();
    historyRequest().flush(HISTORY);
    await fixture.whenStable();

    expect(element('history-loading')).toBeNull();
    expect(all('import-history-row').map((row) => row.getAttribute('data-import-id'))).toEqual(['12', '9']);
    expect(all('template-download').map((row) => row.getAttribute('data-template'))).toEqual(['structures', 'spans', 'girders', 'strand-rows', 'findings', 'prior-ratings']);
    expect(all('template-csv').map((link) => link.getAttribute('href'))).toContain('api/import-templates/strand-rows.csv');
    expect(all('template-xlsx').map((link) => link.getAttribute('href'))).toContain('api/import-templates/girders.xlsx');
    expect(element('template-workbook')!.getAttribute('href')).toBe('api/import-templates/all.xlsx');
    // A rating engineer imports inventory, findings and prior ratings alike.
    expect(all('template-not-yours')).toHaveLength(0);
    expect(element('import-file-input')).not.toBeNull();
    expect(element('opened-import')).toBeNull();
  });

  it('marks the templates a role does not import: an inspector brings findings only, a manager no findings', async () => {
    await openPage(INSPECTOR);
    expect(textOf('page-intro')).toContain('Your role may import findings.');
    const notYours = () => all('template-download').filter((row) => row.querySelector('[data-testid="template-not-yours"]')).map((row) => row.getAttribute('data-template'));
    expect(notYours()).toEqual(['structures', 'spans', 'girders', 'strand-rows', 'prior-ratings']);
    expect(element('import-file-input')).not.toBeNull();

    TestBed.resetTestingModule();
    await openPage(MANAGER);
    expect(notYours()).toEqual(['findings']);
  });

  it('uploads a file with its progress, shows the check with every problem, and names the import in the address', async () => {
    await openPage(RATER);
    await choose(new File(['structure_number,span_index,girder_number\n'], 'girders.csv', { type: 'text/csv' }));
    (element('upload-file') as HTMLButtonElement).click();
    await fixture.whenStable();
    const upload = request('POST', 'api/imports');
    expect((upload.request.body as FormData).get('template')).toBe('girders');
    upload.event({ type: HttpEventType.UploadProgress, loaded: 40, total: 100 });
    await fixture.whenStable();
    expect(textOf('upload-progress-text')).toBe('Uploading girders.csv: 40 %');

    upload.flush(importWithProblems(), { status: 201, statusText: 'Created' });
    await fixture.whenStable();

    const check = element('import-check')!;
    expect(check.getAttribute('data-import-id')).toBe('13');
    expect(textOf('import-state')).toBe('Checked');
    expect(all('import-count-row').map((row) => row.getAttribute('data-template'))).toEqual(['girders']);
    const cells = (row: HTMLElement) => [...row.querySelectorAll('td')].map((cell) => cell.textContent?.trim());
    expect(all('import-problem-row').map(cells)).toEqual([
      ['girders', '4', 'concrete_strength_mpa', '520', 'must be at most 150 MPa'],
      ['girders', '7', '(whole row)', '—', 'structure WD-0107 has no span 3'],
    ]);
    expect(element('problems-report-link')?.getAttribute('href')).toBe('api/imports/13/problems.csv');
    expect(element('commit-import')).toBeNull();
    expect(element('discard-import')).not.toBeNull();
    expect(TestBed.inject(Router).url).toBe('/imports/13');

    // The history is read again with the new import in it.
    historyRequest().flush([importWithProblems(), ...HISTORY]);
    await fixture.whenStable();
    expect(all('import-history-row').map((row) => row.getAttribute('data-import-id'))).toEqual(['13', '12', '9']);
    expect(element('import-history-row')?.classList).toContain('selected');

    // The address now names the import just shown: it is not asked for again.
    params.next(convertToParamMap({ id: '13' }));
    await fixture.whenStable();
    server.expectNone('api/imports/13');
  });

  it('keeps a check just made rather than a slower load of the import open before', async () => {
    create(RATER, 9);
    await fixture.whenStable();
    historyRequest().flush(HISTORY);
    const slowLoad = request('GET', 'api/imports/9');

    await choose(new File(['a'], 'west-district.xlsx'));
    (element('upload-file') as HTMLButtonElement).click();
    await fixture.whenStable();
    request('POST', 'api/imports').flush(importDetail(), { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    historyRequest().flush([importDetail(), ...HISTORY]);

    expect(slowLoad.cancelled).toBe(true);
    expect(element('import-check')?.getAttribute('data-import-id')).toBe('12');
  });

  it('opens the import the address names, and another when the address changes', async () => {
    create(RATER, 12);
    await fixture.whenStable();
    historyRequest().flush(HISTORY);
    expect(element('import-loading')).not.toBeNull();
    request('GET', 'api/imports/12').flush(importDetail());
    await fixture.whenStable();
    expect(element('import-loading')).toBeNull();
    expect(element('import-check')?.getAttribute('data-import-id')).toBe('12');
    expect(element('commit-import')).not.toBeNull();

    params.next(convertToParamMap({ id: '9' }));
    await fixture.whenStable();
    request('GET', 'api/imports/9').flush(importDetail({ ...HISTORY[1]!, allowed: { commit: false, discard: false } }));
    await fixture.whenStable();
    expect(element('import-check')?.getAttribute('data-import-id')).toBe('9');
    expect(textOf('import-state')).toBe('Imported');
  });

  it('says so when the address names no import, or one that cannot be read', async () => {
    create(RATER);
    params.next(convertToParamMap({ id: 'latest' }));
    await fixture.whenStable();
    historyRequest().flush(HISTORY);
    await fixture.whenStable();
    expect(textOf('import-error')).toBe('"latest" is not an import id: the address should end in a number, such as /imports/12.');

    params.next(convertToParamMap({ id: '404' }));
    await fixture.whenStable();
    request('GET', 'api/imports/404').flush(serverError('not_found', 'There is no import with id 404'), { status: 404, statusText: 'Not Found' });
    await fixture.whenStable();
    expect(textOf('import-error')).toBe('Import 404 could not be loaded. There is no import with id 404 (request r-42)');
  });

  it('commits a large file: 202 committing, then asks every second and shows the rows written until it is committed', () => {
    fakeClock();
    openPageNow(RATER, importDetail());

    element('commit-import')!.click();
    fixture.detectChanges();
    const commit = request('POST', 'api/imports/12/commit');
    expect(commit.request.body).toEqual({ version: 1 });
    expect(textOf('commit-import')).toBe('Committing…');
    commit.flush(committing(0), { status: 202, statusText: 'Accepted' });
    historyRequest().flush(HISTORY);
    fixture.detectChanges();

    expect(textOf('commit-progress-text')).toBe('Importing: 0 of 12,480 rows written (0 %)');
    expect(element('commit-progress')?.getAttribute('aria-valuenow')).toBe('0');
    expect(element('commit-import')).toBeNull();
    expect(element('import-history-row')?.getAttribute('data-state')).toBe('committing');

    jest.advanceTimersByTime(COMMIT_POLL_MS - 1);
    server.expectNone('api/imports/12');
    jest.advanceTimersByTime(1);
    request('GET', 'api/imports/12').flush(committing(6_240));
    fixture.detectChanges();
    expect(textOf('commit-progress-text')).toBe('Importing: 6,240 of 12,480 rows written (50 %)');
    expect(element('commit-progress')?.getAttribute('aria-valuenow')).toBe('50');

    jest.advanceTimersByTime(COMMIT_POLL_MS);
    request('GET', 'api/imports/12').flush(committed());
    fixture.detectChanges();
    expect(element('commit-progress')).toBeNull();
    expect(textOf('import-state')).toBe('Imported');
    expect(element('import-committed')).not.toBeNull();
    // Once it is written the history is read again, and nobody asks for progress any more.
    historyRequest().flush([committed(), HISTORY[1]!]);
    jest.advanceTimersByTime(5 * COMMIT_POLL_MS);
    server.expectNone('api/imports/12');
  });

  it('needs no progress when the commit is written at once (200 committed)', () => {
    fakeClock();
    openPageNow(RATER, importDetail());

    element('commit-import')!.click();
    request('POST', 'api/imports/12/commit').flush(committed());
    historyRequest().flush([committed(), HISTORY[1]!]);
    fixture.detectChanges();

    expect(textOf('import-state')).toBe('Imported');
    expect(element('commit-progress')).toBeNull();
    jest.advanceTimersByTime(5 * COMMIT_POLL_MS);
    server.expectNone('api/imports/12');
  });

  it('follows a commit already running when its import is opened, and stops asking once the page is gone', () => {
    fakeClock();
    openPageNow(MANAGER, committing(1_000));
    expect(textOf('commit-progress-text')).toBe('Importing: 1,000 of 12,480 rows written (8 %)');

    jest.advanceTimersByTime(COMMIT_POLL_MS);
    request('GET', 'api/imports/12').flush(committing(2_000));

    fixture.destroy();
    jest.advanceTimersByTime(5 * COMMIT_POLL_MS);
    server.expectNone('api/imports/12');
  });

  it('stops following one import when another is opened', () => {
    fakeClock();
    openPageNow(RATER, committing(1_000));

    params.next(convertToParamMap({ id: '9' }));
    request('GET', 'api/imports/9').flush(importDetail({ ...HISTORY[1]!, allowed: { commit: false, discard: false } }));
    jest.advanceTimersByTime(5 * COMMIT_POLL_MS);
    server.expectNone('api/imports/12');
  });

  it('keeps asking when the progress cannot be read for a moment, and says so until it can', () => {
    fakeClock();
    openPageNow(RATER, committing(1_000));

    jest.advanceTimersByTime(COMMIT_POLL_MS);
    request('GET', 'api/imports/12').error(new ProgressEvent('error'), { status: 0 });
    fixture.detectChanges();
    expect(textOf('progress-trouble')).toBe(
      'The progress could not be read just now (The server could not be reached. Check your connection and try again.); asking again. The import goes on meanwhile.',
    );
    expect(textOf('commit-progress-text')).toBe('Importing: 1,000 of 12,480 rows written (8 %)');

    jest.advanceTimersByTime(COMMIT_POLL_MS);
    request('GET', 'api/imports/12').flush(committing(3_120));
    fixture.detectChanges();
    expect(element('progress-trouble')).toBeNull();
    expect(textOf('commit-progress-text')).toBe('Importing: 3,120 of 12,480 rows written (25 %)');
    fixture.destroy();
  });

  it('stops asking when the server refuses to tell, as when the session has ended', () => {
    fakeClock();
    openPageNow(RATER, committing(1_000));

    jest.advanceTimersByTime(COMMIT_POLL_MS);
    request('GET', 'api/imports/12').flush(serverError('sign_in_required', 'Sign in to continue'), { status: 401, statusText: 'Unauthorized' });
    fixture.detectChanges();
    expect(textOf('progress-trouble')).toBe('The progress could not be read: Sign in to continue (request r-42) Reload the page to see where the import is.');
    jest.advanceTimersByTime(5 * COMMIT_POLL_MS);
    server.expectNone('api/imports/12');
  });

  it('says plainly when the file was imported already by the time of the commit', async () => {
    await openPage(RATER, importDetail());
    element('commit-import')!.click();
    await fixture.whenStable();
    const message = 'Import 12 holds a file whose bytes were imported at the same moment by another import; nothing was written';
    request('POST', 'api/imports/12/commit').flush(serverError('already_exists', message, { fields: [{ field: 'file', message: 'imported already' }] }), { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();

    expect(textOf('step-error')).toBe(`Nothing was imported. ${message} (request r-42)`);
    expect((element('commit-import') as HTMLButtonElement).disabled).toBe(false);
  });

  it('shows the import as it is now when it changed after it was opened', async () => {
    await openPage(RATER, importDetail());
    element('commit-import')!.click();
    await fixture.whenStable();
    const now = importDetail({ state: 'discarded', allowed: { commit: false, discard: false }, version: 2 });
    request('POST', 'api/imports/12/commit').flush(serverError('version_conflict', 'Import 12 changed after you read it', { current: now }), { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();

    expect(textOf('step-error')).toBe('Nothing was imported. The import changed after you opened it; it is shown below as it is now.');
    expect(textOf('import-state')).toBe('Set aside');
    expect(element('commit-import')).toBeNull();
  });

  it('sets a checked import aside', async () => {
    await openPage(RATER, importWithProblems());
    element('discard-import')!.click();
    await fixture.whenStable();
    const discard = request('POST', 'api/imports/13/discard');
    expect(discard.request.body).toEqual({ version: 1 });
    expect(textOf('discard-import')).toBe('Setting aside…');
    discard.flush(importWithProblems({ state: 'discarded', allowed: { commit: false, discard: false }, version: 2 }));
    await fixture.whenStable();
    historyRequest().flush(HISTORY);
    await fixture.whenStable();

    expect(textOf('import-discarded')).toBe('Set aside. Nothing from this file was written.');
    expect(element('discard-import')).toBeNull();
  });

  it('says so when the history cannot be loaded', async () => {
    create(RATER);
    await fixture.whenStable();
    historyRequest().flush(serverError('internal_error', 'Something went wrong on our side.'), { status: 500, statusText: 'Server Error' });
    await fixture.whenStable();

    expect(textOf('history-error')).toBe('The import history could not be loaded. Something went wrong on our side. (request r-42)');
    expect(element('import-history')).toBeNull();
  });
});
