import { z } from 'zod';

const port = z.coerce.number().int().min(0).max(65535);

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
});

export interface AppConfig {
  readonly host: string;
  readonly port: number;
  readonly databaseUrl: string;
  readonly logLevel: z.output<typeof configSchema>['LOG_LEVEL'];
  readonly frontendDist: string;
  readonly basemapTileUrl: string | null;
  readonly basemapAttribution: string | null;
}

export class ConfigError extends Error {}

/** Reads and checks the configuration; a bad value stops the server with the name of the setting. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const known = Object.fromEntries(
    Object.keys(configSchema.shape).flatMap((key) => (env[key] === undefined || env[key] === '' ? [] : [[key, env[key]]])),
  );
  const parsed = configSchema.safeParse(known);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message} (got "${env[String(issue.path[0])]}")`);
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  return {
    host: c.HOST,
    port: c.PORT,
    databaseUrl: c.DATABASE_URL ?? `postgres://${encodeURIComponent(c.DB_USER)}@${c.DB_HOST}:${c.DB_PORT}/${c.DB_NAME}`,
    logLevel: c.LOG_LEVEL,
    frontendDist: c.FRONTEND_DIST,
    basemapTileUrl: c.BASEMAP_TILE_URL ?? null,
    basemapAttribution: c.BASEMAP_ATTRIBUTION ?? null,
  };
}
