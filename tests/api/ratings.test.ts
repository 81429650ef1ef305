import { parseRateFile, rateGirderLine, type GirderDetail, type HistoryEvent, type InspectionDetail, type Page, type RatingDetail, type RatingSetup, type RatingSummary, type StructureDetail, type StructureFeatureCollection } from '../../shared/src';
import { syncReferenceLibrary } from '../../backend/src/library/reference-library';
import { seed as seedDemoConditions } from '../../seeds/demo-conditions';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Demo staff (scripts/lib/local-identity-provider/demo-users.ts) and their districts. */
const STAFF = {
  inspectorSouth: 'bv-staff-1057',
  raterCentral: 'bv-staff-2013',
  raterEastSouth: 'bv-staff-2029',
  managerNetwork: 'bv-staff-3002',
  managerNorthCentral: 'bv-staff-3018',
} as const;
type Staff = keyof typeof STAFF;

type ErrorBody = { error?: { code: string; message: string; details: { fields?: { field: string; message: string }[] } } };

const RUN = { vehicleIds: ['hl93', 'type-3', 'type-3s2'], policyId: 'lrfr-default' };

describe('ratings API', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const clients = new Map<Staff, SignInClient>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    await seedDemoConditions(testDb.db);
    await syncReferenceLibrary(testDb.db);
    bed = await startSignInTestBed(testDb.url);
    for (const staff of Object.keys(STAFF) as Staff[]) {
      const client = new SignInClient(bed.server.url);
      await client.signInAs(STAFF[staff]);
      clients.set(staff, client);
    }
  }, 60_000);
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  async function call<T = unknown>(staff: Staff, path: string, init: { method?: string; json?: unknown } = {}) {
    const response = await clients.get(staff)!.request(path, init);
    return { status: response.status, body: (response.text ? JSON.parse(response.text) : null) as T & ErrorBody };
  }
  const fieldsOf = (body: ErrorBody) => (body.error?.details.fields ?? []).map((f) => f.field);

  /** The n-th structure of a district (in number order) with its first span and girder 2 of it. */
  async function placeIn(district: string, nth = 0) {
    const structure = (await testDb.db('structures').where({ district }).orderBy('structure_number').offset(nth).first('id')) as { id: number };
    const detail = (await call<StructureDetail>('raterCentral', `/api/structures/${structure.id}`)).body;
    const girderRow = await testDb.db('girders').where({ span_id: detail.spans[0]!.id, girder_number: 2 }).first('id');
    const girder = (await call<GirderDetail>('raterCentral', `/api/girders/${girderRow.id}`)).body;
    return { structure: detail, span: detail.spans[0]!, girder };
  }

  const runOn = (staff: Staff, spanId: number, body: Record<string, unknown> = {}) => call<RatingDetail>(staff, `/api/spans/${spanId}/ratings`, { json: { ...RUN, ...body } });
  const step = (staff: Staff, rating: Pick<RatingDetail, 'id' | 'version'>, name: 'submit' | 'approve' | 'return', comment = '') =>
    call<RatingDetail>(staff, `/api/ratings/${rating.id}/${name}`, { json: { version: rating.version, comment } });
  const dueFlag = async (spanId: number) => ((await testDb.db('spans').where({ id: spanId }).first('rerating_due_since')) as { rerating_due_since: Date | null }).rerating_due_since;

  /** An inspector of the South records lost strands on the girder and submits: the finding is on the register. */
  async function recordLostStrands(structureId: number, girder: GirderDetail, strands: number[]) {
    const started = await call<InspectionDetail>('inspectorSouth', `/api/structures/${structureId}/inspections`, { json: { inspectedOn: '2026-11-24', kind: 'damage' } });
    expect(started.status).toBe(201);
    for (const carried of started.body.findings) {
      const { kind, strands, lossFraction, brokenWires, spall, deckLossMm, crackWidthMm, fromM, toM, severity, notes, version } = carried;
      const confirmed = { kind, strands, lossFraction, brokenWires, spall, deckLossMm, crackWidthMm, fromM, toM, severity, notes, version, disposition: 'confirmed' };
      expect((await call('inspectorSouth', `/api/findings/${carried.id}`, { method: 'PUT', json: confirmed })).status).toBe(200);
    }
    const finding = await call<{ id: number }>('inspectorSouth', `/api/inspections/${started.body.id}/findings`, {
      json: { girderId: girder.id, kind: 'lost-strands', strands: { rowId: girder.strandRows[0]!.id, strands }, fromM: 9, toM: 10.5, severity: 'severe' },
    });
    expect(finding.status).toBe(201);
    const current = (await call<InspectionDetail>('inspectorSouth', `/api/inspections/${started.body.id}`)).body;
    expect((await call('inspectorSouth', `/api/inspections/${started.body.id}/submit`, { json: { version: current.version } })).status).toBe(200);
    return finding.body.id;
  }

  it('runs a draft rating of every girder of a span, keeping inputs that re-run to identical outputs', async () => {
    const { span } = await placeIn('Central District');
    const ran = await runOn('raterCentral', span.id);
    expect(ran.status).toBe(201);
    expect(ran.body).toMatchObject({ state: 'draft', spanId: span.id, girderCount: span.girderCount, hypothetical: false, policy: { id: 'lrfr-default' }, previousRecord: null });
    expect(ran.body.allowed).toEqual({ rerun: true, submit: true, approve: false, return: false });
    expect(ran.body.caution).toMatch(/licensed engineer/);
    expect(ran.body.warnings).toContain('shear not rated: this version rates flexure only');
    expect(ran.body.vehicles.map((vehicle) => vehicle.id)).toEqual(RUN.vehicleIds);
    // One result row per girder, vehicle and rating-factor key; one controlling row per level.
    expect(new Set(ran.body.results.map((row) => row.girderNumber)).size).toBe(span.girderCount);
    const controlling = ran.body.results.filter((row) => row.controlling);
    expect(controlling.map((row) => row.level).sort()).toEqual([...new Set(ran.body.results.map((row) => row.level))].sort());
    const legal = controlling.find((row) => row.level === 'legal')!;
    expect(ran.body.lowestLegalRf).toBe(legal.ratingFactor);

    // The stored calculation file is the whole input: the engine gives the stored output again.
    for (const girder of ran.body.girders) {
      const parsed = parseRateFile(girder.calcFile);
      if (!parsed.ok) throw new Error(parsed.issues.map((issue) => `${issue.path}: ${issue.message}`).join('; '));
      expect(JSON.parse(JSON.stringify(rateGirderLine(parsed.file)))).toEqual(girder.output);
      expect(girder.calcFile).toMatchObject({ vehicles: RUN.vehicleIds, policy: { id: 'lrfr-default' }, damage: [] });
    }
    const listed = await call<RatingSummary[]>('managerNetwork', `/api/structures/${ran.body.structureId}/ratings`);
    expect(listed.body.map((rating) => rating.id)).toContain(ran.body.id);
  });

  it('names every bad choice of a run and refuses those who may not rate there', async () => {
    const { span, girder } = await placeIn('Central District', 1);
    const other = await placeIn('Central District', 2);
    const bad = await runOn('raterCentral', span.id, { vehicleIds: ['hl93', 'no-such-truck'], girderIds: [other.girder.id], exclusions: [{ findingId: 999999, reason: 'repaired' }] });
    expect(bad.status).toBe(400);
    expect(fieldsOf(bad.body)).toEqual(['girderIds.0']);
    const badVehicle = await runOn('raterCentral', span.id, { vehicleIds: ['hl93', 'no-such-truck'] });
    expect(fieldsOf(badVehicle.body)).toEqual(['vehicleIds.1']);
    const badExclusion = await runOn('raterCentral', span.id, { exclusions: [{ findingId: 999999, reason: 'repaired' }] });
    expect(fieldsOf(badExclusion.body)).toEqual(['exclusions.0.findingId']);
    const badPolicy = await runOn('raterCentral', span.id, { policyId: 'unknown' });
    expect(fieldsOf(badPolicy.body)).toEqual(['policyId']);
    const badWhatIf = await runOn('raterCentral', span.id, { hypothetical: [{ girderId: girder.id, entry: { kind: 'lost-strands', rowId: 'no-row', count: 1, fromM: 1, toM: 2 } }] });
    expect(badWhatIf.status).toBe(400);
    expect(fieldsOf(badWhatIf.body)[0]).toMatch(/^hypothetical\.0\.entry/);
    expect((await runOn('raterCentral', span.id, { vehicleIds: [] })).status).toBe(400);

    expect((await runOn('inspectorSouth', span.id)).status).toBe(403);
    expect((await runOn('raterEastSouth', span.id)).status).toBe(403);
    expect((await call('raterCentral', '/api/spans/999999/ratings', { json: RUN })).status).toBe(404);
    expect((await call('raterCentral', '/api/ratings/999999')).status).toBe(404);
  });

  it('applies the open findings of the span oldest first, and leaves out an excluded one with its reason', async () => {
    const { structure, span, girder } = await placeIn('South District', 1);
    const sound = await runOn('raterEastSouth', span.id, { girderIds: [girder.id] });
    expect(sound.status).toBe(201);
    const findingId = await recordLostStrands(structure.id, girder, [0, 1, 2, 3]);
    expect(await dueFlag(span.id)).not.toBeNull();

    const setup = await call<RatingSetup>('raterEastSouth', `/api/spans/${span.id}/rating-setup`);
    expect(setup.body.reratingDue).toBe(true);
    expect(setup.body.openFindings).toEqual([expect.objectContaining({ findingId, girderNumber: 2, kind: 'lost-strands', excludedReason: null })]);
    expect(setup.body.vehicles.map((vehicle) => vehicle.id)).toEqual(expect.arrayContaining(RUN.vehicleIds));

    const damaged = await runOn('raterEastSouth', span.id, { girderIds: [girder.id] });
    expect(damaged.status).toBe(201);
    expect(damaged.body.appliedFindings).toEqual([expect.objectContaining({ findingId, excludedReason: null, damageEntry: expect.objectContaining({ kind: 'lost-strands', strands: [0, 1, 2, 3] }) })]);
    expect(damaged.body.girders[0]!.calcFile.damage).toEqual([{ kind: 'lost-strands', rowId: girder.strandRows[0]!.id, strands: [0, 1, 2, 3], fromM: 9, toM: 10.5, findingId }]);
    // Four strands fewer over part of the span: no more capacity there than the sound girder had.
    expect(damaged.body.lowestInventoryRf!).toBeLessThanOrEqual(sound.body.lowestInventoryRf!);
    const zones = damaged.body.girders[0]!.output.summary.capacityAlongSpan.damagedZonesM;
    expect(zones).toEqual([expect.objectContaining({ fromM: 9, toM: 10.5 })]);

    const excluded = await runOn('raterEastSouth', span.id, { girderIds: [girder.id], exclusions: [{ findingId, reason: 'strands spliced on 2026-11-26, repair report on file' }] });
    expect(excluded.body.appliedFindings[0]!.excludedReason).toBe('strands spliced on 2026-11-26, repair report on file');
    expect(excluded.body.girders[0]!.calcFile.damage).toEqual([]);
    expect(excluded.body.lowestInventoryRf).toBe(sound.body.lowestInventoryRf);
    const noReason = await runOn('raterEastSouth', span.id, { exclusions: [{ findingId, reason: '' }] });
    expect(fieldsOf(noReason.body)).toEqual(['exclusions.0.reason']);
  });

  it('takes a rating through submit, return, run again and approval by someone else; it becomes the rating of record', async () => {
    const { structure, span, girder } = await placeIn('South District', 2);
    await recordLostStrands(structure.id, girder, [0, 1]);
    const due = async () => {
      const detail = (await call<StructureDetail>('managerNetwork', `/api/structures/${structure.id}`)).body;
      const listed = (await call<StructureFeatureCollection>('managerNetwork', '/api/structures?reratingDue=true&limit=20000')).body;
      return { detail: detail.reratingDue, listed: listed.features.some((feature) => feature.id === structure.id) };
    };
    expect(await due()).toEqual({ detail: true, listed: true });
    const draft = (await runOn('raterEastSouth', span.id)).body;
    expect((await call('raterCentral', `/api/ratings/${draft.id}/submit`, { json: { version: draft.version } })).status).toBe(403);
    expect((await step('raterEastSouth', { ...draft, version: draft.version + 5 }, 'submit')).status).toBe(409);
    const submitted = await step('raterEastSouth', draft, 'submit', 'lost strands of the November inspection applied');
    expect(submitted.status).toBe(200);
    expect(submitted.body).toMatchObject({ state: 'submitted', submitted: { by: 'Tomasz Brenek' }, allowed: { rerun: false, submit: false, approve: false, return: false } });
    const queue = await call<RatingSummary[]>('managerNetwork', '/api/ratings/waiting-for-review');
    expect(queue.body.map((rating) => rating.id)).toContain(draft.id);

    // Nobody approves their own rating; a reviewer outside the district may not either.
    const own = await step('raterEastSouth', submitted.body, 'approve');
    expect(own.status).toBe(403);
    expect(own.body.error!.message).toMatch(/another engineer/);
    expect((await step('managerNorthCentral', submitted.body, 'approve')).status).toBe(403);
    expect((await step('inspectorSouth', submitted.body, 'approve')).status).toBe(403);
    const asReviewer = await call<RatingDetail>('managerNetwork', `/api/ratings/${draft.id}`);
    expect(asReviewer.body.allowed).toEqual({ rerun: false, submit: false, approve: true, return: true });

    expect(fieldsOf((await step('managerNetwork', submitted.body, 'return')).body)).toEqual(['comment']);
    const returned = await step('managerNetwork', submitted.body, 'return', 'rate the exterior girders with the lever rule as well');
    expect(returned.body).toMatchObject({ state: 'returned', reviewed: { by: 'Greer Ashdown' } });
    expect((await step('managerNetwork', returned.body, 'approve')).status).toBe(409);

    const rerun = await call<RatingDetail>('raterEastSouth', `/api/ratings/${draft.id}`, { method: 'PUT', json: { ...RUN, vehicleIds: ['hl93', 'type-3'], version: returned.body.version } });
    expect(rerun.status).toBe(200);
    expect(rerun.body.vehicles.map((vehicle) => vehicle.id)).toEqual(['hl93', 'type-3']);
    const stale = await call('raterEastSouth', `/api/ratings/${draft.id}`, { method: 'PUT', json: { ...RUN, version: returned.body.version } });
    expect(stale.status).toBe(409);
    const resubmitted = (await step('raterEastSouth', rerun.body, 'submit', 'done')).body;
    const approved = await step('managerNetwork', resubmitted, 'approve', 'agreed');
    expect(approved.status).toBe(200);
    expect(approved.body.state).toBe('approved');
    expect(approved.body.reviewComments.map((comment) => comment.step)).toEqual(['submitted', 'returned', 'submitted', 'approved']);
    // Each step is in the structure's history, named by the rating and its span.
    const structureHistory = (await call<Page<HistoryEvent>>('inspectorSouth', `/api/structures/${structure.id}/history?limit=100`)).body;
    const ratingSteps = structureHistory.items.filter((event) => event.entityType === 'rating' && event.entityId === String(draft.id));
    expect(ratingSteps.map((event) => event.action).reverse()).toEqual(['rating.run', 'rating.submitted', 'rating.returned', 'rating.run-again', 'rating.submitted', 'rating.approved']);
    expect(new Set(ratingSteps.map((event) => event.subject))).toEqual(new Set([`Rating ${draft.id} of span ${span.spanIndex}`]));

    const figures = await testDb.db('structures').where({ id: structure.id }).first('rating_of_record_legal_rf', 'rating_of_record_inventory_rf', 'rating_of_record_approved_at');
    expect(figures).toMatchObject({ rating_of_record_legal_rf: approved.body.lowestLegalRf, rating_of_record_inventory_rf: approved.body.lowestInventoryRf });
    expect(figures.rating_of_record_approved_at).not.toBeNull();
    expect(await dueFlag(span.id)).toBeNull();
    expect(await due()).toEqual({ detail: false, listed: false });

    // The next approved rating supersedes it and names it as the one before.
    const next = (await runOn('raterEastSouth', span.id)).body;
    expect(next.previousRecord).toMatchObject({ id: draft.id, lowestLegalRf: approved.body.lowestLegalRf });
    const nextApproved = await step('managerNetwork', (await step('raterEastSouth', next, 'submit')).body, 'approve');
    expect(nextApproved.body.state).toBe('approved');
    expect((await call<RatingDetail>('managerNetwork', `/api/ratings/${draft.id}`)).body.state).toBe('superseded');
    const history = await testDb.db('audit_events').where({ entity_type: 'rating' }).whereIn('entity_id', [String(draft.id), String(next.id)]).orderBy('id').pluck('action');
    expect(history).toEqual(['rating.run', 'rating.submitted', 'rating.returned', 'rating.run-again', 'rating.submitted', 'rating.approved', 'rating.run', 'rating.submitted', 'rating.superseded', 'rating.approved']);
  });

  it('keeps the span due when damage is recorded after the approved rating was run', async () => {
    const { structure, span, girder } = await placeIn('South District', 3);
    await recordLostStrands(structure.id, girder, [0]);
    const draft = (await runOn('raterEastSouth', span.id)).body;
    const submitted = (await step('raterEastSouth', draft, 'submit')).body;
    await recordLostStrands(structure.id, girder, [1]);
    expect((await step('managerNetwork', submitted, 'approve')).body.state).toBe('approved');
    expect(await dueFlag(span.id)).not.toBeNull();
  });

  it('marks a rating with what-if damage hypothetical and never approves it', async () => {
    const { span, girder } = await placeIn('South District', 4);
    const whatIf = await runOn('raterEastSouth', span.id, {
      girderIds: [girder.id],
      hypothetical: [{ girderId: girder.id, entry: { kind: 'lost-strands', rowId: girder.strandRows[0]!.id, count: 3, fromM: 5, toM: 6 }, note: 'if the strike had cut three strands' }],
    });
    expect(whatIf.status).toBe(201);
    expect(whatIf.body.hypothetical).toBe(true);
    expect(whatIf.body.girders[0]!.calcFile.damage).toEqual([{ kind: 'lost-strands', rowId: girder.strandRows[0]!.id, count: 3, fromM: 5, toM: 6, hypothetical: true }]);
    const submitted = (await step('raterEastSouth', whatIf.body, 'submit', 'for discussion')).body;
    expect((await call<RatingDetail>('managerNetwork', `/api/ratings/${submitted.id}`)).body.allowed.approve).toBe(false);
    const refused = await step('managerNetwork', submitted, 'approve');
    expect(refused.status).toBe(409);
    expect(refused.body.error!.code).toBe('not_approvable');
    expect((await step('managerNetwork', submitted, 'return', 'discussed; run without the what-if entry')).status).toBe(200);
  });
});
