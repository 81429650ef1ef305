import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component, input, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import { ActivatedRoute, Router, convertToParamMap, provideRouter } from '@angular/router';
import type { SignedInUser, SpanDetail, StructureDetail } from '@spanledger/shared';
import { of } from 'rxjs';

import { localToday } from '../inspections/inspection-text';
import { inspectionDetail, inspectionSummary } from '../inspections/inspections.testing';
import { SessionStore } from '../session/session.store';
import { UnitsStore } from '../units/units.store';
import { girderSummary, historyEvent, spanDetail, structureDetail } from './inventory.testing';
import { LocationMapComponent } from './location-map.component';
import { StructurePage } from './structure.page';

/** Stands in for the Leaflet map, which needs a canvas that jsdom lacks. */
@Component({ selector: 'sl-location-map', template: '' })
class LocationMapStub {
  readonly longitude = input.required<number>();
  readonly latitude = input.required<number>();
  readonly label = input.required<string>();
}

const INSPECTOR: SignedInUser = { id: 3, email: 'i@example.org', displayName: 'Tomasz Reyes', role: 'inspector', districts: ['North Plains'], admin: false };
const RATER: SignedInUser = { id: 7, email: 'r@example.org', displayName: 'Priya Halloran', role: 'rater', districts: ['North Plains'], admin: false };
const RATER_ELSEWHERE: SignedInUser = { ...RATER, id: 8, districts: ['East Valley'] };
const INSPECTOR_ELSEWHERE: SignedInUser = { ...INSPECTOR, id: 5, districts: ['East Valley'] };

const SPANS: SpanDetail[] = [
  spanDetail(),
  spanDetail({ id: 302, spanIndex: 2, lengthM: 24, wearingSurface: null, barriers: [], diaphragms: [], version: 5 }),
];

// Each case drives a whole page through Material harnesses; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

describe('StructurePage', () => {
  let fixture: ComponentFixture<StructurePage>;
  let loader: HarnessLoader;
  let server: HttpTestingController;
  let snackBarOpen: jest.Mock;

  async function openPage(user: SignedInUser, structure: StructureDetail = structureDetail()): Promise<void> {
    snackBarOpen = jest.fn();
    TestBed.configureTestingModule({
      imports: [StructurePage],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        { provide: ActivatedRoute, useValue: { paramMap: of(convertToParamMap({ id: String(structure.id) })) } },
        { provide: SessionStore, useValue: { user: signal(user) } },
        { provide: MatSnackBar, useValue: { open: snackBarOpen } },
      ],
    }).overrideComponent(StructurePage, { remove: { imports: [LocationMapComponent] }, add: { imports: [LocationMapStub] } });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(StructurePage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    server.expectOne('api/structures/41').flush(structure);
    server.expectOne('api/structures/41/spans').flush(SPANS);
    await fixture.whenStable();
    server.expectOne('api/spans/301/girders').flush([girderSummary(), girderSummary({ id: 9002, girderNumber: 2, position: 'interior', girderTypeName: null, harped: false, debonded: true })]);
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

  /** The value of one of the facts beside the map. */
  function fact(key: string): string {
    return fixture.nativeElement.querySelector(`[data-testid="fact-${key}"] dd`)?.textContent?.trim() ?? '';
  }

  function cellTexts(row: Element): string[] {
    return [...row.querySelectorAll('td')].map((cell) => cell.textContent?.trim() ?? '');
  }

  function spanRow(index: number): HTMLElement {
    return fixture.nativeElement.querySelector(`[data-testid="span-row"][data-span-index="${index}"]`);
  }

  async function click(testId: string): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ selector: `[data-testid="${testId}"]` }))).click();
  }

  async function field(testId: string): Promise<MatInputHarness> {
    return loader.getHarness(MatInputHarness.with({ selector: `[data-testid="field-${testId}"]` }));
  }

  async function errorsUnder(label: string): Promise<string[]> {
    return (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }))).getTextErrors();
  }

  function patchTo(url: string): TestRequest {
    return server.expectOne((request) => request.method === 'PATCH' && request.url === url);
  }

  async function openStructureForm(): Promise<void> {
    await click('edit-structure');
    server.expectOne('api/districts').flush(['East Valley', 'North Plains', 'South Ridge']);
    await fixture.whenStable();
  }

  it("shows the structure's identity, location, traffic and condition", async () => {
    await openPage(RATER);

    expect(textOf('structure-title')).toBe('NP-0041 Willow Bend Overpass');
    expect(textOf('structure-status')).toBe('Open');
    expect(fact('routeCarried')).toBe('SR 18');
    expect(fact('featureCrossed')).toBe('Cottonwood Creek');
    expect(fact('district')).toBe('North Plains');
    expect(fact('yearBuilt')).toBe('1984');
    expect(fact('yearLastMajorWork')).toBe('2009');
    expect(fact('adt')).toBe('6,200 vehicles a day');
    expect(fact('adtt')).toBe('740 trucks a day');
    expect(fact('skewDeg')).toBe('15°');
    expect(fact('location')).toBe('38.47200°, -98.21400° (latitude, longitude)');
    expect(fact('deckCondition')).toBe('6');
    expect(fact('superstructureCondition')).toBe('7');
    expect(fact('substructureCondition')).toBe('5');
    expect(fact('conditionRatedOn')).toBe('May 14, 2024');
    expect(textOf('fact-notes')).toContain('Joint seals replaced');
    expect(textOf('last-change')).toContain('by Priya Halloran');
  });

  it('lists the spans and the girders of the chosen span', async () => {
    await openPage(RATER);

    expect(cellTexts(spanRow(1))).toEqual(['1', '30.48', '5', '2,438', '900', '10,800', '203', '25', '50 mm overlay, measured']);
    expect(cellTexts(spanRow(2))[8]).toBe('None');
    expect(textOf('girders-heading')).toBe('Girders of span 1');
    const girderRows = fixture.nativeElement.querySelectorAll('[data-testid="girder-row"]');
    expect(cellTexts(girderRows[0])).toEqual(['1', 'Exterior', 'I-girder 54 in', '4', '38', 'Yes', 'No', '55.2', 'Pretensioned']);
    expect(cellTexts(girderRows[1]).slice(0, 7)).toEqual(['2', 'Interior', 'Custom section', '4', '38', 'No', 'Yes']);

    spanRow(2).click();
    await fixture.whenStable();
    server.expectOne('api/spans/302/girders').flush([]);
    await fixture.whenStable();

    expect(spanRow(2).getAttribute('aria-selected')).toBe('true');
    expect(textOf('girders-heading')).toBe('Girders of span 2');
    expect(textOf('girders-empty')).toBe('No girders are recorded for this span yet.');
  });

  it('says plainly that inspections, ratings and postings are not recorded yet, and offers a rater each span to rate', async () => {
    await openPage(RATER);
    const tabs = await loader.getHarness(MatTabGroupHarness);

    await tabs.selectTab({ label: 'Inspections' });
    server.expectOne('api/structures/41/inspections').flush([]);
    await fixture.whenStable();
    expect(textOf('inspections-empty')).toBe('No inspections recorded for this structure yet.');
    await tabs.selectTab({ label: 'Ratings' });
    server.expectOne('api/structures/41/ratings').flush([]);
    await fixture.whenStable();
    expect(textOf('ratings-empty')).toBe('No rating of record for this structure yet.');
    expect(textOf('rating-records-empty')).toBe('No span of this structure has been rated yet.');
    expect(fixture.nativeElement.querySelector('[data-testid="rate-span-1"]')?.getAttribute('href')).toMatch(/\/spans\/\d+\/rate$/);
    await tabs.selectTab({ label: 'Postings' });
    expect(textOf('postings-empty')).toBe('No postings recorded for this structure yet.');
  });

  async function openInspectionsTab(answer: ReturnType<typeof inspectionSummary>[]): Promise<void> {
    await (await loader.getHarness(MatTabGroupHarness)).selectTab({ label: 'Inspections' });
    server.expectOne('api/structures/41/inspections').flush(answer);
    await fixture.whenStable();
  }

  it("lists the structure's inspections newest first, each opening its page", async () => {
    await openPage(RATER);
    await openInspectionsTab([
      inspectionSummary({ id: 78, inspectedOn: '2025-03-04', state: 'submitted', findingCount: 3, criticalCount: 1 }),
      inspectionSummary({ id: 61, inspectedOn: '2023-04-18', kind: 'in-depth', state: 'accepted', inspectorName: 'Ines Okafor', findingCount: 1, criticalCount: 0 }),
    ]);

    const rows = [...fixture.nativeElement.querySelectorAll('[data-testid="inspection-row"]')] as HTMLElement[];
    expect(rows.map(cellTexts)).toEqual([
      ['Mar 4, 2025', 'Routine', 'Submitted', 'Tomasz Reyes', '3', '1'],
      ['Apr 18, 2023', 'In-depth', 'Accepted', 'Ines Okafor', '1', '0'],
    ]);
    expect(rows[1]!.querySelector('[data-testid="inspection-link"]')?.getAttribute('href')).toBe('/inspections/61');
    expect(element('start-inspection')).toBeNull();
  });

  it('lets an inspector of the district start an inspection, and opens it', async () => {
    await openPage(INSPECTOR);
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    await openInspectionsTab([inspectionSummary({ id: 61, inspectedOn: '2023-04-18', state: 'accepted' })]);

    await click('start-inspection');
    const start = server.expectOne((request) => request.method === 'POST' && request.url === 'api/structures/41/inspections');
    expect(start.request.body).toEqual({ inspectedOn: localToday(), kind: 'routine', deckCondition: null, superstructureCondition: null, substructureCondition: null, notes: '' });
    start.flush(inspectionDetail({ id: 79 }));
    await fixture.whenStable();

    expect(navigate).toHaveBeenCalledWith(['/inspections', 79]);
  });

  it('says why an inspection was not started', async () => {
    await openPage(INSPECTOR);
    await openInspectionsTab([]);

    await click('start-inspection');
    server
      .expectOne((request) => request.method === 'POST' && request.url === 'api/structures/41/inspections')
      .flush({ error: { code: 'forbidden', message: 'You may not record inspections in North Plains' }, requestId: 'r-50' }, { status: 403, statusText: 'Forbidden' });
    await fixture.whenStable();

    expect(textOf('start-error')).toBe('The inspection was not started. You may not record inspections in North Plains (request r-50)');
  });

  it('offers no start to an inspector of another district, nor while an inspection is being written', async () => {
    await openPage(INSPECTOR_ELSEWHERE);
    await openInspectionsTab([]);
    expect(element('start-inspection')).toBeNull();

    TestBed.resetTestingModule();
    await openPage(INSPECTOR);
    await openInspectionsTab([inspectionSummary({ state: 'returned' })]);
    expect(element('start-inspection')).toBeNull();
    expect(textOf('inspection-in-progress')).toContain("Tomasz Reyes's inspection of Mar 4, 2025 is still being written (returned for changes)");
  });

  it('shows a rating of record with the caution, and the rating records of its spans', async () => {
    await openPage(RATER, structureDetail({ ratingOfRecord: { lowestLegalRatingFactor: 0.94, designInventoryRatingFactor: 1.12, approvedAt: '2024-07-01T10:00:00.000Z', approvedOn: null } }));

    await (await loader.getHarness(MatTabGroupHarness)).selectTab({ label: 'Ratings' });
    const stamp = { at: '2024-06-28T09:00:00.000Z', by: 'Priya Halloran' };
    server.expectOne('api/structures/41/ratings').flush([
      {
        id: 12, structureId: 41, structureNumber: 'BV-N-0108', structureName: 'Test', district: 'North Plains', spanId: 5, spanIndex: 1, state: 'approved',
        girderCount: 5, hypothetical: false, lowestLegalRf: 0.94, lowestInventoryRf: 1.12, created: { ...stamp, byUserId: 7 }, submitted: stamp, reviewed: stamp, version: 3,
      },
    ]);
    await fixture.whenStable();
    const row = element('rating-row')!;
    expect(row.getAttribute('data-state')).toBe('approved');
    expect(row.textContent).toContain('Rating of record');
    expect(row.textContent).toContain('0.94');
    expect(row.querySelector('[data-testid="rating-link"]')!.getAttribute('href')).toBe('/ratings/12');

    expect(fact('legalRatingFactor')).toBe('0.94');
    expect(fact('designInventoryRatingFactor')).toBe('1.12');
    expect(fact('approvedAt')).toMatch(/^Jul 1, 2024, /);
    expect(textOf('result-caution')).toContain('licensed engineer');
  });

  it('shows the day of a rating of record on file from before Spanledger, the same day in every time zone', async () => {
    // Midnight UTC of the day, as the server keeps it for ordering: the day before, read as a moment west of Greenwich.
    await openPage(RATER, structureDetail({ ratingOfRecord: { lowestLegalRatingFactor: 1.16, designInventoryRatingFactor: 0.91, approvedAt: '2018-06-07T00:00:00.000Z', approvedOn: '2018-06-07' } }));
    await (await loader.getHarness(MatTabGroupHarness)).selectTab({ label: 'Ratings' });
    server.expectOne('api/structures/41/ratings').flush([]);
    await fixture.whenStable();

    expect(fact('approvedAt')).toBe('Jun 7, 2018 (on file from before Spanledger)');
  });

  it('offers no edit buttons to an inspector', async () => {
    await openPage(INSPECTOR);

    expect(element('edit-structure')).toBeNull();
    expect(element('edit-span')).toBeNull();
  });

  it('offers no edit buttons to a rater outside the structure district', async () => {
    await openPage(RATER_ELSEWHERE);

    expect(element('edit-structure')).toBeNull();
    expect(element('edit-span')).toBeNull();
  });

  it("lets a rater in the structure's district edit it, sending the version and only the changed fields", async () => {
    await openPage(RATER);
    expect(element('edit-span')).not.toBeNull();
    await openStructureForm();

    await (await field('name')).setValue('Willow Bend Bridge');
    await (await field('adt')).setValue('6400');
    await click('save-structure');

    const request = patchTo('api/structures/41');
    expect(request.request.body).toEqual({ version: 3, name: 'Willow Bend Bridge', adt: 6400 });
    request.flush(structureDetail({ name: 'Willow Bend Bridge', adt: 6400, version: 4 }));
    await fixture.whenStable();

    expect(element('structure-form')).toBeNull();
    expect(textOf('structure-title')).toBe('NP-0041 Willow Bend Bridge');
    expect(fact('adt')).toBe('6,400 vehicles a day');
    expect(snackBarOpen).toHaveBeenCalledWith('Structure NP-0041 saved.', 'Dismiss', expect.anything());
  });

  it("leaves a structure's status to managers: a rater sees it but cannot change it", async () => {
    await openPage(RATER);
    await openStructureForm();
    expect(element('status-hint')?.textContent).toContain('decided by asset managers');
    expect(element('field-status')?.getAttribute('aria-disabled')).toBe('true');
  });

  it('checks the form with the server rules before sending, naming each bad field', async () => {
    await openPage(RATER);
    await openStructureForm();

    await (await field('name')).setValue('  ');
    await (await field('skewDeg')).setValue('');
    await click('save-structure');
    expect(await errorsUnder('Name')).toEqual(['is required']);
    expect(await errorsUnder('Skew')).toEqual(['is required']);

    await (await field('name')).setValue('Willow Bend Bridge');
    await (await field('skewDeg')).setValue('12');
    await (await field('adtt')).setValue('7000');
    await click('save-structure');
    expect(await errorsUnder('Name')).toEqual([]);
    expect(await errorsUnder('ADTT')).toEqual(['truck traffic cannot exceed all traffic (ADT)']);

    server.expectNone((request) => request.method === 'PATCH');
  });

  it('tells the user when someone else changed the structure, and reloads it on request', async () => {
    await openPage(RATER);
    await openStructureForm();
    await (await field('name')).setValue('Willow Bend Bridge');
    await click('save-structure');

    patchTo('api/structures/41').flush(
      { error: { code: 'version_conflict', message: 'Structure NP-0041 was changed by someone else', details: { current: structureDetail({ version: 4 }) } }, requestId: 'r-9' },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    expect(textOf('form-conflict')).toContain('Someone else changed this structure');

    await click('reload-after-conflict');
    server.expectOne('api/structures/41').flush(structureDetail({ name: 'Willow Bend Crossing', version: 4 }));
    await fixture.whenStable();

    expect(element('form-conflict')).toBeNull();
    expect(await (await field('name')).getValue()).toBe('Willow Bend Crossing');
    await (await field('notes')).setValue('Deck sealed 2024.');
    await click('save-structure');
    expect(patchTo('api/structures/41').request.body).toEqual({ version: 4, notes: 'Deck sealed 2024.' });
  });

  it("shows the server's message for each refused field under that field", async () => {
    await openPage(RATER);
    await click('edit-span');
    await (await field('roadwayWidthMm')).setValue('9000');
    await click('save-span');

    patchTo('api/spans/301').flush(
      {
        error: {
          code: 'validation_failed',
          message: 'Invalid body field: roadwayWidthMm: leaves no room for the exterior girders',
          details: { fields: [{ field: 'roadwayWidthMm', message: 'leaves no room for the exterior girders' }] },
        },
        requestId: 'r-10',
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    expect(await errorsUnder('Roadway width')).toEqual(['leaves no room for the exterior girders']);
    expect(element('span-form')).not.toBeNull();
  });

  it('converts every shown value and every input when the units switch to US customary', async () => {
    await openPage(RATER);
    const units = TestBed.inject(UnitsStore);

    units.use('us');
    await fixture.whenStable();

    expect(cellTexts(spanRow(1)).slice(0, 8)).toEqual(['1', '100.00', '5', '8.00', '2.95', '35.43', '8.00', '0.98']);
    expect(cellTexts(spanRow(1))[8]).toBe('1.97 in overlay, measured');
    const headers = [...fixture.nativeElement.querySelectorAll('[data-testid="spans-table"] th')].map((th) => (th as HTMLElement).textContent?.trim());
    expect(headers).toContain('Length (ft)');
    expect(headers).toContain('Deck (in)');
    expect(headers).toContain('Spacing (ft)');
    expect(cellTexts(fixture.nativeElement.querySelector('[data-testid="girder-row"]'))[7]).toBe('8.00');

    await click('edit-span');
    const length = await field('lengthM');
    expect(await length.getValue()).toBe('100');
    expect(await (await field('barriers.0.loadKnM')).getValue()).toBe('0.5002');

    await length.setValue('110');
    await (await field('deckThicknessMm')).setValue('8.5');
    units.use('si');
    await fixture.whenStable();
    expect(await length.getValue()).toBe('33.528');
    units.use('us');
    await fixture.whenStable();
    await click('save-span');

    const request = patchTo('api/spans/301');
    expect(request.request.body).toEqual({ version: 2, lengthM: 33.528, deckThicknessMm: 215.9 });
    request.flush(spanDetail({ lengthM: 33.528, deckThicknessMm: 215.9, version: 3 }));
    await fixture.whenStable();

    expect(cellTexts(spanRow(1))[1]).toBe('110.00');
    expect(snackBarOpen).toHaveBeenCalledWith('Span 1 saved.', 'Dismiss', expect.anything());
  });

  it('refreshes the open History tab after a save', async () => {
    await openPage(RATER);
    await (await loader.getHarness(MatTabGroupHarness)).selectTab({ label: 'History' });
    server.expectOne((request) => request.url === 'api/structures/41/history').flush({ items: [], total: 0, limit: 20, offset: 0 });
    await fixture.whenStable();
    expect(textOf('history-empty')).toBe('No changes are recorded for this structure yet.');

    await openStructureForm();
    await (await field('yearLastMajorWork')).setValue('2019');
    await click('save-structure');
    patchTo('api/structures/41').flush(structureDetail({ yearLastMajorWork: 2019, version: 4 }));
    await fixture.whenStable();

    const history = server.expectOne((request) => request.url === 'api/structures/41/history');
    expect(history.request.params.get('offset')).toBe('0');
    history.flush({
      items: [historyEvent({ action: 'structure.changed', subject: 'Structure', changes: [{ field: 'yearLastMajorWork', before: 2009, after: 2019 }] })],
      total: 1,
      limit: 20,
      offset: 0,
    });
    await fixture.whenStable();
    expect(textOf('history-change')).toBe('Year of last major work: 2009 → 2019');
  });

  it('explains when there is no such structure', async () => {
    TestBed.configureTestingModule({
      imports: [StructurePage],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: ActivatedRoute, useValue: { paramMap: of(convertToParamMap({ id: '999' })) } },
        { provide: SessionStore, useValue: { user: signal(RATER) } },
      ],
    }).overrideComponent(StructurePage, { remove: { imports: [LocationMapComponent] }, add: { imports: [LocationMapStub] } });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(StructurePage);
    await fixture.whenStable();

    server.expectOne('api/structures/999').flush(
      { error: { code: 'not_found', message: 'There is no structure with id 999' }, requestId: 'r-11' },
      { status: 404, statusText: 'Not Found' },
    );
    server.expectOne('api/structures/999/spans').flush(
      { error: { code: 'not_found', message: 'There is no structure with id 999' }, requestId: 'r-12' },
      { status: 404, statusText: 'Not Found' },
    );
    await fixture.whenStable();

    expect(textOf('structure-error')).toContain('The structure could not be loaded. There is no structure with id 999 (request r-11)');
    expect(element('structure-title')).toBeNull();
  });
});
