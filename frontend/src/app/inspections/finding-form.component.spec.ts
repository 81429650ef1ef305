import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleGroupHarness } from '@angular/material/button-toggle/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { FindingDetail, InspectionDetail } from '@spanledger/shared';

import { girderSummary, spanDetail } from '../structures/inventory.testing';
import { UnitsStore } from '../units/units.store';
import { FindingFormComponent } from './finding-form.component';
import { carriedFinding, findingDetail, girderDetail, inspectionDetail } from './inspections.testing';

// Each case drives a whole form through Material harnesses; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

const SPANS = [spanDetail(), spanDetail({ id: 302, spanIndex: 2, lengthM: 24, version: 5 })];
const GIRDERS = [girderSummary({ id: 9001, girderNumber: 1 }), girderSummary({ id: 9002, girderNumber: 2, position: 'interior' })];

describe('FindingFormComponent', () => {
  let fixture: ComponentFixture<FindingFormComponent>;
  let loader: HarnessLoader;
  let server: HttpTestingController;
  let saved: FindingDetail[];

  async function openForm(options: { inspection?: InspectionDetail; finding?: FindingDetail | null; disposition?: 'grown' | null } = {}): Promise<void> {
    TestBed.configureTestingModule({ imports: [FindingFormComponent], providers: [provideHttpClient(), provideHttpClientTesting()] });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(FindingFormComponent);
    fixture.componentRef.setInput('inspection', options.inspection ?? inspectionDetail());
    fixture.componentRef.setInput('spans', SPANS);
    fixture.componentRef.setInput('finding', options.finding ?? null);
    fixture.componentRef.setInput('disposition', options.disposition ?? null);
    saved = [];
    fixture.componentInstance.saved.subscribe((finding) => saved.push(finding));
    loader = TestbedHarnessEnvironment.loader(fixture);
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

  async function choose(testId: string, option: string): Promise<void> {
    const select = await loader.getHarness(MatSelectHarness.with({ selector: `[data-testid="${testId}"]` }));
    await select.open();
    await select.clickOptions({ text: option });
  }

  async function type(testId: string, value: string): Promise<void> {
    await (await loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${testId}"]` }))).setValue(value);
  }

  async function severity(name: string): Promise<void> {
    const group = await loader.getHarness(MatButtonToggleGroupHarness.with({ selector: '[data-testid="finding-severity"]' }));
    const [toggle] = await group.getToggles({ text: name });
    await toggle!.check();
  }

  async function click(testId: string): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ selector: `[data-testid="${testId}"]` }))).click();
  }

  async function errorsUnder(label: string): Promise<string[]> {
    return (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }))).getTextErrors();
  }

  async function tapStrand(rowId: string, index: number): Promise<void> {
    const strand = fixture.nativeElement.querySelector(`[data-testid="strand"][data-row-id="${rowId}"][data-index="${index}"]`) as SVGElement;
    strand.dispatchEvent(new MouseEvent('click', { bubbles: true }));
    await fixture.whenStable();
  }

  /** Span 1, girder 2 and a kind chosen; a kind that names strands loads the girder's rows. */
  async function chooseGirderAndKind(kind: string): Promise<void> {
    await choose('finding-span', 'Span 1');
    server.expectOne('api/spans/301/girders').flush(GIRDERS);
    await fixture.whenStable();
    await choose('finding-girder', 'Girder 2 (interior)');
    await choose('finding-kind', kind);
  }

  function flushGirder(): void {
    server.expectOne('api/girders/9002').flush(girderDetail());
  }

  function posted(): TestRequest {
    return server.expectOne((request) => request.method === 'POST' && request.url === 'api/inspections/77/findings');
  }

  it("asks for each kind's own values and nothing else", async () => {
    await openForm();
    await chooseGirderAndKind('Spall');
    expect(element('finding-spall-depth')).not.toBeNull();
    expect(element('finding-spall-width')).not.toBeNull();
    expect(element('finding-strands')).toBeNull();
    expect(element('finding-loss-fraction')).toBeNull();

    await choose('finding-kind', 'Strand section loss');
    flushGirder();
    await fixture.whenStable();
    expect(element('finding-strands')).not.toBeNull();
    expect(element('finding-loss-fraction')).not.toBeNull();
    expect(element('finding-spall-depth')).toBeNull();

    await choose('finding-kind', 'Broken wires');
    expect(element('finding-broken-wires')).not.toBeNull();
    expect(element('finding-loss-fraction')).toBeNull();

    await choose('finding-kind', 'Deck loss');
    expect(element('finding-deck-loss')).not.toBeNull();
    expect(element('finding-strands')).toBeNull();

    await choose('finding-kind', 'Crack');
    expect(element('finding-crack-width')).not.toBeNull();
    expect(element('finding-deck-loss')).toBeNull();
  });

  it('names the strands tapped on the cross-section, all in one row, and sends them with the finding', async () => {
    await openForm();
    await chooseGirderAndKind('Lost strands');
    flushGirder();
    await fixture.whenStable();

    await tapStrand('r1', 3);
    await tapStrand('r1', 1);
    await tapStrand('r1', 7);
    await tapStrand('r1', 3);
    expect(textOf('strands-tapped')).toContain('Row r1: strands 1, 7 (2 in all)');
    const selected = [...fixture.nativeElement.querySelectorAll('[data-testid="strand"][data-selected="true"]')].map((strand) => (strand as Element).getAttribute('data-index'));
    expect(selected).toEqual(['1', '7']);

    await type('finding-from', '12');
    await type('finding-to', '14.5');
    await severity('Severe');
    await type('finding-notes', 'Both strands snapped at a spall.');
    await click('save-finding');

    const request = posted();
    expect(request.request.body).toEqual({
      girderId: 9002,
      kind: 'lost-strands',
      strands: { rowId: 'r1', strands: [1, 7] },
      lossFraction: null,
      brokenWires: null,
      spall: null,
      deckLossMm: null,
      crackWidthMm: null,
      fromM: 12,
      toM: 14.5,
      severity: 'severe',
      notes: 'Both strands snapped at a spall.',
    });
    request.flush(findingDetail({ strands: { rowId: 'r1', strands: [1, 7] } }));
    expect(saved).toHaveLength(1);
  });

  it('starts the choice again when a strand of another row is tapped', async () => {
    await openForm();
    await chooseGirderAndKind('Exposed strands');
    flushGirder();
    await fixture.whenStable();

    await tapStrand('r1', 0);
    await tapStrand('r2', 4);

    expect(textOf('strands-tapped')).toContain('Row r2: strand 4 (1 in all)');
    expect(textOf('strands-row-restarted')).toContain('strands of one row');
  });

  it("draws the strands this inspection's other findings already name on the girder", async () => {
    await openForm({ inspection: inspectionDetail({ findings: [findingDetail({ strands: { rowId: 'r1', strands: [0, 9] } })] }) });
    await chooseGirderAndKind('Broken wires');
    flushGirder();
    await fixture.whenStable();

    const state = (index: number) => fixture.nativeElement.querySelector(`[data-testid="strand"][data-row-id="r1"][data-index="${index}"]`).getAttribute('data-state');
    expect([state(0), state(1), state(9)]).toEqual(['lost', 'intact', 'lost']);
  });

  it('takes a row and a count instead, and positions and sizes typed in US customary units', async () => {
    await openForm();
    TestBed.inject(UnitsStore).use('us');
    await chooseGirderAndKind('Broken wires');
    flushGirder();
    await fixture.whenStable();

    await (await (await loader.getHarness(MatButtonToggleGroupHarness.with({ selector: '[data-testid="strand-entry"]' }))).getToggles({ text: 'A row and a count' }))[0]!.check();
    await choose('finding-strand-row', 'Row r2: 6 strands at 4.33 in up');
    await type('finding-strand-count', '2');
    await type('finding-broken-wires', '3');
    await type('finding-from', '40');
    await type('finding-to', '45');
    await severity('Critical');
    await click('save-finding');

    const body = posted().request.body;
    expect(body).toMatchObject({ kind: 'broken-wires', strands: { rowId: 'r2', count: 2 }, brokenWires: 3, fromM: 12.192, toM: 13.716, severity: 'critical' });
  });

  it('checks the finding with the server rules before sending, naming each field', async () => {
    await openForm();
    await chooseGirderAndKind('Lost strands');
    flushGirder();
    await fixture.whenStable();
    await type('finding-from', '20');
    await type('finding-to', '31');
    await click('save-finding');

    expect(await errorsUnder('To')).toEqual(['lies beyond the span (30.48 m)']);
    expect(textOf('strands-error')).toContain('tap at least one strand');
    expect(textOf('finding-severity-error')).toBe('is required');

    await tapStrand('r1', 2);
    await type('finding-to', '15');
    await severity('Moderate');
    await click('save-finding');
    expect(await errorsUnder('To')).toEqual(['must not be before "from"']);
    server.expectNone((request) => request.method === 'POST');
  });

  it('asks for the depth and width of a spall in the words of the rules', async () => {
    await openForm();
    await chooseGirderAndKind('Spall');
    await type('finding-spall-depth', '-5');
    await type('finding-from', '3');
    await type('finding-to', '4');
    await severity('Minor');
    await click('save-finding');

    expect(await errorsUnder('Spall depth')).toEqual(['must be > 0']);
    expect(await errorsUnder('Spall width')).toEqual(['is required']);
    server.expectNone((request) => request.method === 'POST');
  });

  it("shows the server's refusal of a tapped strand under the drawing, naming the strand", async () => {
    await openForm();
    await chooseGirderAndKind('Lost strands');
    flushGirder();
    await fixture.whenStable();
    await tapStrand('r1', 4);
    await tapStrand('r1', 8);
    await type('finding-from', '1');
    await type('finding-to', '2');
    await severity('Severe');
    await click('save-finding');

    posted().flush(
      {
        error: {
          code: 'validation_failed',
          message: 'Invalid body field: strands.strands.1: row r1 of girder 2 has only 8 strands now',
          details: { fields: [{ field: 'strands.strands.1', message: 'row r1 of girder 2 has only 8 strands now' }] },
        },
        requestId: 'r-21',
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    expect(textOf('strands-error')).toBe('Row r1, strand 8: row r1 of girder 2 has only 8 strands now');
    expect(saved).toHaveLength(0);
  });

  it('records the growth of a carried-forward finding with its new extent, keeping its girder and kind', async () => {
    const finding = carriedFinding();
    await openForm({ inspection: inspectionDetail({ findings: [finding] }), finding, disposition: 'grown' });
    server.expectOne('api/spans/301/girders').flush(GIRDERS);
    await fixture.whenStable();

    expect(textOf('finding-form')).toContain('Record the growth of spall on span 1, girder 2');
    expect(await (await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="finding-kind"]' }))).isDisabled()).toBe(true);
    expect(await (await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="finding-girder"]' }))).isDisabled()).toBe(true);
    await type('finding-spall-width', '220');
    await type('finding-to', '5.2');
    await click('save-finding');

    const request = server.expectOne((each) => each.method === 'PUT' && each.url === 'api/findings/602');
    expect(request.request.body).toEqual({
      version: 1,
      kind: 'spall',
      strands: null,
      lossFraction: null,
      brokenWires: null,
      spall: { depthMm: 40, widthMm: 220 },
      deckLossMm: null,
      crackWidthMm: null,
      fromM: 3,
      toM: 5.2,
      severity: 'moderate',
      notes: '',
      disposition: 'grown',
    });
    request.flush(carriedFinding({ disposition: 'grown', spall: { depthMm: 40, widthMm: 220 }, toM: 5.2, version: 2 }));
    expect(saved).toHaveLength(1);
  });

  it('offers a reload when someone else changed the finding', async () => {
    const finding = findingDetail({ kind: 'crack', strands: null, crackWidthMm: 0.3, critical: false });
    let reloads = 0;
    await openForm({ inspection: inspectionDetail({ findings: [finding] }), finding });
    fixture.componentInstance.reloadRequested.subscribe(() => reloads++);
    server.expectOne('api/spans/301/girders').flush(GIRDERS);
    await fixture.whenStable();
    await type('finding-crack-width', '0.5');
    await click('save-finding');

    server
      .expectOne((each) => each.method === 'PUT' && each.url === 'api/findings/601')
      .flush({ error: { code: 'version_conflict', message: 'The finding was changed by someone else', details: { current: finding } } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();

    expect(textOf('finding-conflict')).toContain('changed after you opened it');
    await click('reload-finding');
    expect(reloads).toBe(1);
  });
});
