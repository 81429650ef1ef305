import type { AlertItem, FindingDetail, GirderDetail, InspectionDetail, InspectionSummary, StructureDetail } from '../../shared/src';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Demo staff (scripts/lib/local-identity-provider/demo-users.ts) and their districts. */
const STAFF = {
  inspectorNorth: 'bv-staff-1041',
  inspectorSouth: 'bv-staff-1057',
  raterCentral: 'bv-staff-2013',
  raterEastSouth: 'bv-staff-2029',
  managerNorthCentral: 'bv-staff-3018',
} as const;
type Staff = keyof typeof STAFF;

type ErrorBody = { error?: { code: string; message: string; details: { fields?: { field: string; message: string }[] } } };

describe('inspections API', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const clients = new Map<Staff, SignInClient>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
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

  /** The n-th structure of a district (in number order) with its first span and an interior girder of it. */
  async function placeIn(district: string, nth = 0) {
    const structure = (await testDb.db('structures').where({ district }).orderBy('structure_number').offset(nth).first('id')) as { id: number };
    const detail = (await call<StructureDetail>('raterCentral', `/api/structures/${structure.id}`)).body;
    const girderRow = await testDb.db('girders').where({ span_id: detail.spans[0]!.id, girder_number: 2 }).first('id');
    const girder = (await call<GirderDetail>('raterCentral', `/api/girders/${girderRow.id}`)).body;
    return { structure: detail, span: detail.spans[0]!, girder };
  }

  const start = (staff: Staff, structureId: number, body: Record<string, unknown> = {}) =>
    call<InspectionDetail>(staff, `/api/structures/${structureId}/inspections`, { json: { inspectedOn: '2026-11-20', kind: 'routine', ...body } });

  const lostStrands = (girder: GirderDetail, strands: number[], extra: Record<string, unknown> = {}) => ({
    girderId: girder.id,
    kind: 'lost-strands',
    strands: { rowId: girder.strandRows[0]!.id, strands },
    fromM: 6,
    toM: 7.5,
    severity: 'severe',
    ...extra,
  });

  it('lets an inspector record a draft with findings, each mapped onto a damage entry, and only its author change it', async () => {
    const { structure, girder } = await placeIn('North District');
    const started = await start('inspectorNorth', structure.id, { superstructureCondition: 5 });
    expect(started.status).toBe(201);
    expect(started.body).toMatchObject({ state: 'draft', inspectorName: 'Dana Whitcombe', findings: [], conditions: { superstructure: 5 } });

    const added = await call<FindingDetail>('inspectorNorth', `/api/inspections/${started.body.id}/findings`, { json: lostStrands(girder, [0, 1]) });
    expect(added.status).toBe(201);
    expect(added.body).toMatchObject({ girderNumber: 2, disposition: 'new', registerState: 'draft', critical: true });
    expect(added.body.damageEntry).toEqual({ kind: 'lost-strands', rowId: girder.strandRows[0]!.id, strands: [0, 1], fromM: 6, toM: 7.5, findingId: added.body.id });

    // Another inspector, a rater and the wrong district are all refused.
    expect((await call('inspectorSouth', `/api/inspections/${started.body.id}`, { method: 'PATCH', json: { version: 1, notes: 'x' } })).status).toBe(403);
    expect((await call('raterCentral', `/api/inspections/${started.body.id}/findings`, { json: lostStrands(girder, [2]) })).status).toBe(403);
    expect((await start('inspectorSouth', structure.id)).status).toBe(403);
    // One inspection of a structure is written at a time.
    const second = await start('inspectorNorth', structure.id);
    expect(second.status).toBe(409);
    expect(second.body.error!.message).toMatch(/already being written/);

    const changed = await call<InspectionDetail>('inspectorNorth', `/api/inspections/${started.body.id}`, { method: 'PATCH', json: { version: 1, notes: 'Efflorescence at pier 1' } });
    expect(changed.body).toMatchObject({ notes: 'Efflorescence at pier 1', version: 2 });
  });

  it('refuses findings the girder cannot have, naming the field', async () => {
    const { structure, girder } = await placeIn('North District', 1);
    const { body: inspection } = await start('inspectorNorth', structure.id);
    const row = girder.strandRows[0]!;
    const post = (finding: Record<string, unknown>) => call('inspectorNorth', `/api/inspections/${inspection.id}/findings`, { json: finding });

    const beyondRow = await post(lostStrands(girder, [0, row.count + 3]));
    expect(beyondRow.status).toBe(400);
    expect(fieldsOf(beyondRow.body)).toEqual(['strands.strands.1']);
    expect(beyondRow.body.error!.message).toMatch(`strands 0–${row.count - 1} only`);
    expect(fieldsOf((await post({ ...lostStrands(girder, [0]), strands: { rowId: row.id, count: row.count + 1 } })).body)).toEqual(['strands.count']);
    expect(fieldsOf((await post({ ...lostStrands(girder, [0]), strands: { rowId: 'no-such-row', strands: [0] } })).body)).toEqual(['strands.rowId']);
    expect(fieldsOf((await post(lostStrands(girder, [0], { toM: structure.spans[0]!.lengthM + 5 }))).body)).toEqual(['toM']);
    expect(fieldsOf((await post({ girderId: girder.id, kind: 'spall', spall: { depthMm: 60, widthMm: 50_000 }, fromM: 1, toM: 2, severity: 'moderate' })).body)).toEqual(['spall']);
    const otherStructure = await placeIn('South District');
    expect(fieldsOf((await post(lostStrands(otherStructure.girder, [0]))).body)).toEqual(['girderId']);
    expect(fieldsOf((await post({ ...lostStrands(girder, [0]), kind: 'strand-section-loss' })).body)).toEqual(['lossFraction']);
    expect((await call<InspectionDetail>('inspectorNorth', `/api/inspections/${inspection.id}`)).body.findings).toEqual([]);
  });

  it('alerts the raters of the district to a critical finding on submit, once, and makes the inspection read-only', async () => {
    const { structure, girder } = await placeIn('South District');
    const { body: inspection } = await start('inspectorSouth', structure.id);
    const finding = (await call<FindingDetail>('inspectorSouth', `/api/inspections/${inspection.id}/findings`, { json: lostStrands(girder, [0, 1]) })).body;
    const submitted = await call<InspectionDetail>('inspectorSouth', `/api/inspections/${inspection.id}/submit`, { json: { version: inspection.version } });
    expect(submitted.status).toBe(200);
    expect(submitted.body.state).toBe('submitted');
    expect(submitted.body.findings[0]!.registerState).toBe('open');

    const southRaterAlerts = (await call<AlertItem[]>('raterEastSouth', '/api/alerts')).body;
    expect(southRaterAlerts).toHaveLength(1);
    expect(southRaterAlerts[0]).toMatchObject({ kind: 'critical-finding', structureId: structure.id, girderId: girder.id, findingId: finding.id, readAt: null });
    expect(southRaterAlerts[0]!.message).toMatch(/Lost strands on girder 2 of span 1/);
    expect((await call<AlertItem[]>('raterCentral', '/api/alerts')).body).toEqual([]);
    expect((await call('raterEastSouth', `/api/alerts/${southRaterAlerts[0]!.id}/read`, { method: 'POST' })).status).toBe(204);
    expect((await call('raterCentral', `/api/alerts/${southRaterAlerts[0]!.id}/read`, { method: 'POST' })).status).toBe(404);
    expect((await call<AlertItem[]>('raterEastSouth', '/api/alerts')).body[0]!.readAt).not.toBeNull();

    // Submitted: the author can no longer change it or its findings.
    const locked = await call('inspectorSouth', `/api/findings/${finding.id}`, { method: 'PUT', json: { ...lostStrands(girder, [0]), girderId: undefined, version: finding.version } });
    expect(locked.status).toBe(409);
    expect(locked.body.error!.code).toBe('read_only');
    expect((await call('inspectorSouth', `/api/inspections/${inspection.id}/findings`, { json: lostStrands(girder, [3]) })).status).toBe(409);

    // Returned with a comment, changed, submitted again: no second alert for the same finding.
    expect((await call('inspectorSouth', `/api/inspections/${inspection.id}/return`, { json: { version: submitted.body.version, comment: 'x' } })).status).toBe(403);
    const returned = await call<InspectionDetail>('raterEastSouth', `/api/inspections/${inspection.id}/return`, { json: { version: submitted.body.version, comment: 'Give the strand row of the second break' } });
    expect(returned.body).toMatchObject({ state: 'returned', returnComment: 'Give the strand row of the second break', reviewed: { by: 'Tomasz Brenek' } });
    const edited = await call<FindingDetail>('inspectorSouth', `/api/findings/${finding.id}`, { method: 'PUT', json: { ...lostStrands(girder, [0, 1, 2]), girderId: undefined, version: finding.version } });
    expect(edited.status).toBe(200);
    const again = await call<InspectionDetail>('inspectorSouth', `/api/inspections/${inspection.id}/submit`, { json: { version: returned.body.version } });
    expect(again.body.state).toBe('submitted');
    expect((await call<AlertItem[]>('raterEastSouth', '/api/alerts')).body).toHaveLength(1);
  });

  it('carries open findings forward into the next inspection, to be confirmed, grown or marked repaired', async () => {
    const { structure, span, girder } = await placeIn('South District', 1);
    const { body: first } = await start('inspectorSouth', structure.id, { inspectedOn: '2025-10-01' });
    await call('inspectorSouth', `/api/inspections/${first.id}/findings`, { json: lostStrands(girder, [0]) });
    await call('inspectorSouth', `/api/inspections/${first.id}/findings`, { json: { girderId: girder.id, kind: 'spall', spall: { depthMm: 40, widthMm: 200 }, fromM: 2, toM: 3, severity: 'moderate' } });
    const firstSubmitted = (await call<InspectionDetail>('inspectorSouth', `/api/inspections/${first.id}/submit`, { json: { version: first.version } })).body;
    expect((await call<InspectionDetail>('raterEastSouth', `/api/inspections/${first.id}/accept`, { json: { version: firstSubmitted.version } })).body.state).toBe('accepted');

    const { body: second } = await start('inspectorSouth', structure.id, { inspectedOn: '2026-10-01' });
    expect(second.findings.map((f) => [f.kind, f.disposition])).toEqual([
      ['lost-strands', 'to-review'],
      ['spall', 'to-review'],
    ]);
    const refused = await call('inspectorSouth', `/api/inspections/${second.id}/submit`, { json: { version: second.version } });
    expect(refused.status).toBe(400);
    expect(fieldsOf(refused.body)).toEqual(['findings.0.disposition', 'findings.1.disposition']);
    // A carried-forward finding is dispositioned, not deleted.
    expect((await call('inspectorSouth', `/api/findings/${second.findings[0]!.id}`, { method: 'DELETE' })).status).toBe(409);

    const [carriedBreak, carriedSpall] = second.findings;
    const grown = await call<FindingDetail>('inspectorSouth', `/api/findings/${carriedBreak!.id}`, {
      method: 'PUT',
      json: { ...lostStrands(girder, [0, 1]), girderId: undefined, version: carriedBreak!.version, disposition: 'grown' },
    });
    expect(grown.body).toMatchObject({ disposition: 'grown', critical: true, carriedFromId: firstSubmitted.findings[0]!.id });
    const { id: _id, inspectionId: _i, girderId: _g, girderNumber: _n, spanId: _s, spanIndex: _x, disposition: _d, carriedFromId: _c, registerState: _r, critical: _k, damageEntry: _e, photoIds: _p, version, ...spallFields } = carriedSpall!;
    const repaired = await call<FindingDetail>('inspectorSouth', `/api/findings/${carriedSpall!.id}`, { method: 'PUT', json: { ...spallFields, version, disposition: 'repaired' } });
    expect(repaired.body).toMatchObject({ disposition: 'repaired', damageEntry: null });
    const wrongKind = await call('inspectorSouth', `/api/findings/${carriedSpall!.id}`, { method: 'PUT', json: { ...spallFields, kind: 'crack', spall: null, version: repaired.body.version, disposition: 'confirmed' } });
    expect(fieldsOf(wrongKind.body)).toEqual(['kind']);

    const secondSubmitted = await call<InspectionDetail>('inspectorSouth', `/api/inspections/${second.id}/submit`, { json: { version: second.version } });
    expect(secondSubmitted.status).toBe(200);
    const open = (await call<FindingDetail[]>('raterCentral', `/api/spans/${span.id}/open-findings`)).body;
    expect(open.map((f) => [f.id, f.kind])).toEqual([[carriedBreak!.id, 'lost-strands']]);
    expect(open[0]!.damageEntry).toMatchObject({ kind: 'lost-strands', strands: [0, 1] });
    const register = (await call<FindingDetail[]>('raterCentral', `/api/girders/${girder.id}/findings`)).body;
    expect(register.map((f) => [f.kind, f.registerState]).sort()).toEqual(
      [
        ['lost-strands', 'open'],
        ['lost-strands', 'superseded'],
        ['spall', 'repaired'],
        ['spall', 'superseded'],
      ].sort(),
    );
  });

  it('gives the structure the condition ratings of an accepted inspection, and lists the structure’s inspections', async () => {
    const { structure } = await placeIn('North District', 2);
    const { body: inspection } = await start('inspectorNorth', structure.id, { inspectedOn: '2026-11-25', deckCondition: 4, substructureCondition: 6 });
    const submitted = (await call<InspectionDetail>('inspectorNorth', `/api/inspections/${inspection.id}/submit`, { json: { version: inspection.version } })).body;
    expect((await call('inspectorNorth', `/api/inspections/${inspection.id}/accept`, { json: { version: submitted.version } })).status).toBe(403);
    const accepted = await call<InspectionDetail>('managerNorthCentral', `/api/inspections/${inspection.id}/accept`, { json: { version: submitted.version } });
    expect(accepted.body).toMatchObject({ state: 'accepted', reviewed: { by: 'Mateo Quillen' } });
    const after = (await call<StructureDetail>('raterCentral', `/api/structures/${structure.id}`)).body;
    expect(after.conditions).toMatchObject({ deck: 4, substructure: 6, ratedOn: '2026-11-25' });
    expect(after.conditions.superstructure).toBe(structure.conditions.superstructure);
    const list = (await call<InspectionSummary[]>('raterCentral', `/api/structures/${structure.id}/inspections`)).body;
    expect(list.map((i) => [i.id, i.state])).toEqual([[inspection.id, 'accepted']]);
    expect((await call('raterCentral', `/api/inspections/${inspection.id}/accept`, { json: { version: accepted.body.version } })).status).toBe(403);
    expect((await call('managerNorthCentral', `/api/inspections/${inspection.id}/accept`, { json: { version: accepted.body.version } })).status).toBe(409);
  });

  it('deletes a draft never submitted, with its findings, and nothing else', async () => {
    const { structure, girder } = await placeIn('North District', 3);
    const { body: inspection } = await start('inspectorNorth', structure.id);
    await call('inspectorNorth', `/api/inspections/${inspection.id}/findings`, { json: lostStrands(girder, [0], { severity: 'minor' }) });
    expect((await call('inspectorNorth', `/api/inspections/${inspection.id}`, { method: 'DELETE' })).status).toBe(204);
    expect((await call('inspectorNorth', `/api/inspections/${inspection.id}`)).status).toBe(404);
    expect(await testDb.db('findings').where({ inspection_id: inspection.id }).count({ n: '*' })).toEqual([{ n: '0' }]);
    expect((await call('inspectorNorth', '/api/inspections/999999')).status).toBe(404);
  });
});
