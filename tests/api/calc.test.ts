import fs from 'node:fs';
import path from 'node:path';
import { PROJECT_ROOT } from '../../scripts/lib/project-paths';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

const example = (relativePath: string) => JSON.parse(fs.readFileSync(path.join(PROJECT_ROOT, 'examples', relativePath), 'utf8'));

describe('stateless calculations over the calculation file', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  let inspector: SignInClient;
  beforeAll(async () => {
    testDb = await createTestDatabase();
    bed = await startSignInTestBed(testDb.url);
    inspector = new SignInClient(bed.server.url);
    await inspector.signInAs('bv-staff-1057');
  });
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  it('gives the same capacity as the command line for the same file', async () => {
    const response = await inspector.request('/api/calc/capacity', { json: example('bulb-tee-composite-damaged.json') });
    expect(response.status).toBe(200);
    expect(JSON.parse(response.text)).toEqual(example('expected/bulb-tee-composite-damaged.out.json'));
  });

  it('gives the same rating as the command line for the same file', async () => {
    const response = await inspector.request('/api/calc/rate', { json: example('rate/interior-girder-damaged.json') });
    expect(response.status).toBe(200);
    const expected = example('rate/expected/interior-girder-damaged.out.json');
    const body = JSON.parse(response.text);
    expect(body.summary.controlling).toEqual(expected.summary.controlling);
    expect(body.caution).toMatch(/licensed engineer/);
  });

  it('answers bad input with 400 naming every path', async () => {
    const file = example('rectangle-two-rows.json');
    file.girder.strandRows[1].strandAreaMm2 = -1;
    const response = await inspector.request('/api/calc/capacity', { json: file });
    expect(response.status).toBe(400);
    const body = JSON.parse(response.text);
    expect(body.error.code).toBe('validation_failed');
    expect(body.error.details.fields).toEqual([{ field: 'girder.strandRows[1].strandAreaMm2', message: 'must be > 0' }]);
  });

  it('refuses a visitor who has not signed in, and a request without the XSRF header', async () => {
    const visitor = new SignInClient(bed.server.url);
    await visitor.request('/api/session'); // picks up the XSRF cookie, as the browser app does on load
    expect((await visitor.request('/api/calc/capacity', { json: example('rectangle-two-rows.json') })).status).toBe(401);
    expect((await inspector.request('/api/calc/capacity', { json: example('rectangle-two-rows.json'), xsrf: false })).status).toBe(403);
  });
});
