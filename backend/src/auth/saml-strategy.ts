import { Strategy, ValidateInResponseTo, type Profile } from '@node-saml/passport-saml';
import { Passport } from 'passport';
import type { SamlConfig } from '../config';
import type { Database } from '../db/database';
import { pendingRequestStore } from './saml-request-cache';

/** How long the identity provider has to answer an AuthnRequest. */
const PENDING_REQUEST_LIFETIME_MS = 10 * 60_000;

export const SAML_STRATEGY = 'saml';

/**
 * The service provider: unsigned AuthnRequests over HTTP-Redirect; responses accepted only when
 * both the response and its assertion carry a valid signature, they answer a request of ours still
 * pending, name our audience and lie within their validity window (± the configured clock skew).
 * The verify step only hands the profile on: mapping it to a user is the auth service's job.
 */
export function createSamlStrategy(config: SamlConfig, db: Database): Strategy {
  const handOn = (profile: Profile | null, done: (error: Error | null, user?: Record<string, unknown>) => void) => done(null, profile ?? undefined);
  return new Strategy(
    {
      name: SAML_STRATEGY,
      entryPoint: config.idpEntryPoint,
      idpIssuer: config.idpEntityId,
      idpCert: config.idpCertificate,
      issuer: config.spEntityId,
      callbackUrl: config.callbackUrl,
      audience: config.spEntityId,
      wantAuthnResponseSigned: true,
      wantAssertionsSigned: true,
      signatureAlgorithm: 'sha256',
      acceptedClockSkewMs: config.clockSkewMs,
      validateInResponseTo: ValidateInResponseTo.always,
      requestIdExpirationPeriodMs: PENDING_REQUEST_LIFETIME_MS,
      cacheProvider: pendingRequestStore(db, PENDING_REQUEST_LIFETIME_MS),
      identifierFormat: null,
      disableRequestedAuthnContext: true,
    },
    handOn,
    handOn,
  );
}

export type SamlAuthenticator = InstanceType<typeof Passport>;

/** A passport instance of the app's own (not the global one) that knows only the SAML strategy. */
export function createSamlAuthenticator(strategy: Strategy): SamlAuthenticator {
  const passport = new Passport();
  passport.use(SAML_STRATEGY, strategy);
  return passport;
}
