/**
 * A small SAML 2.0 identity provider for development, demonstrations and tests: it shows the demo
 * authority's staff, and signs in whoever is chosen. HTTP-Redirect binding in, HTTP-POST binding
 * out; assertion and response both signed with RSA-SHA256. It listens on loopback only.
 */
import { randomBytes } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import express, { type Response } from 'express';
import { DEMO_USERS, demoUser, type DemoUser } from './demo-users';
import { InvalidAuthnRequest, decodeRedirectRequest, type AuthnRequest } from './authn-request';
import { autoSubmitPage, messagePage, signInPage } from './pages';
import { encodeForPostBinding, signedResponseXml, validityWindow } from './saml-response';
import { loadOrCreateSigningKeys, type SigningKeys } from './signing-keys';

export const LOCAL_IDP_ENTITY_ID = 'urn:spanledger:local-identity-provider';

/** The one service provider this provider answers, and where it wants its responses. */
export interface ServiceProviderRegistration {
  readonly entityId: string;
  readonly assertionConsumerUrl: string;
}

export interface LocalIdentityProviderOptions {
  readonly port: number;
  /** Where the signing key pair is kept (created on first start). */
  readonly keysFolder: string;
  readonly serviceProvider: ServiceProviderRegistration;
}

export interface RunningIdentityProvider {
  readonly url: string;
  readonly entityId: string;
  /** The HTTP-Redirect single sign-on URL, for SAML_IDP_ENTRY_POINT. */
  readonly ssoUrl: string;
  readonly keys: SigningKeys;
  close(): Promise<void>;
}

/** The attributes Spanledger's default configuration reads (see README, single sign-on). */
export function userAttributes(user: DemoUser): Record<string, readonly string[]> {
  return { email: [user.email], displayName: [user.displayName], role: [user.role], districts: user.districts, admin: [String(user.admin)] };
}

function checkRequest(request: AuthnRequest, ssoUrl: string, sp: ServiceProviderRegistration): void {
  if (request.issuer !== sp.entityId) throw new InvalidAuthnRequest(`Unknown service provider ${request.issuer}`);
  if (request.destination !== null && request.destination !== ssoUrl) throw new InvalidAuthnRequest(`The request was meant for ${request.destination}`);
  if (request.assertionConsumerUrl !== null && request.assertionConsumerUrl !== sp.assertionConsumerUrl) {
    throw new InvalidAuthnRequest(`The assertion consumer URL ${request.assertionConsumerUrl} is not the one registered for ${sp.entityId}`);
  }
}

/** Pages load nothing from anywhere; forms go only to this provider and to the service provider. */
function sendPage(res: Response, status: number, html: string, formTarget: string, scriptNonce?: string): void {
  const scripts = scriptNonce ? `'nonce-${scriptNonce}'` : "'none'";
  res.setHeader(
    'Content-Security-Policy',
    `default-src 'none'; style-src 'unsafe-inline'; script-src ${scripts}; form-action 'self' ${formTarget}; base-uri 'none'; frame-ancestors 'none'`,
  );
  res.setHeader('Cache-Control', 'no-store');
  res.status(status).type('html').send(html);
}

function createIdentityProviderApp(keys: SigningKeys, ssoUrl: () => string, sp: ServiceProviderRegistration): express.Express {
  const app = express();
  app.disable('x-powered-by');
  app.use(express.urlencoded({ extended: false, limit: '64kb' }));
  const spOrigin = new URL(sp.assertionConsumerUrl).origin;

  const readRequest = (samlRequest: unknown): AuthnRequest => {
    if (typeof samlRequest !== 'string' || samlRequest === '') throw new InvalidAuthnRequest('There is no SAMLRequest: start signing in from Spanledger');
    const request = decodeRedirectRequest(samlRequest);
    checkRequest(request, ssoUrl(), sp);
    return request;
  };
  const relayStateOf = (value: unknown) => (typeof value === 'string' && value !== '' ? value : null);

  app.get('/sso', (req, res) => {
    // A request this provider would not answer is refused before anyone is shown.
    readRequest(req.query['SAMLRequest']);
    sendPage(res, 200, signInPage(DEMO_USERS, String(req.query['SAMLRequest']), relayStateOf(req.query['RelayState'])), spOrigin);
  });

  app.post('/sso', (req, res) => {
    const body = req.body as Record<string, unknown>;
    const request = readRequest(body['SAMLRequest']);
    const user = demoUser(String(body['subject']));
    if (!user) {
      sendPage(res, 400, messagePage('Unknown person', 'Choose one of the people on the sign-in page.'), spOrigin);
      return;
    }
    const xml = signedResponseXml(
      {
        issuer: LOCAL_IDP_ENTITY_ID,
        destination: sp.assertionConsumerUrl,
        audience: sp.entityId,
        inResponseTo: request.id,
        subject: user.subject,
        attributes: userAttributes(user),
        ...validityWindow(new Date()),
      },
      keys,
    );
    const nonce = randomBytes(16).toString('base64');
    sendPage(res, 200, autoSubmitPage(sp.assertionConsumerUrl, encodeForPostBinding(xml), relayStateOf(body['RelayState']), nonce), spOrigin, nonce);
  });

  app.get('/', (_req, res) => {
    sendPage(res, 200, messagePage('Local identity provider', 'Start signing in from Spanledger; it sends you here with a sign-in request.'), spOrigin);
  });

  app.use((error: unknown, _req: express.Request, res: Response, _next: express.NextFunction) => {
    const message = error instanceof InvalidAuthnRequest ? error.message : 'The identity provider could not handle this request.';
    sendPage(res, error instanceof InvalidAuthnRequest ? 400 : 500, messagePage('Sign-in request refused', message), spOrigin);
  });
  return app;
}

/** Starts the provider on 127.0.0.1 (port 0 picks a free one). */
export async function startLocalIdentityProvider(options: LocalIdentityProviderOptions): Promise<RunningIdentityProvider> {
  const keys = await loadOrCreateSigningKeys(options.keysFolder);
  let ssoUrl = '';
  const server: Server = createServer(createIdentityProviderApp(keys, () => ssoUrl, options.serviceProvider));
  await new Promise<void>((resolve, reject) => {
    server.once('error', (error: NodeJS.ErrnoException) =>
      reject(error.code === 'EADDRINUSE' ? new Error(`Port ${options.port} on 127.0.0.1 is in use: stop what uses it or set LOCAL_IDP_PORT to another port`) : error),
    );
    server.listen(options.port, '127.0.0.1', () => resolve());
  });
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  ssoUrl = `${url}/sso`;
  return {
    url,
    entityId: LOCAL_IDP_ENTITY_ID,
    ssoUrl,
    keys,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      }),
  };
}
