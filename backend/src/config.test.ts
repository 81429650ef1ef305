import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ConfigError, loadConfig } from './config';

const CERTIFICATE = '-----BEGIN CERTIFICATE-----\nMIIBdGVzdA==\n-----END CERTIFICATE-----';
/** The settings that have no default: who signs people in, and the session secret. */
const SIGN_IN = {
  SESSION_SECRET: 'a-session-secret-of-at-least-32-characters',
  SAML_IDP_ENTRY_POINT: 'https://login.example.org/saml/sso',
  SAML_IDP_ENTITY_ID: 'https://login.example.org/idp',
  SAML_IDP_CERT: CERTIFICATE,
};

describe('loadConfig', () => {
  it('has defaults for one machine', () => {
    expect(loadConfig(SIGN_IN)).toEqual({
      host: '127.0.0.1',
      port: 4300,
      databaseUrl: 'postgres://postgres@127.0.0.1:54329/spanledger',
      logLevel: 'info',
      frontendDist: 'dist/frontend/browser',
      basemapTileUrl: null,
      basemapAttribution: null,
      publicUrl: 'http://127.0.0.1:4300',
      trustProxy: 0,
      session: { secret: SIGN_IN.SESSION_SECRET, idleTimeoutMs: 30 * 60_000, absoluteTimeoutMs: 10 * 3_600_000, secureCookies: false },
      saml: {
        idpEntryPoint: SIGN_IN.SAML_IDP_ENTRY_POINT,
        idpEntityId: SIGN_IN.SAML_IDP_ENTITY_ID,
        idpCertificate: CERTIFICATE,
        spEntityId: 'http://127.0.0.1:4300/auth/saml/metadata',
        callbackUrl: 'http://127.0.0.1:4300/auth/saml/callback',
        clockSkewMs: 60_000,
        attributes: { email: 'email', displayName: 'displayName', role: 'role', districts: 'districts', admin: 'admin' },
      },
      objectStorage: { endpoint: null, region: 'us-east-1', bucket: 'spanledger-photos', credentials: null, forcePathStyle: false },
      photoSizeLimitBytes: 10 * 1024 * 1024,
      importSizeLimitBytes: 50 * 1024 * 1024,
      importBackgroundFromBytes: 512 * 1024,
    });
  });

  it('reads the photo store, with path-style addresses by default for an endpoint of its own', () => {
    const config = loadConfig({
      ...SIGN_IN,
      S3_ENDPOINT: 'http://127.0.0.1:9000/',
      S3_REGION: 'eu-central-1',
      S3_BUCKET: 'bridge-photos.north',
      S3_ACCESS_KEY_ID: 'photo-writer',
      S3_SECRET_ACCESS_KEY: 'a-storage-secret',
      PHOTO_MAX_BYTES: '2097152',
    });
    expect(config.objectStorage).toEqual({
      endpoint: 'http://127.0.0.1:9000',
      region: 'eu-central-1',
      bucket: 'bridge-photos.north',
      credentials: { accessKeyId: 'photo-writer', secretAccessKey: 'a-storage-secret' },
      forcePathStyle: true,
    });
    expect(config.photoSizeLimitBytes).toBe(2 * 1024 * 1024);
    expect(loadConfig({ ...SIGN_IN, IMPORT_MAX_BYTES: '1048576' }).importSizeLimitBytes).toBe(1024 * 1024);
    expect(() => loadConfig({ ...SIGN_IN, IMPORT_MAX_BYTES: '10' })).toThrow(/IMPORT_MAX_BYTES/);
    expect(loadConfig({ ...SIGN_IN, IMPORT_BACKGROUND_FROM_BYTES: '0' }).importBackgroundFromBytes).toBe(0);
    expect(() => loadConfig({ ...SIGN_IN, IMPORT_BACKGROUND_FROM_BYTES: '-1' })).toThrow(/IMPORT_BACKGROUND_FROM_BYTES: must be 0 or more/);
    expect(loadConfig({ ...SIGN_IN, S3_ENDPOINT: 'https://objects.example.org', S3_FORCE_PATH_STYLE: 'false' }).objectStorage.forcePathStyle).toBe(false);
  });

  it('builds the database URL from its parts and prefers DATABASE_URL when given', () => {
    expect(loadConfig({ ...SIGN_IN, DB_PORT: '6000', DB_NAME: 'network_b' }).databaseUrl).toBe('postgres://postgres@127.0.0.1:6000/network_b');
    expect(loadConfig({ ...SIGN_IN, DATABASE_URL: 'postgres://app@db.internal:5432/register' }).databaseUrl).toBe('postgres://app@db.internal:5432/register');
  });

  it('derives the SAML addresses from PUBLIC_URL and turns Secure cookies on for https', () => {
    const config = loadConfig({ ...SIGN_IN, PUBLIC_URL: 'https://bridges.example.org/' });
    expect(config.saml.callbackUrl).toBe('https://bridges.example.org/auth/saml/callback');
    expect(config.saml.spEntityId).toBe('https://bridges.example.org/auth/saml/metadata');
    expect(config.session.secureCookies).toBe(true);
    expect(loadConfig({ ...SIGN_IN, PUBLIC_URL: 'https://bridges.example.org', COOKIE_SECURE: 'false' }).session.secureCookies).toBe(false);
  });

  it('reads the identity provider certificate from a file', () => {
    const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'spanledger-config-'));
    const file = path.join(folder, 'idp.pem');
    fs.writeFileSync(file, `subject=CN=idp\n${CERTIFICATE}\n`);
    const { SAML_IDP_CERT: _inline, ...withoutInline } = SIGN_IN;
    expect(loadConfig({ ...withoutInline, SAML_IDP_CERT_FILE: file }).saml.idpCertificate).toBe(CERTIFICATE);
    fs.rmSync(folder, { recursive: true });
  });

  it.each([
    [{ PORT: 'eighty' }, /PORT: .*got "eighty"/],
    [{ PORT: '70000' }, /PORT: /],
    [{ DB_PORT: '-1' }, /DB_PORT: /],
    [{ LOG_LEVEL: 'loud' }, /LOG_LEVEL: /],
    [{ DATABASE_URL: 'mysql://x@y/z' }, /DATABASE_URL: /],
    [{ BASEMAP_TILE_URL: 'https://tiles.example.org/tile.png' }, /BASEMAP_TILE_URL: must contain \{z\}, \{x\} and \{y\}/],
    [{ SAML_IDP_ENTRY_POINT: '' }, /SAML_IDP_ENTRY_POINT: .*not set/],
    [{ SAML_IDP_CERT: 'not a certificate' }, /SAML_IDP_CERT: expected a PEM certificate/],
    [{ SAML_IDP_CERT_FILE: '/no/such/file.pem' }, /set exactly one of them/],
    [{ SAML_CLOCK_SKEW_SECONDS: '3600' }, /SAML_CLOCK_SKEW_SECONDS: /],
    [{ S3_ENDPOINT: 'ftp://objects.example.org' }, /S3_ENDPOINT: /],
    [{ S3_BUCKET: 'Bridge_Photos' }, /S3_BUCKET: use 3 to 63 lower-case letters/],
    [{ S3_REGION: 'Europe West' }, /S3_REGION: /],
    [{ S3_ACCESS_KEY_ID: 'photo-writer' }, /S3_ACCESS_KEY_ID \/ S3_SECRET_ACCESS_KEY: set both of them or neither/],
    [{ S3_FORCE_PATH_STYLE: 'yes' }, /S3_FORCE_PATH_STYLE: /],
    [{ PHOTO_MAX_BYTES: '10MB' }, /PHOTO_MAX_BYTES: .*got "10MB"/],
    [{ PHOTO_MAX_BYTES: '500' }, /PHOTO_MAX_BYTES: must be at least 1024/],
  ])('refuses %p naming the setting', (env, message) => {
    expect(() => loadConfig({ ...SIGN_IN, ...env })).toThrow(ConfigError);
    expect(() => loadConfig({ ...SIGN_IN, ...env })).toThrow(message);
  });

  it('never repeats the session secret in its complaint', () => {
    expect(() => loadConfig({ ...SIGN_IN, SESSION_SECRET: 'short-secret' })).toThrow(/SESSION_SECRET: .*\(value hidden\)/);
    expect(() => loadConfig({ ...SIGN_IN, SESSION_SECRET: 'short-secret' })).not.toThrow(/short-secret/);
  });

  it('never repeats the photo store secret in its complaint', () => {
    expect(() => loadConfig({ ...SIGN_IN, S3_SECRET_ACCESS_KEY: 'a-storage-secret' })).toThrow(/S3_SECRET_ACCESS_KEY/);
    expect(() => loadConfig({ ...SIGN_IN, S3_SECRET_ACCESS_KEY: 'a-storage-secret' })).not.toThrow(/a-storage-secret/);
  });

  it('treats an empty setting as unset', () => {
    expect(loadConfig({ ...SIGN_IN, PORT: '' }).port).toBe(4300);
  });
});
