import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';

import { photoSummary } from './inspections.testing';
import { PhotosComponent } from './photos.component';

jest.setTimeout(30_000);

describe('PhotosComponent', () => {
  let fixture: ComponentFixture<PhotosComponent>;
  let server: HttpTestingController;
  let changes: number;

  async function show(options: { findingId?: number | null; editable?: boolean } = {}): Promise<void> {
    TestBed.configureTestingModule({ imports: [PhotosComponent], providers: [provideHttpClient(), provideHttpClientTesting()] });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(PhotosComponent);
    fixture.componentRef.setInput('inspectionId', 77);
    fixture.componentRef.setInput('findingId', options.findingId ?? null);
    fixture.componentRef.setInput('photos', [photoSummary(), photoSummary({ id: 89, originalName: 'girder-2-soffit.jpg' })]);
    fixture.componentRef.setInput('editable', options.editable ?? true);
    changes = 0;
    fixture.componentInstance.changed.subscribe(() => changes++);
    await fixture.whenStable();
  }

  afterEach(() => server.verify());

  function element(testId: string): HTMLElement | null {
    return fixture.nativeElement.querySelector(`[data-testid="${testId}"]`);
  }

  async function choosePhoto(name: string, type = 'image/jpeg'): Promise<void> {
    const input = element('photo-input') as HTMLInputElement;
    Object.defineProperty(input, 'files', { configurable: true, value: [new File(['fake image bytes'], name, { type })] });
    input.dispatchEvent(new Event('change'));
    await fixture.whenStable();
  }

  function upload(): TestRequest {
    return server.expectOne((request) => request.method === 'POST' && request.url === 'api/inspections/77/photos');
  }

  it('shows thumbnails that open the full photo', async () => {
    await show({ editable: false });

    const links = [...fixture.nativeElement.querySelectorAll('[data-testid="photo-thumbnail"]')] as HTMLAnchorElement[];
    expect(links.map((link) => link.getAttribute('href'))).toEqual(['api/photos/88', 'api/photos/89']);
    expect(links[1]!.querySelector('img')!.getAttribute('src')).toBe('api/photos/89/thumbnail');
    expect(links[1]!.querySelector('img')!.getAttribute('alt')).toBe('Photo girder-2-soffit.jpg');
    expect(element('photo-input')).toBeNull();
    expect(element('delete-photo')).toBeNull();
  });

  it('takes a photo with the camera and uploads it for the finding, with a progress bar', async () => {
    await show({ findingId: 601 });
    const input = element('photo-input') as HTMLInputElement;
    expect(input.getAttribute('accept')).toBe('image/*');
    expect(input.getAttribute('capture')).toBe('environment');

    await choosePhoto('spall.jpg');
    const request = upload();
    const body = request.request.body as FormData;
    expect(body.get('findingId')).toBe('601');
    expect((body.get('photo') as File).name).toBe('spall.jpg');
    expect(request.request.reportProgress).toBe(true);

    request.event({ type: HttpEventType.UploadProgress, loaded: 40_000, total: 100_000 });
    await fixture.whenStable();
    const bar = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatProgressBarHarness.with({ selector: '[data-testid="upload-progress"]' }));
    expect(await bar.getValue()).toBe(40);
    expect(fixture.nativeElement.textContent).toContain('Uploading spall.jpg: 40 %');

    request.flush(photoSummary({ id: 90, findingId: 601 }));
    await fixture.whenStable();
    expect(element('upload-progress')).toBeNull();
    expect(changes).toBe(1);
  });

  it('says plainly when the file is not a photo the server accepts (415)', async () => {
    await show();
    await choosePhoto('notes.pdf', 'application/pdf');

    const request = upload();
    expect((request.request.body as FormData).has('findingId')).toBe(false);
    request.flush(
      { error: { code: 'unsupported_media_type', message: 'photo: expected a JPEG, PNG or WebP image' }, requestId: 'r-31' },
      { status: 415, statusText: 'Unsupported Media Type' },
    );
    await fixture.whenStable();

    expect(element('photo-error')?.textContent).toContain('That file is not a photo the server accepts: upload a JPEG, PNG or WebP image. photo: expected a JPEG, PNG or WebP image (request r-31)');
    expect(changes).toBe(0);
  });

  it('says plainly when the photo is too large (413), also without a message from the server', async () => {
    await show();
    await choosePhoto('huge.jpg');
    upload().flush('Request Entity Too Large', { status: 413, statusText: 'Payload Too Large' });
    await fixture.whenStable();

    expect(element('photo-error')?.textContent).toContain('The photo is too large to upload. Choose a smaller file');
  });

  it('deletes a photo for its author', async () => {
    await show();
    (fixture.nativeElement.querySelector('[data-testid="delete-photo"]') as HTMLButtonElement).click();
    server.expectOne((request) => request.method === 'DELETE' && request.url === 'api/photos/88').flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect(changes).toBe(1);
  });
});
