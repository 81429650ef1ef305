import request from 'supertest';
import type { Express } from 'express';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('API errors and headers', () => {
  let testDb: TestDatabase;
  let app: Express;
  beforeAll(async () => {
    testDb = await createTestDatabase();
    app = await createTestApp(testDb.db);
  });
  afterAll(() => testDb.drop());

  it('answers an unknown API path with a JSON 404, not the front end', async () => {
    const response = await request(app).get('/api/no-such-thing').expect(404).expect('Content-Type', /json/);
    expect(response.body).toEqual({
      error: { code: 'not_found', message: 'No API route for GET /api/no-such-thing', details: null },
      requestId: response.headers['x-request-id'],
    });
  });

  /** A request that passes the XSRF check, as the browser app's would, to reach the body parser. */
  const post = (path: string) => request(app).post(path).set('Cookie', 'XSRF-TOKEN=token-1234').set('X-XSRF-TOKEN', 'token-1234').set('Content-Type', 'application/json');

  it('answers malformed JSON with 400 and no stack trace', async () => {
    const response = await post('/api/structures').send('{"name":').expect(400);
    expect(response.body.error.code).toBe('malformed_body');
    expect(JSON.stringify(response.body)).not.toMatch(/at .*\.(ts|js):\d+/);
  });

  it('answers an oversize body with 413', async () => {
    const big = JSON.stringify({ notes: 'x'.repeat(1024 * 1024 + 10) });
    const response = await post('/api/structures').send(big).expect(413);
    expect(response.body.error.code).toBe('payload_too_large');
  });

  it('keeps a well-formed request id offered by the caller and makes one up otherwise', async () => {
    const offered = await request(app).get('/api/health').set('X-Request-Id', 'caller-id-12345').expect(200);
    expect(offered.headers['x-request-id']).toBe('caller-id-12345');
    const forged = await request(app).get('/api/health').set('X-Request-Id', '<script>').expect(200);
    expect(forged.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('sends security headers with a same-origin content security policy', async () => {
    const response = await request(app).get('/api/health').expect(200);
    const policy = response.headers['content-security-policy'];
    expect(policy).toContain("default-src 'self'");
    expect(policy).toContain("connect-src 'self'");
    expect(policy).not.toMatch(/https:/);
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-powered-by']).toBeUndefined();
  });

  it('tells the browser app about a configured tile server and allows its images', async () => {
    const withTiles = await createTestApp(testDb.db, { BASEMAP_TILE_URL: 'https://tiles.example.org/{z}/{x}/{y}.png', BASEMAP_ATTRIBUTION: 'Example tiles' });
    const response = await request(withTiles).get('/api/client-config').expect(200);
    expect(response.body).toEqual({ basemapTileUrl: 'https://tiles.example.org/{z}/{x}/{y}.png', basemapAttribution: 'Example tiles' });
    expect(response.headers['content-security-policy']).toMatch(/img-src[^;]*https:\/\/tiles\.example\.org/);

    const plain = await request(app).get('/api/client-config').expect(200);
    expect(plain.body).toEqual({ basemapTileUrl: null, basemapAttribution: null });
  });
});
