import { createApp } from '../../backend/src/app';
import { listRoutes } from '../../backend/src/access/route-table';
import { loadConfig } from '../../backend/src/config';
import { createLogger } from '../../backend/src/logger';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { testSignInEnv } from '../support/sign-in-settings';
import { SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

describe('access rules on every route', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const signedIn = new Map<string, SignInClient>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    bed = await startSignInTestBed(testDb.url);
    for (const [role, subject] of [
      ['inspector', 'bv-staff-1057'],
      ['rater', 'bv-staff-2029'],
      ['manager', 'bv-staff-3018'],
    ] as const) {
      const browser = new SignInClient(bed.server.url);
      await browser.signInAs(subject);
      signedIn.set(role, browser);
    }
    signedIn.set('anonymous', new SignInClient(bed.server.url));
  });
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  it('finds a declared policy on every route of the real app', async () => {
    const app = createApp({ config: loadConfig(await testSignInEnv(9)), db: testDb.db, logger: createLogger('silent') });
    const routes = listRoutes(app);
    expect(routes.length).toBeGreaterThanOrEqual(9);
    expect(routes.filter((route) => route.policy === null)).toEqual([]);
    expect(routes).toEqual(
      expect.arrayContaining([
        { method: 'GET', path: '/api/health', policy: 'anyone' },
        { method: 'GET', path: '/api/client-config', policy: 'anyone' },
        { method: 'GET', path: '/api/me', policy: 'any signed-in user' },
        { method: 'GET', path: '/api/structures', policy: expect.stringMatching(/^view the map/) },
        { method: 'GET', path: '/api/network-register.csv', policy: 'export the network register' },
        { method: 'POST', path: '/auth/saml/callback', policy: 'anyone' },
      ]),
    );
  });

  // Expected status per caller: anonymous, inspector, rater, manager.
  it.each([
    ['GET', '/api/health', [200, 200, 200, 200]],
    ['GET', '/api/client-config', [200, 200, 200, 200]],
    ['GET', '/auth/saml/metadata', [200, 200, 200, 200]],
    ['GET', '/api/me', [401, 200, 200, 200]],
    ['GET', '/api/session', [200, 200, 200, 200]],
    ['GET', '/api/structures', [401, 200, 200, 200]],
    ['GET', '/api/network-register.csv', [401, 403, 403, 200]],
  ] as const)('%s %s answers each role as the permission matrix says', async (method, path, expected) => {
    const statuses = [];
    for (const caller of ['anonymous', 'inspector', 'rater', 'manager']) {
      statuses.push((await signedIn.get(caller)?.request(path, { method }))?.status);
    }
    expect(statuses).toEqual(expected);
  });

  it('exports the network register as CSV with every structure and the caution', async () => {
    const response = await signedIn.get('manager')?.request('/api/network-register.csv');
    expect(response?.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(response?.headers.get('content-disposition')).toMatch(/attachment; filename="?network-register-\d{4}-\d{2}-\d{2}\.csv"?/);
    const lines = (response?.text ?? '').trim().split('\r\n');
    expect(lines[0]).toBe('Structure number,Name,Route carried,Feature crossed,District,Latitude,Longitude,Year built,ADT (vehicles/day),ADTT (trucks/day),Year of last major work,Skew (degrees),Status,Deck condition,Superstructure condition,Substructure condition,Condition rated on');
    const structures = Number((await testDb.db('structures').count({ n: '*' }).first())?.n);
    expect(lines.filter((line) => /^BV-/.test(line))).toHaveLength(structures);
    expect(lines[lines.length - 1]).toMatch(/^"?Caution: Results support, and do not replace/);
  });

  it('keeps the history append-only in the database itself', async () => {
    const [event] = await testDb.db('audit_events').select('id').limit(1);
    expect(event).toBeDefined();
    await expect(testDb.db('audit_events').where({ id: event.id }).update({ action: 'edited' })).rejects.toThrow(/append-only/);
    await expect(testDb.db('audit_events').where({ id: event.id }).delete()).rejects.toThrow(/append-only/);
  });
});
