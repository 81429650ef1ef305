import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ActivatedRoute, convertToParamMap, provideRouter } from '@angular/router';
import type { FindingDetail, GirderDetail, SignedInUser } from '@spanledger/shared';
import { of } from 'rxjs';

import { SessionStore } from '../session/session.store';
import { spanDetail } from '../structures/inventory.testing';
import { UNIT_SYSTEM_STORAGE_KEY, UnitsStore } from '../units/units.store';
import { GirderEditorPage } from './girder-editor.page';
import { findingDetail, girderDetail, girderType } from './girders.testing';

const INSPECTOR: SignedInUser = { id: 3, email: 'i@example.org', displayName: 'Tomasz Reyes', role: 'inspector', districts: ['North Plains'], admin: false };
const RATER: SignedInUser = { id: 7, email: 'r@example.org', displayName: 'Priya Halloran', role: 'rater', districts: ['North Plains'], admin: false };
const RATER_ELSEWHERE: SignedInUser = { ...RATER, id: 8, districts: ['East Valley'] };

const FINDINGS: FindingDetail[] = [
  findingDetail({ id: 502, kind: 'strand-section-loss', lossFraction: 0.2, strands: { rowId: 'r2', count: 2 }, fromM: 3, toM: 5 }),
  findingDetail({ id: 501 }),
  findingDetail({ id: 400, kind: 'exposed-strands', strands: { rowId: 'r1', strands: [4] }, registerState: 'repaired' }),
];

// Each case drives a whole page through Material harnesses; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

describe('GirderEditorPage', () => {
  let fixture: ComponentFixture<GirderEditorPage>;
  let loader: HarnessLoader;
  let server: HttpTestingController;
  let snackBarOpen: jest.Mock;

  async function openPage(user: SignedInUser, girder: GirderDetail = girderDetail()): Promise<void> {
    snackBarOpen = jest.fn();
    TestBed.configureTestingModule({
      imports: [GirderEditorPage],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        { provide: ActivatedRoute, useValue: { paramMap: of(convertToParamMap({ id: String(girder.id) })) } },
        { provide: SessionStore, useValue: { user: signal(user) } },
        { provide: MatSnackBar, useValue: { open: snackBarOpen } },
      ],
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(GirderEditorPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    server.expectOne('api/girders/9002').flush(girder);
    server.expectOne('api/girder-types').flush([girderType(), girderType({ id: 5, name: 'Demo I-girder 1400', section: { ...girderType().section, depthMm: 1400 }, depthMm: 1400 })]);
    server.expectOne('api/girders/9002/findings').flush(FINDINGS);
    await fixture.whenStable();
    server.expectOne('api/spans/301').flush(spanDetail());
    await fixture.whenStable();
  }

  afterEach(() => {
    server.verify();
    localStorage.clear();
  });

  function element(testId: string): HTMLElement | null {
    return fixture.nativeElement.querySelector(`[data-testid="${testId}"]`);
  }

  function textOf(testId: string): string {
    return element(testId)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  }

  function property(key: string): string {
    return fixture.nativeElement.querySelector(`[data-testid="property-${key}"] dd`)?.textContent?.trim() ?? '';
  }

  function strands(): HTMLElement[] {
    return [...fixture.nativeElement.querySelectorAll('[data-testid="strand"]')];
  }

  function statesOfRow(rowId: string): string[] {
    return strands()
      .filter((strand) => strand.dataset['rowId'] === rowId)
      .map((strand) => strand.dataset['state']!);
  }

  async function field(path: string): Promise<MatInputHarness> {
    return loader.getHarness(MatInputHarness.with({ selector: `[data-testid="field-${path}"]` }));
  }

  async function cellErrors(path: string): Promise<string[]> {
    return (await loader.getHarness(MatFormFieldHarness.with({ selector: `[data-testid="cell-${path}"]` }))).getTextErrors();
  }

  async function click(testId: string): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ selector: `[data-testid="${testId}"]` }))).click();
  }

  function putRequest(): TestRequest {
    return server.expectOne((request) => request.method === 'PUT' && request.url === 'api/girders/9002');
  }

  it('shows where the girder sits, with a way back to its structure', async () => {
    await openPage(RATER);

    expect(textOf('girder-title')).toBe('Girder 2 of span 1');
    expect(textOf('girder-where')).toContain('NP-0041');
    expect(textOf('girder-where')).toContain('Span 1 · girder 2');
    expect(element('structure-link')?.getAttribute('href')).toBe('/structures/41');
    expect(textOf('girder-subtitle')).toBe('Demo I-girder 1200 · Interior girder · North Plains');
    expect(textOf('last-change')).toContain('by Priya Halloran');
  });

  it('draws every strand with the states its open findings leave, and the deck of its span', async () => {
    await openPage(RATER);

    expect(strands()).toHaveLength(16);
    // Finding 501 lost strands 0 and 9 of r1; the repaired exposure of strand 4 no longer shows.
    expect(statesOfRow('r1')).toEqual(['lost', 'intact', 'intact', 'intact', 'intact', 'intact', 'intact', 'intact', 'intact', 'lost']);
    // Finding 502 counts two strands of r2 with section loss: the lowest-numbered, 0 and 1.
    expect(statesOfRow('r2')).toEqual(['section-loss', 'section-loss', 'intact', 'intact', 'intact', 'intact']);
    expect(element('deck')).not.toBeNull();
  });

  it('gives the section properties of the girder, in the chosen units', async () => {
    await openPage(RATER);

    // Hand check of the demo I-girder: flanges, tapers and web add up to 359 600 mm², centroid 548.6 mm up.
    expect(property('areaMm2')).toBe('359,600 mm²');
    expect(property('centroidFromSoffitMm')).toBe('549 mm');
    expect(property('depthMm')).toBe('1,200 mm');
    expect(property('strands')).toBe('16 strands, 2,240 mm²');
    expect(property('inertiaMm4')).toMatch(/^\d+\.\d\d × 10⁹ mm⁴$/);

    TestBed.inject(UnitsStore).use('us');
    await fixture.whenStable();

    expect(property('areaMm2')).toBe('557.4 in²');
    expect(property('centroidFromSoffitMm')).toBe('21.60 in');
  });

  it('draws the open findings along the span, labelled by kind', async () => {
    await openPage(RATER);

    const bands = [...fixture.nativeElement.querySelectorAll('[data-testid="elevation-band"]')] as HTMLElement[];
    expect(bands.map((band) => band.dataset['kind'])).toEqual(['strand-section-loss', 'lost-strands']);
    const labels = [...fixture.nativeElement.querySelectorAll('[data-testid="elevation-label"]')] as HTMLElement[];
    expect(labels.map((label) => label.textContent)).toEqual(['Strand section loss', 'Lost strands']);
    expect(bands[1]!.querySelector('title')?.textContent).toBe('Lost strands, 12.00–14.50 m');
    // 12 m of a 30.48 m span drawn 720 long starts at 283.5.
    expect(Number(bands[1]!.querySelector('rect')?.getAttribute('x'))).toBeCloseTo(283.46, 1);
    expect(textOf('elevation-span-length')).toBe('30.48 m');
  });

  it('shows an inspector the girder read-only', async () => {
    await openPage(INSPECTOR);

    expect(element('read-only-note')).not.toBeNull();
    expect(element('save-girder')).toBeNull();
    expect(element('add-strand-row')).toBeNull();
    expect(await (await field('strandRows.0.count')).isDisabled()).toBe(true);
    expect(await (await field('concrete.strengthMpa')).isDisabled()).toBe(true);
    expect(await (await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="field-girderTypeId"]' }))).isDisabled()).toBe(true);
    expect(strands()).toHaveLength(16);
  });

  it('shows a rater of another district the girder read-only', async () => {
    await openPage(RATER_ELSEWHERE);

    expect(element('save-girder')).toBeNull();
    expect(await (await field('strandRows.0.yMm')).isDisabled()).toBe(true);
  });

  it('redraws the strands and properties as a strand count is edited', async () => {
    await openPage(RATER);

    await (await field('strandRows.0.count')).setValue('4');
    await fixture.whenStable();

    expect(statesOfRow('r1')).toHaveLength(4);
    expect(strands()).toHaveLength(10);
    expect(property('strands')).toBe('10 strands, 1,400 mm²');
    // Strand 9 no longer exists: the finding that lost it is named, not drawn.
    expect(textOf('findings-unplaced')).toContain('Lost strands (finding 501): row "r1" has strands 0–3 only');
  });

  it('keeps the last good drawing and names the problem while the form does not check out', async () => {
    await openPage(RATER);

    await (await field('strandRows.0.count')).setValue('0');
    await fixture.whenStable();

    expect(strands()).toHaveLength(16);
    expect(textOf('preview-problems')).toContain('Strand row 1 · Strands: must be > 0');

    await (await field('strandRows.0.count')).setValue('');
    await fixture.whenStable();
    expect(textOf('preview-problems')).toContain('Strand row 1 · Strands: is required');
  });

  it('redraws a section dimension override and sends only what differs from the type', async () => {
    await openPage(RATER);

    await (await field('sectionOverrides.depthMm')).setValue('1300');
    await fixture.whenStable();
    expect(property('depthMm')).toBe('1,300 mm');

    await click('save-girder');
    const request = putRequest();
    expect(request.request.body).toMatchObject({ version: 3, girderTypeId: 4, sectionOverrides: { depthMm: 1300 }, customSection: null });
    request.flush(girderDetail({ version: 4, sectionOverrides: { depthMm: 1300 }, section: { ...girderType().section, depthMm: 1300 } }));
    await fixture.whenStable();
    expect(snackBarOpen).toHaveBeenCalledWith('Girder 2 of span 1 saved.', 'Dismiss', expect.anything());
  });

  it('saves the whole record with the version read, a new row included', async () => {
    await openPage(RATER);

    await click('add-strand-row');
    await (await field('strandRows.2.count')).setValue('2');
    await (await field('strandRows.2.xMm')).setValue('-60, 60');
    await fixture.whenStable();
    expect(statesOfRow('r3')).toEqual(['intact', 'intact']);

    await click('save-girder');
    const body = putRequest().request.body;
    expect(body).toEqual({
      version: 3,
      position: 'interior',
      girderTypeId: 4,
      sectionOverrides: {},
      customSection: null,
      concrete: { strengthMpa: 55, basis: 'cylinder', unitWeightKnM3: 24.5 },
      deckConcrete: { strengthMpa: 32, basis: 'cylinder', unitWeightKnM3: 24 },
      strandRows: [
        girderDetail().strandRows[0],
        girderDetail().strandRows[1],
        { ...girderDetail().strandRows[1], id: 'r3', yMm: 160, count: 2, xMm: [-60, 60] },
      ],
      bars: [],
      tensioning: 'pre',
      profiles: [],
      debonding: [],
      losses: { method: 'given' },
    });
  });

  it('saves harped profiles and debonded strands, and shows a problem of the hold-down pair under the first', async () => {
    await openPage(RATER);

    await click('add-profile');
    await (await field('profiles.0.endYMm')).setValue('900');
    await (await field('profiles.0.holdDownM.0')).setValue('12');
    await (await field('profiles.0.holdDownM.1')).setValue('18.48');
    await click('add-debonding');
    await (await field('debonding.0.strands')).setValue('0, 9');
    await (await field('debonding.0.lengthM')).setValue('1.5');
    await click('save-girder');

    const request = putRequest();
    expect(request.request.body).toMatchObject({
      profiles: [{ rowId: 'r1', shape: 'harped', endYMm: 900, holdDownM: [12, 18.48] }],
      debonding: [{ rowId: 'r1', strands: [0, 9], lengthM: 1.5 }],
    });
    request.flush(
      { error: { code: 'validation_failed', message: 'Invalid body field', details: { fields: [{ field: 'profiles.0.holdDownM', message: 'hold-down points must lie inside the span (0–30.48 m)' }] } } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    const firstHoldDown = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Profile 1 hold-down 1 from the start' }));
    expect(await firstHoldDown.getTextErrors()).toEqual(['hold-down points must lie inside the span (0–30.48 m)']);
  });

  it('takes strand positions typed in inches as a list in mm', async () => {
    localStorage.setItem(UNIT_SYSTEM_STORAGE_KEY, 'us');
    await openPage(RATER, girderDetail({ strandRows: [girderDetail().strandRows[0]!, { ...girderDetail().strandRows[1]!, count: 2, xMm: [-127, 127] }] }));

    expect(await (await field('strandRows.1.xMm')).getValue()).toBe('-5, 5');
    await (await field('strandRows.1.xMm')).setValue('-4, 4');
    await fixture.whenStable();
    const marks = strands().filter((strand) => strand.dataset['rowId'] === 'r2').map((strand) => Number(strand.querySelector('.mark')?.getAttribute('cx')));
    expect(marks).toEqual([-101.6, 101.6]);

    await click('save-girder');
    expect(putRequest().request.body.strandRows[1].xMm).toEqual([-101.6, 101.6]);
  });

  it("shows the server's message for a strand row height under that field", async () => {
    await openPage(RATER);

    await click('save-girder');
    putRequest().flush(
      { error: { code: 'validation_failed', message: 'Invalid body field', details: { fields: [{ field: 'strandRows.0.yMm', message: '1250 mm is not inside the girder section' }] } } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    expect(await cellErrors('strandRows.0.yMm')).toEqual(['1250 mm is not inside the girder section']);
    expect(element('form-problems')).toBeNull();
  });

  it('names a bad position inside a list under the list, and lists what no input shows', async () => {
    await openPage(RATER);

    await click('save-girder');
    putRequest().flush(
      {
        error: {
          code: 'validation_failed',
          message: 'Invalid body fields',
          details: {
            fields: [
              { field: 'strandRows.1.xMm.3', message: '(400, 110) mm is not inside the girder section' },
              { field: 'strandRows.1', message: 'a row must be inside the section' },
            ],
          },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    expect(await cellErrors('strandRows.1.xMm')).toEqual(['item 4: (400, 110) mm is not inside the girder section']);
    expect(textOf('form-problems')).toBe('Strand row 2: a row must be inside the section');
  });

  it('checks with the server rules before sending, naming the field', async () => {
    await openPage(RATER);

    await (await field('strandRows.1.id')).setValue('r1');
    await click('save-girder');

    server.expectNone((request) => request.method === 'PUT');
    expect(await cellErrors('strandRows.1.id')).toEqual(['row id "r1" is used twice']);
  });

  it('tells the user when someone else changed the girder, and reloads it on request', async () => {
    await openPage(RATER);

    await (await field('strandRows.0.count')).setValue('8');
    await click('save-girder');
    putRequest().flush(
      { error: { code: 'version_conflict', message: 'Girder 2 of span 1 was changed by someone else', details: { current: girderDetail({ version: 4 }) } } },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();

    expect(textOf('form-conflict')).toContain('Someone else changed this girder');

    await click('reload-after-conflict');
    server.expectOne('api/girders/9002').flush(girderDetail({ version: 4, strandRows: [girderDetail().strandRows[0]!] }));
    server.expectOne('api/girder-types').flush([girderType()]);
    await fixture.whenStable();

    expect(element('form-conflict')).toBeNull();
    expect(await (await field('strandRows.0.count')).getValue()).toBe('10');
    expect(strands()).toHaveLength(10);
  });

  it('turns a catalogue girder into a custom section that starts from the same shape', async () => {
    await openPage(RATER);

    const source = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="field-girderTypeId"]' }));
    await source.open();
    await source.clickOptions({ text: 'Custom section' });
    await fixture.whenStable();

    expect(await (await field('customSection.depthMm')).getValue()).toBe('1200');
    expect(property('areaMm2')).toBe('359,600 mm²');

    await click('save-girder');
    expect(putRequest().request.body).toMatchObject({ girderTypeId: null, sectionOverrides: {}, customSection: { shape: 'i-girder', depthMm: 1200, webWidthMm: 180 } });
  });

  it('explains when the address names no girder', async () => {
    TestBed.configureTestingModule({
      imports: [GirderEditorPage],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        { provide: ActivatedRoute, useValue: { paramMap: of(convertToParamMap({ id: 'abc' })) } },
        { provide: SessionStore, useValue: { user: signal(RATER) } },
      ],
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(GirderEditorPage);
    await fixture.whenStable();

    expect(textOf('girder-error')).toContain('"abc" is not a girder id');
  });
});
