import fs from 'node:fs';
import { z } from 'zod';

const port = z.coerce.number().int().min(0).max(65535);
const attributeName = z.string().min(1).max(200);
const booleanSetting = z.enum(['true', 'false']).transform((value) => value === 'true');

/** Every setting the server reads, with defaults for local use on one machine. */
const configSchema = z.object({
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port.default(4300),
  /** Full connection string; when unset it is built from the DB_* settings below. */
  DATABASE_URL: z.url({ protocol: /^postgres(ql)?$/ }).optional(),
  DB_HOST: z.string().min(1).default('127.0.0.1'),
  DB_PORT: port.default(54329),
  DB_NAME: z
    .string()
    .regex(/^[a-z_][a-z0-9_]*$/, 'use lower-case letters, digits and underscores')
    .default('spanledger'),
  DB_USER: z.string().min(1).default('postgres'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Built front end to serve; the API still runs when it is missing. */
  FRONTEND_DIST: z.string().min(1).default('dist/frontend/browser'),
  /** Optional XYZ raster tiles for deployments with their own tile server, e.g. https://tiles.example.org/{z}/{x}/{y}.png */
  BASEMAP_TILE_URL: z
    .url({ protocol: /^https?$/ })
    .refine((url) => ['{z}', '{x}', '{y}'].every((part) => decodeURI(url).includes(part)), 'must contain {z}, {x} and {y}')
    .optional(),
  BASEMAP_ATTRIBUTION: z.string().max(300).optional(),

  /** The address browsers use for Spanledger; the SAML callback and entity id derive from it. Default http://HOST:PORT. */
  PUBLIC_URL: z.url({ protocol: /^https?$/ }).optional(),
  /** Proxy hops in front of the server (0: none); needed for Secure cookies behind a TLS-terminating proxy. */
  TRUST_PROXY: z.coerce.number().int().min(0).max(10).default(0),
  /** Signs the session cookie: 32 characters or more, kept secret. */
  SESSION_SECRET: z.string().min(32, 'use at least 32 characters'),
  SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).max(24 * 60).default(30),
  SESSION_ABSOLUTE_HOURS: z.coerce.number().int().min(1).max(7 * 24).default(10),
  /** Secure cookies; defaults to on when PUBLIC_URL is https. */
  COOKIE_SECURE: booleanSetting.optional(),

  /** The identity provider's single sign-on URL (HTTP-Redirect binding). */
  SAML_IDP_ENTRY_POINT: z.url({ protocol: /^https?$/ }),
  /** The identity provider's entity id: the Issuer of its responses. */
  SAML_IDP_ENTITY_ID: z.string().min(1),
  /** The identity provider's signing certificate, as PEM text or the path of a PEM file. */
  SAML_IDP_CERT: z.string().min(1).optional(),
  SAML_IDP_CERT_FILE: z.string().min(1).optional(),
  /** Spanledger's own entity id; the Audience the identity provider must name. Default: the metadata URL. */
  SAML_SP_ENTITY_ID: z.string().min(1).optional(),
  /** Clock difference tolerated between the identity provider and this server. */
  SAML_CLOCK_SKEW_SECONDS: z.coerce.number().int().min(0).max(300).default(60),
  SAML_ATTRIBUTE_EMAIL: attributeName.default('email'),
  SAML_ATTRIBUTE_DISPLAY_NAME: attributeName.default('displayName'),
  SAML_ATTRIBUTE_ROLE: attributeName.default('role'),
  SAML_ATTRIBUTE_DISTRICTS: attributeName.default('districts'),
  SAML_ATTRIBUTE_ADMIN: attributeName.default('admin'),

  /** The S3-compatible photo store; unset means Amazon S3 itself in S3_REGION (`npm start` runs a local one). */
  S3_ENDPOINT: z.url({ protocol: /^https?$/ }).optional(),
  S3_REGION: z.string().regex(/^[a-z0-9-]{2,40}$/, 'expected a region name such as us-east-1').default('us-east-1'),
  S3_BUCKET: z
    .string()
    .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, 'use 3 to 63 lower-case letters, digits, dots and hyphens')
    .default('spanledger-photos'),
  /** Both or neither; with neither the S3 client finds credentials itself (AWS_* variables, an instance role). */
  S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  /** Path-style addresses (endpoint/bucket/key); defaults to on with S3_ENDPOINT, which self-hosted stores mostly need. */
  S3_FORCE_PATH_STYLE: booleanSetting.optional(),
  /** Largest photo an upload accepts; the server holds it in memory while it checks it. */
  PHOTO_MAX_BYTES: z.coerce
    .number()
    .int('must be a whole number of bytes')
    .min(1024, 'must be at least 1024')
    .max(100 * 1024 * 1024, 'must be at most 104857600 (100 MB)')
    .default(10 * 1024 * 1024),
  /** Largest spreadsheet an import upload accepts; it is written to a temporary file, never held whole in memory. */
  IMPORT_MAX_BYTES: z.coerce
    .number()
    .int('must be a whole number of bytes')
    .min(1024, 'must be at least 1024')
    .max(1024 * 1024 * 1024, 'must be at most 1073741824 (1 GB)')
    .default(50 * 1024 * 1024),
  /** From this size on, an import is committed by a background job with its progress shown (0: every commit); smaller files are committed in the request. */
  IMPORT_BACKGROUND_FROM_BYTES: z.coerce
    .number()
    .int('must be a whole number of bytes')
    .min(0, 'must be 0 or more')
    .default(512 * 1024),
});

/** Names of the assertion attributes that carry each part of a user. */
export interface SamlAttributeNames {
  readonly email: string;
  readonly displayName: string;
  readonly role: string;
  readonly districts: string;
  readonly admin: string;
}

export interface SamlConfig {
  readonly idpEntryPoint: string;
  readonly idpEntityId: string;
  readonly idpCertificate: string;
  readonly spEntityId: string;
  readonly callbackUrl: string;
  readonly clockSkewMs: number;
  readonly attributes: SamlAttributeNames;
}

export interface SessionConfig {
  readonly secret: string;
  readonly idleTimeoutMs: number;
  readonly absoluteTimeoutMs: number;
  readonly secureCookies: boolean;
}

export interface ObjectStorageConfig {
  /** Null for Amazon S3 itself, found from the region. */
  readonly endpoint: string | null;
  readonly region: string;
  readonly bucket: string;
  /** Null lets the S3 client find credentials itself. */
  readonly credentials: { readonly accessKeyId: string; readonly secretAccessKey: string } | null;
  readonly forcePathStyle: boolean;
}

export interface AppConfig {
  readonly host: string;
  readonly port: number;
  readonly databaseUrl: string;
  readonly logLevel: z.output<typeof configSchema>['LOG_LEVEL'];
  readonly frontendDist: string;
  readonly basemapTileUrl: string | null;
  readonly basemapAttribution: string | null;
  readonly publicUrl: string;
  readonly trustProxy: number;
  readonly session: SessionConfig;
  readonly saml: SamlConfig;
  readonly objectStorage: ObjectStorageConfig;
  readonly photoSizeLimitBytes: number;
  readonly importSizeLimitBytes: number;
  readonly importBackgroundFromBytes: number;
}

export class ConfigError extends Error {}

/** Settings whose values must never appear in a log or an error message. */
const SECRET_SETTINGS = new Set(['SESSION_SECRET', 'S3_SECRET_ACCESS_KEY']);

function describeValue(key: string, env: NodeJS.ProcessEnv): string {
  if (env[key] === undefined || env[key] === '') return 'not set';
  return SECRET_SETTINGS.has(key) ? 'value hidden' : `got "${env[key]}"`;
}

type ParsedSettings = z.output<typeof configSchema>;

const PEM_CERTIFICATE = /-----BEGIN CERTIFICATE-----[\s\S]+?-----END CERTIFICATE-----/;

/** The identity provider's certificate from exactly one of SAML_IDP_CERT and SAML_IDP_CERT_FILE. */
function readIdpCertificate(c: ParsedSettings): string {
  if ((c.SAML_IDP_CERT === undefined) === (c.SAML_IDP_CERT_FILE === undefined)) {
    throw new ConfigError('Invalid configuration:\n  SAML_IDP_CERT / SAML_IDP_CERT_FILE: set exactly one of them');
  }
  let text = c.SAML_IDP_CERT;
  if (c.SAML_IDP_CERT_FILE !== undefined) {
    try {
      text = fs.readFileSync(c.SAML_IDP_CERT_FILE, 'utf8');
    } catch {
      throw new ConfigError(`Invalid configuration:\n  SAML_IDP_CERT_FILE: cannot read "${c.SAML_IDP_CERT_FILE}"`);
    }
  }
  const pem = PEM_CERTIFICATE.exec(text ?? '')?.[0];
  if (!pem) throw new ConfigError('Invalid configuration:\n  SAML_IDP_CERT: expected a PEM certificate (-----BEGIN CERTIFICATE-----)');
  return pem;
}

/** The photo store's credentials from both of S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY, or from neither. */
function readStorageCredentials(c: ParsedSettings): ObjectStorageConfig['credentials'] {
  if ((c.S3_ACCESS_KEY_ID === undefined) !== (c.S3_SECRET_ACCESS_KEY === undefined)) {
    throw new ConfigError('Invalid configuration:\n  S3_ACCESS_KEY_ID / S3_SECRET_ACCESS_KEY: set both of them or neither');
  }
  if (c.S3_ACCESS_KEY_ID === undefined || c.S3_SECRET_ACCESS_KEY === undefined) return null;
  return { accessKeyId: c.S3_ACCESS_KEY_ID, secretAccessKey: c.S3_SECRET_ACCESS_KEY };
}

/** Reads and checks the configuration; a bad value stops the server with the name of the setting. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const known = Object.fromEntries(
    Object.keys(configSchema.shape).flatMap((key) => (env[key] === undefined || env[key] === '' ? [] : [[key, env[key]]])),
  );
  const parsed = configSchema.safeParse(known);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message} (${describeValue(String(issue.path[0]), env)})`);
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  const publicUrl = (c.PUBLIC_URL ?? `http://${c.HOST}:${c.PORT}`).replace(/\/+$/, '');
  return {
    host: c.HOST,
    port: c.PORT,
    databaseUrl: c.DATABASE_URL ?? `postgres://${encodeURIComponent(c.DB_USER)}@${c.DB_HOST}:${c.DB_PORT}/${c.DB_NAME}`,
    logLevel: c.LOG_LEVEL,
    frontendDist: c.FRONTEND_DIST,
    basemapTileUrl: c.BASEMAP_TILE_URL ?? null,
    basemapAttribution: c.BASEMAP_ATTRIBUTION ?? null,
    publicUrl,
    trustProxy: c.TRUST_PROXY,
    session: {
      secret: c.SESSION_SECRET,
      idleTimeoutMs: c.SESSION_IDLE_MINUTES * 60_000,
      absoluteTimeoutMs: c.SESSION_ABSOLUTE_HOURS * 3_600_000,
      secureCookies: c.COOKIE_SECURE ?? publicUrl.startsWith('https:'),
    },
    saml: {
      idpEntryPoint: c.SAML_IDP_ENTRY_POINT,
      idpEntityId: c.SAML_IDP_ENTITY_ID,
      idpCertificate: readIdpCertificate(c),
      spEntityId: c.SAML_SP_ENTITY_ID ?? `${publicUrl}/auth/saml/metadata`,
      callbackUrl: `${publicUrl}/auth/saml/callback`,
      clockSkewMs: c.SAML_CLOCK_SKEW_SECONDS * 1000,
      attributes: {
        email: c.SAML_ATTRIBUTE_EMAIL,
        displayName: c.SAML_ATTRIBUTE_DISPLAY_NAME,
        role: c.SAML_ATTRIBUTE_ROLE,
        districts: c.SAML_ATTRIBUTE_DISTRICTS,
        admin: c.SAML_ATTRIBUTE_ADMIN,
      },
    },
    objectStorage: {
      endpoint: c.S3_ENDPOINT?.replace(/\/+$/, '') ?? null,
      region: c.S3_REGION,
      bucket: c.S3_BUCKET,
      credentials: readStorageCredentials(c),
      forcePathStyle: c.S3_FORCE_PATH_STYLE ?? c.S3_ENDPOINT !== undefined,
    },
    photoSizeLimitBytes: c.PHOTO_MAX_BYTES,
    importSizeLimitBytes: c.IMPORT_MAX_BYTES,
    importBackgroundFromBytes: c.IMPORT_BACKGROUND_FROM_BYTES,
  };
}
