import { demoUser } from '../../scripts/lib/local-identity-provider/demo-users';
import { LOCAL_IDP_ENTITY_ID, userAttributes } from '../../scripts/lib/local-identity-provider/identity-provider';
import { encodeForPostBinding, signedResponseXml, validityWindow, type ResponseContent } from '../../scripts/lib/local-identity-provider/saml-response';
import { createSigningKeys, type SigningKeys } from '../../scripts/lib/local-identity-provider/signing-keys';
import { SESSION_COOKIE } from '../../backend/src/auth/sessions';
import { SignInClient, formField } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

const INSPECTOR = 'bv-staff-1041';
const HOUR_MS = 3_600_000;

describe('SAML sign-in through the local identity provider', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  let impostorKeys: SigningKeys;
  const client = () => new SignInClient(bed.server.url);

  beforeAll(async () => {
    testDb = await createTestDatabase();
    bed = await startSignInTestBed(testDb.url);
    impostorKeys = await createSigningKeys('Someone else');
  });
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  /** A response the genuine provider would send to the given request, before any tampering. */
  function genuineContent(inResponseTo: string | null, now = new Date()): ResponseContent {
    const user = demoUser(INSPECTOR);
    if (!user) throw new Error('demo inspector missing');
    return {
      issuer: LOCAL_IDP_ENTITY_ID,
      destination: bed.config.saml.callbackUrl,
      audience: bed.config.saml.spEntityId,
      inResponseTo,
      subject: user.subject,
      attributes: userAttributes(user),
      ...validityWindow(now),
    };
  }

  async function expectRefused(browser: SignInClient, samlResponseXml: string): Promise<void> {
    const response = await browser.postToCallback(encodeForPostBinding(samlResponseXml));
    expect(response.status).toBe(401);
    expect(response.text).toContain('Sign-in refused');
    expect(browser.cookie(SESSION_COOKIE)).toBeUndefined();
    expect((await browser.request('/api/me')).status).toBe(401);
  }

  /** Starts a real sign-in so that the response answers a request the server is waiting for. */
  async function pendingRequestId(browser: SignInClient): Promise<string> {
    return (await browser.startSignIn()).request.id;
  }

  it('signs in an inspector, records the user with the time of sign-in, and notes it in the history', async () => {
    const browser = client();
    const answer = await browser.signInAs(INSPECTOR);
    expect(answer.status).toBe(303);
    expect(answer.location).toBe('/');
    const me = await browser.request('/api/me');
    expect(me.status).toBe(200);
    expect(JSON.parse(me.text)).toEqual({
      id: expect.any(Number),
      email: 'dana.whitcombe@bluestem-roads.example',
      displayName: 'Dana Whitcombe',
      role: 'inspector',
      districts: ['North District'],
      admin: false,
    });
    const row = await testDb.db('users').where({ subject: INSPECTOR }).first();
    expect(Date.now() - new Date(row.last_signed_in_at).getTime()).toBeLessThan(60_000);
    const events = await testDb.db('audit_events').where({ user_id: row.id, action: 'sign-in' });
    expect(events.length).toBeGreaterThanOrEqual(1);
  });

  it('sends the AuthnRequest over HTTP-Redirect to the configured entry point, naming our entity id and callback', async () => {
    const { idpUrl, request } = await client().startSignIn();
    expect(idpUrl.startsWith(bed.config.saml.idpEntryPoint)).toBe(true);
    expect(request).toMatchObject({ issuer: bed.config.saml.spEntityId, assertionConsumerUrl: bed.config.saml.callbackUrl, destination: bed.config.saml.idpEntryPoint });
  });

  it('returns to the page asked for, but only on this site', async () => {
    expect((await client().signInAs(INSPECTOR, '/register?district=North%20District')).location).toBe('/register?district=North%20District');
    expect((await client().signInAs(INSPECTOR, 'https://evil.example')).location).toBe('/');
    expect((await client().signInAs(INSPECTOR, '//evil.example')).location).toBe('/');
  });

  it('ignores a RelayState changed on the way back that points off the site', async () => {
    const browser = client();
    const content = genuineContent(await pendingRequestId(browser));
    const answer = await browser.postToCallback(encodeForPostBinding(signedResponseXml(content, bed.identityProvider.keys)), '//evil.example');
    expect(answer.status).toBe(303);
    expect(answer.location).toBe('/');
  });

  it('refuses a response whose signature was forged', async () => {
    const browser = client();
    const xml = signedResponseXml(genuineContent(await pendingRequestId(browser)), bed.identityProvider.keys);
    const forged = xml.replace(/<ds:SignatureValue>([A-Za-z0-9+/])/g, (_whole, first: string) => `<ds:SignatureValue>${first === 'A' ? 'B' : 'A'}`);
    expect(forged).not.toBe(xml);
    await expectRefused(browser, forged);
  });

  it('refuses a response signed by another key, even one that carries its own certificate', async () => {
    const browser = client();
    await expectRefused(browser, signedResponseXml(genuineContent(await pendingRequestId(browser)), impostorKeys));
  });

  it('refuses a response whose role attribute was changed after signing', async () => {
    const browser = client();
    const xml = signedResponseXml(genuineContent(await pendingRequestId(browser)), bed.identityProvider.keys);
    const tampered = xml.replace('<saml:AttributeValue>inspector</saml:AttributeValue>', '<saml:AttributeValue>manager</saml:AttributeValue>');
    expect(tampered).not.toBe(xml);
    await expectRefused(browser, tampered);
  });

  it('refuses a response meant for another audience', async () => {
    const browser = client();
    await expectRefused(browser, signedResponseXml({ ...genuineContent(await pendingRequestId(browser)), audience: 'https://other-service.example/metadata' }, bed.identityProvider.keys));
  });

  it('refuses a response addressed to another destination', async () => {
    const browser = client();
    await expectRefused(browser, signedResponseXml({ ...genuineContent(await pendingRequestId(browser)), destination: 'https://other-service.example/auth/saml/callback' }, bed.identityProvider.keys));
  });

  it('refuses an expired assertion and one not yet valid', async () => {
    const browser = client();
    await expectRefused(browser, signedResponseXml(genuineContent(await pendingRequestId(browser), new Date(Date.now() - HOUR_MS)), bed.identityProvider.keys));
    await expectRefused(browser, signedResponseXml(genuineContent(await pendingRequestId(browser), new Date(Date.now() + HOUR_MS)), bed.identityProvider.keys));
  });

  it('refuses a response that was already used once', async () => {
    const first = client();
    const { idpUrl, samlRequest } = await first.startSignIn();
    const page = await first.request(new URL('sso', idpUrl).toString(), { form: { SAMLRequest: samlRequest, subject: INSPECTOR } });
    const samlResponse = formField(page.text, 'SAMLResponse') ?? '';
    expect((await first.postToCallback(samlResponse)).status).toBe(303);
    await expectRefused(client(), Buffer.from(samlResponse, 'base64').toString('utf8'));
  });

  it('refuses an unsolicited response and one answering a request the server never made', async () => {
    await expectRefused(client(), signedResponseXml(genuineContent(null), bed.identityProvider.keys));
    await expectRefused(client(), signedResponseXml(genuineContent('_never-sent-by-spanledger'), bed.identityProvider.keys));
  });

  it('refuses a validly signed response that lacks the role attribute', async () => {
    const browser = client();
    const { role: _role, ...withoutRole } = genuineContent('').attributes;
    await expectRefused(browser, signedResponseXml({ ...genuineContent(await pendingRequestId(browser)), attributes: withoutRole }, bed.identityProvider.keys));
  });

  it('signs the assertion and the response with RSA-SHA256', async () => {
    const browser = client();
    const { idpUrl, samlRequest } = await browser.startSignIn();
    const page = await browser.request(new URL('sso', idpUrl).toString(), { form: { SAMLRequest: samlRequest, subject: INSPECTOR } });
    const xml = Buffer.from(formField(page.text, 'SAMLResponse') ?? '', 'base64').toString('utf8');
    expect(xml.match(/SignatureMethod Algorithm="http:\/\/www\.w3\.org\/2001\/04\/xmldsig-more#rsa-sha256"/g)).toHaveLength(2);
    expect(xml.match(/DigestMethod Algorithm="http:\/\/www\.w3\.org\/2001\/04\/xmlenc#sha256"/g)).toHaveLength(2);
    expect(xml).toMatch(/^<samlp:Response [^>]*><saml:Issuer>[^<]*<\/saml:Issuer><ds:Signature /);
  });
});
