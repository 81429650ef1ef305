import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { RatingRun, RatingSetup } from '@spanledger/shared';

import { RatingChoicesComponent } from './rating-choices.component';

// Each case drives the form through Material harnesses; on a busy two-core machine that can pass Jest's 5 s default.
jest.setTimeout(30_000);

const SETUP: RatingSetup = {
  spanId: 301,
  spanIndex: 1,
  spanLengthM: 24,
  structureId: 41,
  structureNumber: 'BV-S-0178',
  structureName: 'Test bridge',
  district: 'South District',
  girders: [
    { id: 9001, girderNumber: 1, position: 'exterior' },
    { id: 9002, girderNumber: 2, position: 'interior' },
  ],
  openFindings: [
    {
      findingId: 77,
      girderId: 9002,
      girderNumber: 2,
      kind: 'lost-strands',
      fromM: 9,
      toM: 12,
      inspectedOn: '2026-11-24',
      damageEntry: { kind: 'lost-strands', rowId: 'r1', strands: [0, 1], fromM: 9, toM: 12, findingId: 77 },
      excludedReason: null,
    },
  ],
  vehicles: [
    { id: 'hl93', version: '1', name: 'HL-93 design live load', category: 'design' },
    { id: 'type-3', version: '1', name: 'Type 3 legal truck', category: 'legal' },
    { id: 'ev2', version: '1', name: 'Emergency vehicle EV2', category: 'emergency' },
  ],
  policies: [{ id: 'lrfr-default', version: '1', name: 'LRFR default factors' }],
  ratingOfRecord: null,
  reratingDue: true,
};

describe('RatingChoicesComponent', () => {
  let fixture: ComponentFixture<RatingChoicesComponent>;
  let loader: HarnessLoader;
  let runs: RatingRun[];

  async function open(previousRun: RatingRun | null = null): Promise<void> {
    TestBed.configureTestingModule({ imports: [RatingChoicesComponent], providers: [provideHttpClient(), provideHttpClientTesting()] });
    fixture = TestBed.createComponent(RatingChoicesComponent);
    fixture.componentRef.setInput('setup', SETUP);
    fixture.componentRef.setInput('previousRun', previousRun);
    runs = [];
    fixture.componentInstance.run.subscribe((run) => runs.push(run));
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  afterEach(() => TestBed.inject(HttpTestingController).verify());

  const element = (testId: string) => fixture.nativeElement.querySelector(`[data-testid="${testId}"]`) as HTMLElement | null;
  async function run(): Promise<void> {
    element('run-rating')!.click();
    await fixture.whenStable();
  }

  it('starts from every girder, the design and legal vehicles and the first policy, with every open finding applied', async () => {
    await open();
    const vehicles = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="choice-vehicles"]' }));
    expect(await vehicles.getValueText()).toBe('HL-93 design live load, Type 3 legal truck');
    expect(element('applied-finding-77')!.textContent).toMatch(/Girder 2 · Lost strands, row r1: strands 0, 1, 9\.00–12\.00 m/);
    await run();
    expect(runs).toEqual([
      { girderIds: [9001, 9002], vehicleIds: ['hl93', 'type-3'], policyId: 'lrfr-default', strandCurve: 'power', concreteModel: 'whitney', exclusions: [], hypothetical: [], notes: '' },
    ]);
  });

  it('asks why a finding is left out before it runs, and sends the reason', async () => {
    await open();
    const applyFinding = await loader.getHarness(MatCheckboxHarness.with({ selector: '[data-testid="apply-finding-77"]' }));
    await applyFinding.uncheck();
    await run();
    expect(runs).toEqual([]);
    expect(element('choice-problems')!.textContent).toContain('Excluded finding: say why, in a few words');

    const reason = element('exclusion-reason-77') as HTMLInputElement;
    reason.value = 'strands spliced, repair report on file';
    reason.dispatchEvent(new Event('input'));
    await run();
    expect(runs[0]!.exclusions).toEqual([{ findingId: 77, reason: 'strands spliced, repair report on file' }]);
    expect(element('choice-problems')).toBeNull();
  });

  it('starts a run again from the record’s own choices', async () => {
    const previous: RatingRun = {
      girderIds: [9002],
      vehicleIds: ['ev2'],
      policyId: 'lrfr-default',
      strandCurve: 'pci',
      concreteModel: 'parabolic',
      exclusions: [{ findingId: 77, reason: 'repaired' }],
      hypothetical: [{ girderId: 9002, entry: { kind: 'lost-strands', rowId: 'r1', count: 2, fromM: 5, toM: 6 }, note: 'if two more break' }],
      notes: 'second look',
    };
    await open(previous);
    expect(element('what-if-damage')!.textContent).toContain('Girder 2: 2 lost strands in row r1 from 5.00 m to 6.00 m — if two more break');
    expect((element('exclusion-reason-77') as HTMLInputElement).value).toBe('repaired');
    await run();
    expect(runs).toEqual([previous]);
  });
});
