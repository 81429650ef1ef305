import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleGroupHarness } from '@angular/material/button-toggle/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ActivatedRoute, convertToParamMap, provideRouter } from '@angular/router';
import type { InspectionDetail, SignedInUser } from '@spanledger/shared';
import { of } from 'rxjs';

import { SessionStore } from '../session/session.store';
import { girderSummary, spanDetail } from '../structures/inventory.testing';
import { InspectionPage } from './inspection.page';
import { INSPECTOR, OTHER_INSPECTOR, RATER, RATER_ELSEWHERE, carriedFinding, findingDetail, inspectionDetail, photoSummary } from './inspections.testing';

// Each case drives a whole page through Material harnesses; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

const SPANS = [spanDetail(), spanDetail({ id: 302, spanIndex: 2, lengthM: 24, version: 5 })];

describe('InspectionPage', () => {
  let fixture: ComponentFixture<InspectionPage>;
  let loader: HarnessLoader;
  let server: HttpTestingController;
  let snackBarOpen: jest.Mock;

  async function openPage(user: SignedInUser, inspection: InspectionDetail = inspectionDetail()): Promise<void> {
    snackBarOpen = jest.fn();
    TestBed.configureTestingModule({
      imports: [InspectionPage],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        { provide: ActivatedRoute, useValue: { paramMap: of(convertToParamMap({ id: String(inspection.id) })) } },
        { provide: SessionStore, useValue: { user: signal(user) } },
        { provide: MatSnackBar, useValue: { open: snackBarOpen } },
      ],
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(InspectionPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    server.expectOne('api/inspections/77').flush(inspection);
    server.expectOne('api/inspections/77/photos').flush([photoSummary(), photoSummary({ id: 89, findingId: 601 })]);
    await fixture.whenStable();
    server.expectOne('api/structures/41/spans').flush(SPANS);
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

  function row(findingId: number): HTMLElement {
    return fixture.nativeElement.querySelector(`[data-testid="finding-row"][data-finding-id="${findingId}"]`);
  }

  async function click(testId: string, within?: string): Promise<void> {
    const selector = within ? `${within} [data-testid="${testId}"]` : `[data-testid="${testId}"]`;
    await (await loader.getHarness(MatButtonHarness.with({ selector }))).click();
  }

  function request(method: string, url: string): TestRequest {
    return server.expectOne((each) => each.method === method && each.url === url);
  }

  async function reloadWith(inspection: InspectionDetail): Promise<void> {
    server.expectOne('api/inspections/77').flush(inspection);
    await fixture.whenStable();
  }

  it('shows the header, the condition form and the findings by span and girder to the author of a draft', async () => {
    await openPage(
      INSPECTOR,
      inspectionDetail({ findings: [findingDetail(), findingDetail({ id: 603, girderId: 9001, girderNumber: 1, kind: 'crack', strands: null, crackWidthMm: 0.3, severity: 'minor', critical: false })] }),
    );

    expect(textOf('inspection-title')).toBe('Routine inspection of Mar 4, 2025');
    expect(textOf('inspection-structure')).toBe('NP-0041');
    expect(element('inspection-structure')?.getAttribute('href')).toBe('/structures/41');
    expect(textOf('inspection-state')).toBe('Draft');
    expect(textOf('inspection-inspector')).toBe('Inspector: Tomasz Reyes');
    expect(element('inspection-details-form')).not.toBeNull();

    const groups = [...fixture.nativeElement.querySelectorAll('[data-testid="finding-group"]')].map((heading) => (heading as HTMLElement).textContent?.trim());
    expect(groups).toEqual(['Span 1 · Girder 1', 'Span 1 · Girder 2']);
    expect(row(601).textContent).toContain('Row r1: strands 0, 9');
    expect(row(601).textContent).toContain('From 12.00 to 14.50 m along the span');
    expect(row(601).querySelector('[data-testid="finding-critical"]')).not.toBeNull();
    expect(row(603).textContent).toContain('Crack 0.30 mm wide');
    expect(row(601).querySelectorAll('[data-testid="photo-thumbnail"]')).toHaveLength(1);
    expect(fixture.nativeElement.querySelectorAll('sl-inspection-photos[data-testid="inspection-photos"] [data-testid="photo-thumbnail"]')).toHaveLength(1);
  });

  it('saves the condition ratings picked and the notes as changed fields with the version', async () => {
    await openPage(INSPECTOR);

    const deck = await loader.getHarness(MatButtonToggleGroupHarness.with({ selector: '[data-testid="field-deckCondition"]' }));
    await (await deck.getToggles({ text: '5' }))[0]!.check();
    const substructure = await loader.getHarness(MatButtonToggleGroupHarness.with({ selector: '[data-testid="field-substructureCondition"]' }));
    await (await substructure.getToggles({ text: '4' }))[0]!.check();
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="field-notes"]' }))).setValue('Wet; no access to span 2.');
    await click('save-inspection-details');

    const patch = request('PATCH', 'api/inspections/77');
    expect(patch.request.body).toEqual({ version: 4, deckCondition: 5, substructureCondition: 4, notes: 'Wet; no access to span 2.' });
    patch.flush(inspectionDetail({ conditions: { deck: 5, superstructure: 7, substructure: 4 }, notes: 'Wet; no access to span 2.', version: 5 }));
    await fixture.whenStable();
    expect(snackBarOpen).toHaveBeenCalledWith('Inspection details saved.', 'Dismiss', expect.anything());
  });

  it('asks for each carried-forward finding to be confirmed, grown or repaired, and sends the choice', async () => {
    const carried = carriedFinding();
    await openPage(INSPECTOR, inspectionDetail({ findings: [carried] }));

    expect(row(602).querySelector('[data-testid="carried-notice"]')?.textContent).toContain('Carried forward — confirm, record growth, or mark repaired');
    expect(textOf('to-review-count')).toBe('1 carried-forward finding is still to review.');
    await click('confirm-finding', '[data-finding-id="602"]');

    const put = request('PUT', 'api/findings/602');
    expect(put.request.body).toEqual({
      version: 1,
      kind: 'spall',
      strands: null,
      lossFraction: null,
      brokenWires: null,
      spall: { depthMm: 40, widthMm: 150 },
      deckLossMm: null,
      crackWidthMm: null,
      fromM: 3,
      toM: 4.5,
      severity: 'moderate',
      notes: '',
      disposition: 'confirmed',
    });
    put.flush(carriedFinding({ disposition: 'confirmed', version: 2 }));
    await fixture.whenStable();
    await reloadWith(inspectionDetail({ findings: [carriedFinding({ disposition: 'confirmed', version: 2 })] }));

    expect(row(602).querySelector('[data-testid="carried-notice"]')).toBeNull();
    expect(row(602).querySelector('[data-testid="finding-disposition"]')?.textContent).toBe('Confirmed as before');
    expect(element('to-review-count')).toBeNull();

    await click('repaired-finding', '[data-finding-id="602"]');
    expect(request('PUT', 'api/findings/602').request.body).toMatchObject({ version: 2, disposition: 'repaired' });
  });

  it('opens the finding form to record the new extent when a carried-forward finding has grown', async () => {
    await openPage(INSPECTOR, inspectionDetail({ findings: [carriedFinding()] }));

    await click('grown-finding', '[data-finding-id="602"]');
    server.expectOne('api/spans/301/girders').flush([girderSummary({ id: 9002, girderNumber: 2 })]);
    await fixture.whenStable();

    expect(textOf('finding-form')).toContain('Record the growth of spall on span 1, girder 2');
    expect(element('add-finding')).toBeNull();
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="finding-to"]' }))).setValue('6');
    await click('save-finding');
    const put = request('PUT', 'api/findings/602');
    expect(put.request.body).toMatchObject({ toM: 6, disposition: 'grown' });
    put.flush(carriedFinding({ disposition: 'grown', toM: 6, version: 2 }));
    await fixture.whenStable();
    await reloadWith(inspectionDetail({ findings: [carriedFinding({ disposition: 'grown', toM: 6, version: 2 })] }));

    expect(element('finding-form')).toBeNull();
    expect(row(602).querySelector('[data-testid="finding-disposition"]')?.textContent).toBe('Grown');
  });

  it('adds a finding and shows it after the inspection is read again', async () => {
    await openPage(INSPECTOR);
    expect(textOf('findings-empty')).toBe('No findings recorded in this inspection.');

    await click('add-finding');
    const span = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="finding-span"]' }));
    await span.open();
    await span.clickOptions({ text: 'Span 2' });
    server.expectOne('api/spans/302/girders').flush([girderSummary({ id: 9101, spanId: 302, girderNumber: 1 })]);
    await fixture.whenStable();
    const girder = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="finding-girder"]' }));
    await girder.open();
    await girder.clickOptions({ text: 'Girder 1 (exterior)' });
    const kind = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="finding-kind"]' }));
    await kind.open();
    await kind.clickOptions({ text: 'Other' });
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="finding-from"]' }))).setValue('0');
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="finding-to"]' }))).setValue('1.5');
    const severity = await loader.getHarness(MatButtonToggleGroupHarness.with({ selector: '[data-testid="finding-severity"]' }));
    await (await severity.getToggles({ text: 'Minor' }))[0]!.check();
    await click('save-finding');

    const post = request('POST', 'api/inspections/77/findings');
    expect(post.request.body).toMatchObject({ girderId: 9101, kind: 'other', fromM: 0, toM: 1.5, severity: 'minor' });
    const added = findingDetail({ id: 610, girderId: 9101, girderNumber: 1, spanId: 302, spanIndex: 2, kind: 'other', strands: null, fromM: 0, toM: 1.5, severity: 'minor', critical: false });
    post.flush(added);
    await fixture.whenStable();
    await reloadWith(inspectionDetail({ findings: [added], findingCount: 1 }));

    expect(row(610).textContent).toContain('Other');
    expect(textOf('finding-group')).toBe('Span 2 · Girder 1');
    expect(snackBarOpen).toHaveBeenCalledWith('Finding saved.', 'Dismiss', expect.anything());
  });

  it('refuses to submit while carried-forward findings are still to review, naming them', async () => {
    await openPage(INSPECTOR, inspectionDetail({ findings: [findingDetail(), carriedFinding()] }));

    await click('submit-inspection');

    server.expectNone((each) => each.url === 'api/inspections/77/submit');
    expect(textOf('submit-problems')).toBe('Span 1 · Girder 2, spall: still to review: confirm it, record its growth, or mark it repaired');
    expect(row(602).querySelector('[data-testid="finding-problem"]')?.textContent).toContain('still to review');
    expect(row(601).querySelector('[data-testid="finding-problem"]')).toBeNull();
  });

  it("shows the server's refusal to submit against the finding it names", async () => {
    await openPage(INSPECTOR, inspectionDetail({ findings: [carriedFinding({ disposition: 'confirmed' }), findingDetail()] }));

    await click('submit-inspection');
    const submit = request('POST', 'api/inspections/77/submit');
    expect(submit.request.body).toEqual({ version: 4 });
    submit.flush(
      {
        error: {
          code: 'validation_failed',
          message: 'Invalid body field: findings.1.disposition: still to review',
          details: { fields: [{ field: 'findings.1.disposition', message: 'the girder was replaced: review this finding again' }] },
        },
        requestId: 'r-40',
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    expect(textOf('submit-problems')).toBe('Span 1 · Girder 2, lost strands: the girder was replaced: review this finding again');
    expect(row(601).querySelector('[data-testid="finding-problem"]')).not.toBeNull();
    expect(textOf('inspection-state')).toBe('Draft');
  });

  it('submits, and is read-only for its author from then on', async () => {
    await openPage(INSPECTOR, inspectionDetail({ findings: [carriedFinding({ disposition: 'confirmed' })] }));

    await click('submit-inspection');
    request('POST', 'api/inspections/77/submit').flush(
      inspectionDetail({ state: 'submitted', submittedAt: '2025-03-04T16:00:00.000Z', findings: [carriedFinding({ disposition: 'confirmed', registerState: 'open' })], version: 5 }),
    );
    await fixture.whenStable();

    expect(textOf('inspection-state')).toBe('Submitted');
    expect(snackBarOpen).toHaveBeenCalledWith('Inspection submitted: the raters of North Plains can review it now.', 'Dismiss', expect.anything());
    for (const testId of ['inspection-details-form', 'add-finding', 'submit-inspection', 'confirm-finding', 'grown-finding', 'repaired-finding', 'photo-input', 'accept-inspection', 'return-inspection']) {
      expect(element(testId)).toBeNull();
    }
    expect(textOf('fact-deckCondition')).toContain('6');
    expect(textOf('fact-substructureCondition')).toContain('Not rated');
    expect(textOf('read-only-note')).toContain('can no longer be changed');
  });

  it('is read-only for another inspector, even while a draft', async () => {
    await openPage(OTHER_INSPECTOR, inspectionDetail({ findings: [carriedFinding(), findingDetail()] }));

    for (const testId of ['inspection-details-form', 'add-finding', 'submit-inspection', 'confirm-finding', 'edit-finding', 'delete-finding', 'photo-input', 'accept-inspection']) {
      expect(element(testId)).toBeNull();
    }
    expect(textOf('read-only-note')).toBe('Only Tomasz Reyes, who is recording this inspection, can change it.');
  });

  it('lets a rater of the district accept a submitted inspection', async () => {
    await openPage(RATER, inspectionDetail({ state: 'submitted', submittedAt: '2025-03-04T16:00:00.000Z', version: 5 }));
    expect(element('submit-inspection')).toBeNull();
    expect(element('add-finding')).toBeNull();

    await click('accept-inspection');
    const accept = request('POST', 'api/inspections/77/accept');
    expect(accept.request.body).toEqual({ version: 5 });
    accept.flush(inspectionDetail({ state: 'accepted', reviewed: { at: '2025-03-05T09:00:00.000Z', by: 'Priya Halloran' }, version: 6 }));
    await fixture.whenStable();

    expect(textOf('inspection-state')).toBe('Accepted');
    expect(element('accept-inspection')).toBeNull();
    expect(textOf('fact-reviewed')).toContain('by Priya Halloran');
  });

  it('returns a submitted inspection only with a comment', async () => {
    await openPage(RATER, inspectionDetail({ state: 'submitted', version: 5 }));

    await click('return-inspection');
    await click('confirm-return');
    expect(await (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'What needs changing' }))).getTextErrors()).toEqual(['say what needs changing']);
    server.expectNone((each) => each.url === 'api/inspections/77/return');

    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="return-comment-input"]' }))).setValue('Span 2 girder 4 has no photo of the spall.');
    await click('confirm-return');
    const returned = request('POST', 'api/inspections/77/return');
    expect(returned.request.body).toEqual({ version: 5, comment: 'Span 2 girder 4 has no photo of the spall.' });
    returned.flush(inspectionDetail({ state: 'returned', returnComment: 'Span 2 girder 4 has no photo of the spall.', version: 6 }));
    await fixture.whenStable();

    expect(textOf('inspection-state')).toBe('Returned for changes');
    expect(textOf('return-comment')).toContain('Span 2 girder 4 has no photo of the spall.');
    expect(element('return-inspection')).toBeNull();
  });

  it('offers no review to a rater of another district', async () => {
    await openPage(RATER_ELSEWHERE, inspectionDetail({ state: 'submitted', version: 5 }));

    expect(element('accept-inspection')).toBeNull();
    expect(element('return-inspection')).toBeNull();
  });

  it('shows the return comment prominently to the author, who can change and submit again', async () => {
    await openPage(INSPECTOR, inspectionDetail({ state: 'returned', returnComment: 'Add the crack widths at midspan.', reviewed: { at: '2025-03-05T09:00:00.000Z', by: 'Priya Halloran' } }));

    expect(element('return-comment')?.querySelector('h2')?.textContent).toBe('Returned for changes by Priya Halloran');
    expect(element('return-comment')?.querySelector('p')?.textContent).toBe('Add the crack widths at midspan.');
    expect(element('inspection-details-form')).not.toBeNull();
    expect(element('submit-inspection')).not.toBeNull();
  });

  it('tells the author when someone else changed a finding, and reads the inspection again on request', async () => {
    await openPage(INSPECTOR, inspectionDetail({ findings: [carriedFinding()] }));

    await click('repaired-finding', '[data-finding-id="602"]');
    request('PUT', 'api/findings/602').flush(
      { error: { code: 'version_conflict', message: 'The finding was changed by someone else', details: { current: carriedFinding({ version: 2 }) } } },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    expect(textOf('inspection-conflict')).toContain('changed after you opened it');

    await click('reload-inspection');
    await reloadWith(inspectionDetail({ findings: [carriedFinding({ version: 2 })] }));
    await click('repaired-finding', '[data-finding-id="602"]');
    expect(request('PUT', 'api/findings/602').request.body).toMatchObject({ version: 2, disposition: 'repaired' });
  });

  it('deletes a new finding after asking', async () => {
    await openPage(INSPECTOR, inspectionDetail({ findings: [findingDetail()] }));

    await click('delete-finding', '[data-finding-id="601"]');
    server.expectNone((each) => each.method === 'DELETE');
    await click('confirm-delete-finding');
    request('DELETE', 'api/findings/601').flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    await reloadWith(inspectionDetail());
    server.expectOne('api/inspections/77/photos').flush([photoSummary()]);
    await fixture.whenStable();

    expect(row(601)).toBeNull();
  });
});
