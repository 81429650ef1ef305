import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { SpanDetail } from '@spanledger/shared';

import { UnitsStore } from '../units/units.store';
import { spanDetail } from './inventory.testing';
import { SpanFormComponent } from './span-form.component';

// Each case drives a whole page through Material harnesses; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

describe('SpanFormComponent', () => {
  let fixture: ComponentFixture<SpanFormComponent>;
  let loader: HarnessLoader;
  let server: HttpTestingController;
  let saved: SpanDetail[];

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [SpanFormComponent], providers: [provideHttpClient(), provideHttpClientTesting()] });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SpanFormComponent);
    fixture.componentRef.setInput('span', spanDetail());
    saved = [];
    fixture.componentInstance.saved.subscribe((span) => saved.push(span));
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => {
    server.verify();
    localStorage.clear();
  });

  async function field(testId: string): Promise<MatInputHarness> {
    return loader.getHarness(MatInputHarness.with({ selector: `[data-testid="field-${testId}"]` }));
  }

  async function click(testId: string): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ selector: `[data-testid="${testId}"]` }))).click();
  }

  async function errorsUnder(label: string): Promise<string[]> {
    return (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }))).getTextErrors();
  }

  function patch(): TestRequest {
    return server.expectOne((request) => request.method === 'PATCH' && request.url === 'api/spans/301');
  }

  it('sends barriers and diaphragms typed in US customary units as SI lists', async () => {
    TestBed.inject(UnitsStore).use('us');
    await click('add-barrier');
    await (await field('barriers.2.loadKnM')).setValue('1');
    await click('add-diaphragm');
    await (await field('diaphragms.1.xM')).setValue('75');
    await (await field('diaphragms.1.loadKn')).setValue('3');
    await click('save-span');

    const request = patch();
    expect(request.request.body).toEqual({
      version: 2,
      barriers: [{ loadKnM: 7.3 }, { loadKnM: 7.3 }, { loadKnM: 14.593904 }],
      diaphragms: [
        { xM: 15.24, loadKn: 12 },
        { xM: 22.86, loadKn: 13.344666 },
      ],
    });
    request.flush(spanDetail({ version: 3 }));
    expect(saved).toHaveLength(1);
  });

  it('refuses a diaphragm left beyond a shortened span, in the words of the server rule', async () => {
    await (await field('lengthM')).setValue('12');
    await click('save-span');

    server.expectNone((request) => request.method === 'PATCH');
    expect(await errorsUnder('Diaphragm 1 from the start')).toEqual(['lies beyond the span (12 m)']);
  });

  it('asks for the values a rating needs and names the bad ones', async () => {
    await (await field('lengthM')).setValue('');
    await (await field('deckThicknessMm')).setValue('700');
    await (await field('barriers.0.loadKnM')).setValue('0');
    await click('save-span');

    server.expectNone((request) => request.method === 'PATCH');
    expect(await errorsUnder('Length')).toEqual(['is required']);
    expect(await errorsUnder('Deck thickness')).toEqual(['must be at most 600 mm']);
    expect(await errorsUnder('Barrier 1 weight')).toEqual([expect.stringMatching(/> 0/)]);
  });

  it('sends no wearing surface once the box is cleared, and removed barriers as a shorter list', async () => {
    await (await loader.getHarness(MatCheckboxHarness.with({ selector: '[data-testid="field-hasWearingSurface"]' }))).uncheck();
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Remove barrier 2"]' }))).click();
    await click('save-span');

    expect(patch().request.body).toEqual({ version: 2, wearingSurface: null, barriers: [{ loadKnM: 7.3 }] });
  });

  it('sends nothing when nothing has changed, also after a round trip through the other units', async () => {
    const units = TestBed.inject(UnitsStore);
    units.use('us');
    await fixture.whenStable();
    units.use('si');
    await click('save-span');

    server.expectNone((request) => request.method === 'PATCH');
    expect(fixture.nativeElement.querySelector('[data-testid="form-nothing-changed"]')).not.toBeNull();
  });

  it('offers a reload when someone else changed the span, and starts again from the span given', async () => {
    let reloads = 0;
    fixture.componentInstance.reloadRequested.subscribe(() => reloads++);
    await (await field('haunchMm')).setValue('30');
    await click('save-span');
    patch().flush({ error: { code: 'version_conflict', message: 'Span 1 was changed by someone else', details: { current: spanDetail({ version: 3 }) } } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="form-conflict"]').textContent).toContain('Someone else changed this span');

    await click('reload-after-conflict');
    expect(reloads).toBe(1);
    fixture.componentRef.setInput('span', spanDetail({ haunchMm: 40, version: 3 }));
    await fixture.whenStable();

    expect(fixture.nativeElement.querySelector('[data-testid="form-conflict"]')).toBeNull();
    expect(await (await field('haunchMm')).getValue()).toBe('40');
  });

  it('says when the save failed for a reason that is not a field', async () => {
    await (await field('haunchMm')).setValue('30');
    await click('save-span');
    patch().flush({ error: { code: 'forbidden', message: 'You may not change the inventory of North Plains' }, requestId: 'r-4' }, { status: 403, statusText: 'Forbidden' });
    await fixture.whenStable();

    expect(fixture.nativeElement.querySelector('[data-testid="form-failure"]').textContent).toContain('You may not change the inventory of North Plains (request r-4)');
    expect(saved).toHaveLength(0);
  });
});
