import { SESSION_COOKIE } from '../../backend/src/auth/sessions';
import { formField, SignInClient } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

const RATER = 'bv-staff-2013';

describe('sessions, sign-out and the XSRF check', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const client = () => new SignInClient(bed.server.url);

  beforeAll(async () => {
    testDb = await createTestDatabase();
    bed = await startSignInTestBed(testDb.url);
  });
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  async function signedInClient(): Promise<SignInClient> {
    const browser = client();
    expect((await browser.signInAs(RATER)).status).toBe(303);
    return browser;
  }

  /** A browser that presents someone else's session cookie. */
  function withSessionCookie(value: string): SignInClient {
    const browser = client();
    browser.setCookie(SESSION_COOKIE, value);
    return browser;
  }

  it('sets an HttpOnly, SameSite=Lax session cookie kept in PostgreSQL', async () => {
    const browser = client();
    const { idpUrl, samlRequest } = await browser.startSignIn();
    const page = await browser.request(new URL('sso', idpUrl).toString(), { form: { SAMLRequest: samlRequest, subject: RATER } });
    const answer = await browser.postToCallback(formField(page.text, 'SAMLResponse') ?? '');
    const sessionCookie = answer.headers.getSetCookie().find((line) => line.startsWith(`${SESSION_COOKIE}=`)) ?? '';
    expect(sessionCookie).toMatch(/HttpOnly/i);
    expect(sessionCookie).toMatch(/SameSite=Lax/i);
    expect(sessionCookie).toMatch(/Expires=/i);
    expect(sessionCookie).not.toMatch(/Secure/i);
    expect(Number((await testDb.db('user_sessions').count({ n: '*' }).first())?.n)).toBeGreaterThan(0);
  });

  it('gives a new session id at sign-in and forgets the one held before', async () => {
    const browser = await signedInClient();
    const before = browser.cookie(SESSION_COOKIE) ?? '';
    // The same browser signs in again with a fresh response.
    const other = client();
    const { idpUrl, samlRequest } = await other.startSignIn();
    const page = await other.request(new URL('sso', idpUrl).toString(), { form: { SAMLRequest: samlRequest, subject: RATER } });
    expect((await browser.postToCallback(formField(page.text, 'SAMLResponse') ?? '')).status).toBe(303);
    const after = browser.cookie(SESSION_COOKIE);
    expect(after).toBeDefined();
    expect(after).not.toBe(before);
    expect((await withSessionCookie(before).request('/api/me')).status).toBe(401);
    expect((await browser.request('/api/me')).status).toBe(200);
  });

  it('ends the session at sign-out, so the old cookie is refused', async () => {
    const browser = await signedInClient();
    const oldCookie = browser.cookie(SESSION_COOKIE) ?? '';
    expect((await browser.request('/auth/logout', { method: 'POST' })).status).toBe(204);
    expect((await browser.request('/api/me')).status).toBe(401);
    expect((await withSessionCookie(oldCookie).request('/api/me')).status).toBe(401);
    const signOuts = await testDb.db('audit_events').where({ action: 'sign-out' });
    expect(signOuts.length).toBeGreaterThanOrEqual(1);
  });

  it('refuses a request that changes something without the X-XSRF-TOKEN header, or with the wrong one', async () => {
    const browser = await signedInClient();
    const missing = await browser.request('/auth/logout', { method: 'POST', xsrf: false });
    expect(missing.status).toBe(403);
    expect(JSON.parse(missing.text).error.code).toBe('xsrf_check_failed');
    expect((await browser.request('/api/me')).status).toBe(200);

    browser.setCookie('XSRF-TOKEN', 'a-token-an-attacker-planted');
    expect((await browser.request('/auth/logout', { method: 'POST' })).status).toBe(403);
    expect((await browser.request('/api/me')).status).toBe(200);
  });

  it('ends a session left idle past its expiry, and one older than the absolute limit', async () => {
    const idle = await signedInClient();
    await testDb.db('user_sessions').update({ expire: testDb.db.raw("now() - interval '1 second'") });
    expect((await idle.request('/api/me')).status).toBe(401);

    const old = await signedInClient();
    const elevenHoursAgo = Date.now() - 11 * 3_600_000;
    await testDb.db('user_sessions').update({ sess: testDb.db.raw("jsonb_set(sess::jsonb, '{signedInAt}', ?::jsonb)::json", [String(elevenHoursAgo)]) });
    expect((await old.request('/api/me')).status).toBe(401);
  });
});
