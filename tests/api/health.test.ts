import request from 'supertest';
import { createDatabase } from '../../backend/src/db/database';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('GET /api/health', () => {
  let testDb: TestDatabase;
  beforeAll(async () => {
    testDb = await createTestDatabase();
  });
  afterAll(() => testDb.drop());

  it('reports the database and the PostGIS version', async () => {
    const response = await request(await createTestApp(testDb.db)).get('/api/health').expect(200);
    expect(response.body).toEqual({ status: 'ok', db: 'ok', postgis: expect.stringMatching(/^3\.\d+\.\d+/) });
  });

  it('answers 503 with the error shape when the database does not answer', async () => {
    const unreachable = createDatabase('postgres://postgres@127.0.0.1:9/none', { min: 0, max: 1 });
    try {
      const response = await request(await createTestApp(unreachable)).get('/api/health').expect(503);
      expect(response.body).toEqual({
        error: { code: 'database_unavailable', message: 'The database is not answering', details: null },
        requestId: expect.any(String),
      });
    } finally {
      await unreachable.destroy();
    }
  });
});
