import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { provideRouter } from '@angular/router';
import type { ImportDetail } from '@spanledger/shared';

import { ImportUploadComponent } from './import-upload.component';
import { importDetail, importWithProblems, serverError } from './imports.testing';

// Material harnesses on a busy two-core machine can pass Jest's 5 s default.
jest.setTimeout(30_000);

describe('ImportUploadComponent', () => {
  let fixture: ComponentFixture<ImportUploadComponent>;
  let loader: HarnessLoader;
  let server: HttpTestingController;
  let checked: ImportDetail[];
  let cancelled: number;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [ImportUploadComponent],
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])],
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ImportUploadComponent);
    loader = TestbedHarnessEnvironment.loader(fixture);
    checked = [];
    cancelled = 0;
    fixture.componentInstance.checked.subscribe((detail) => checked.push(detail));
    fixture.componentInstance.cancelled.subscribe(() => cancelled++);
    await fixture.whenStable();
  });

  afterEach(() => server.verify());

  const element = (testId: string) => fixture.nativeElement.querySelector(`[data-testid="${testId}"]`) as HTMLElement | null;
  const textOf = (testId: string) => element(testId)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const uploadButton = () => element('upload-file') as HTMLButtonElement;

  const csvFile = (name: string) => new File(['structure_number,span_index\nWD-0107,1\n'], name, { type: 'text/csv' });
  const xlsxFile = (name: string) => new File([new Uint8Array([0x50, 0x4b, 0x03, 0x04])], name, { type: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet' });

  async function choose(file: File): Promise<void> {
    const input = element('import-file-input') as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [file], configurable: true });
    input.dispatchEvent(new Event('change'));
    await fixture.whenStable();
  }

  async function send(): Promise<TestRequest> {
    uploadButton().click();
    await fixture.whenStable();
    return server.expectOne((request) => request.method === 'POST' && request.url === 'api/imports');
  }

  async function answer(request: TestRequest, body: string | object, status = 201): Promise<void> {
    request.flush(body, { status, statusText: status === 201 ? 'Created' : 'Refused' });
    await fixture.whenStable();
  }

  it('takes the template of a CSV from its name, and shows the bytes going out, then the check running', async () => {
    await choose(csvFile('Strand rows.csv'));
    expect(textOf('chosen-file')).toBe('Strand rows.csv');
    const select = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="import-template"]' }));
    expect(await select.getValueText()).toBe('Strand rows');
    expect(textOf('import-template-hint')).toBe("The file's name says strand rows; choose another template if its rows follow one.");
    expect(uploadButton().disabled).toBe(false);

    const request = await send();
    const form = request.request.body as FormData;
    expect(form.get('template')).toBe('strand-rows');
    expect((form.get('file') as File).name).toBe('Strand rows.csv');
    expect(request.request.reportProgress).toBe(true);

    request.event({ type: HttpEventType.UploadProgress, loaded: 3_000, total: 12_000 });
    await fixture.whenStable();
    expect(textOf('upload-progress-text')).toBe('Uploading Strand rows.csv: 25 %');
    expect(element('upload-progress')?.getAttribute('aria-valuenow')).toBe('25');
    expect(element('upload-file')).toBeNull();

    request.event({ type: HttpEventType.UploadProgress, loaded: 12_000, total: 12_000 });
    await fixture.whenStable();
    expect(element('upload-progress')).toBeNull();
    expect(element('check-progress')).not.toBeNull();
    expect(textOf('upload-progress-text')).toBe('Checking Strand rows.csv: every row against its template and the register…');

    await answer(request, importWithProblems());
    expect(checked.map((detail) => detail.id)).toEqual([13]);
    expect(element('check-progress')).toBeNull();
    expect(textOf('chosen-file')).toBe('No file chosen');
    expect(element('import-template')).toBeNull();
  });

  it('asks which template a CSV holds when its name names none, and sends the one chosen', async () => {
    await choose(csvFile('west district export.csv'));
    expect(textOf('import-template-hint')).toBe('A CSV file holds the rows of one template: choose which.');
    expect(uploadButton().disabled).toBe(true);

    const select = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="import-template"]' }));
    await select.open();
    await select.clickOptions({ text: 'Girders' });
    expect(uploadButton().disabled).toBe(false);

    const request = await send();
    expect((request.request.body as FormData).get('template')).toBe('girders');
    await answer(request, importWithProblems());
    expect(checked).toHaveLength(1);
  });

  it('sends an XLSX without a template: its sheets name theirs', async () => {
    await choose(xlsxFile('west-district.xlsx'));
    expect(element('import-template')).toBeNull();

    const request = await send();
    const form = request.request.body as FormData;
    expect(form.has('template')).toBe(false);
    expect((form.get('file') as File).name).toBe('west-district.xlsx');
    await answer(request, importDetail());
    expect(checked.map((detail) => detail.id)).toEqual([12]);
  });

  it('takes a file dropped on the drop zone', async () => {
    const zone = element('import-drop-zone')!;
    const over = new Event('dragover', { cancelable: true });
    zone.dispatchEvent(over);
    await fixture.whenStable();
    expect(over.defaultPrevented).toBe(true);
    expect(zone.classList).toContain('dragging');

    const drop = new Event('drop', { cancelable: true });
    Object.defineProperty(drop, 'dataTransfer', { value: { files: [csvFile('spans.csv')] } });
    zone.dispatchEvent(drop);
    await fixture.whenStable();

    expect(drop.defaultPrevented).toBe(true);
    expect(zone.classList).not.toContain('dragging');
    expect(textOf('chosen-file')).toBe('spans.csv');
    const select = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="import-template"]' }));
    expect(await select.getValueText()).toBe('Spans');
  });

  it('says plainly that a file was imported already, linking the earlier import', async () => {
    await choose(xlsxFile('west-district.xlsx'));
    const message = 'This file was imported already: import 5 of 2026-10-01 by Priya Halloran holds the same bytes';
    await answer(await send(), serverError('already_exists', message, { importId: 5, fields: [{ field: 'file', message: 'imported already' }] }), 409);

    expect(textOf('upload-error')).toBe(`${message} (request r-42) Open import 5`);
    expect(element('earlier-import')?.getAttribute('href')).toBe('/imports/5');
    expect(checked).toEqual([]);
    // The file stays chosen, to be sent again once the cause is dealt with.
    expect(textOf('chosen-file')).toBe('west-district.xlsx');
    expect(uploadButton().disabled).toBe(false);
  });

  it('says plainly that a file is too large or not a spreadsheet', async () => {
    await choose(xlsxFile('west-district.xlsx'));
    await answer(await send(), serverError('payload_too_large', 'The file is larger than the 20 MB an import may have; split it into smaller files'), 413);
    expect(textOf('upload-error')).toBe('The file is too large to import. The file is larger than the 20 MB an import may have; split it into smaller files (request r-42)');

    await answer(await send(), serverError('unsupported_media_type', 'The file is a legacy Excel workbook (.xls). Upload a CSV (UTF-8) or an Excel workbook (.xlsx).'), 415);
    expect(textOf('upload-error')).toBe(
      'That file is not a CSV or XLSX spreadsheet the server can read. The file is a legacy Excel workbook (.xls). Upload a CSV (UTF-8) or an Excel workbook (.xlsx). (request r-42)',
    );
    expect(element('earlier-import')).toBeNull();
  });

  it('says so when a proxy refuses a large file without the server’s words', async () => {
    await choose(xlsxFile('west-district.xlsx'));
    await answer(await send(), '<html>413 Request Entity Too Large</html>', 413);
    expect(textOf('upload-error')).toBe('The file is too large to import. Split it into smaller files and upload each.');
  });

  it('names the form field the server refused', async () => {
    await choose(csvFile('spans.csv'));
    const fields = [{ field: 'template', message: 'a CSV file holds one template: choose which, or name the file after it (structures.csv, spans.csv, …)' }];
    await answer(await send(), serverError('validation_failed', 'A body field is wrong', { fields }), 400);
    expect(textOf('upload-error')).toBe('The file was not checked. Template: a CSV file holds one template: choose which, or name the file after it (structures.csv, spans.csv, …).');
  });

  it('stops an upload when asked, and says the history may need reading again', async () => {
    await choose(xlsxFile('west-district.xlsx'));
    const request = await send();
    request.event({ type: HttpEventType.UploadProgress, loaded: 10, total: 100 });
    await fixture.whenStable();

    (element('cancel-upload') as HTMLButtonElement).click();
    await fixture.whenStable();

    expect(request.cancelled).toBe(true);
    expect(cancelled).toBe(1);
    expect(element('upload-progress')).toBeNull();
    expect(uploadButton().disabled).toBe(false);
    expect(checked).toEqual([]);
  });
});
