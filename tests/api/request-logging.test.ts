import { Writable } from 'node:stream';
import request from 'supertest';
import pino from 'pino';
import { createApp } from '../../backend/src/app';
import { loadConfig } from '../../backend/src/config';
import { testSignInEnv } from '../support/sign-in-settings';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('request logging', () => {
  let testDb: TestDatabase;
  beforeAll(async () => {
    testDb = await createTestDatabase();
  });
  afterAll(() => testDb.drop());

  it('writes structured JSON lines that carry the request id', async () => {
    const lines: Array<Record<string, unknown>> = [];
    const sink = new Writable({
      write(chunk: Buffer, _encoding, done) {
        lines.push(...chunk.toString().trim().split('\n').map((line) => JSON.parse(line) as Record<string, unknown>));
        done();
      },
    });
    const app = createApp({ config: loadConfig(await testSignInEnv(9)), db: testDb.db, logger: pino({ level: 'info' }, sink) });

    await request(app).get('/api/structures?bbox=bad').set('X-Request-Id', 'journey-0000001').expect(401);

    const forRequest = lines.filter((line) => line['requestId'] === 'journey-0000001');
    expect(forRequest.map((line) => line['msg'])).toEqual(expect.arrayContaining(['Sign in to continue', 'request completed']));
    expect(forRequest.find((line) => line['msg'] === 'request completed')).toMatchObject({ res: { statusCode: 401 } });
  });
});
