/**
 * Runtime configuration: every environment variable Stallpoint reads, with its default and meaning,
 * validated once by one zod schema. The README "Configuration" table is checked against CONFIG_KEYS by
 * tests/unit/config.test.ts. The start and test scripts load .env / generated values into process.env
 * before anything reads this; `appConfig()` reads process.env once per process.
 */
import { z } from 'zod';

/** One documented key: its default as the README states it, and what it means. */
export interface ConfigKey {
  key: string;
  defaultText: string;
  meaning: string;
}

/** The documented keys, in README order. */
export const CONFIG_KEYS: readonly ConfigKey[] = [
  { key: 'HOST', defaultText: '`127.0.0.1`', meaning: 'address the web server binds to' },
  { key: 'PORT', defaultText: '`4321`', meaning: 'web server port' },
  { key: 'DB_HOST', defaultText: '`127.0.0.1`', meaning: 'MariaDB host' },
  { key: 'DB_PORT', defaultText: '`3407`', meaning: 'MariaDB port (the private instance listens here)' },
  { key: 'DB_NAME', defaultText: '`stallpoint`', meaning: 'database name' },
  { key: 'DB_USER', defaultText: '`stallpoint`', meaning: 'app user (limited to that database)' },
  { key: 'DB_PASSWORD', defaultText: 'generated into `.env`', meaning: "app user's password" },
  { key: 'DB_POOL_MAX', defaultText: '`10`', meaning: 'knex pool size per app server' },
  {
    key: 'DB_QUERY_TIMEOUT_MS',
    defaultText: '`5000`',
    meaning:
      'longest wait for one SQL statement of the app (and for a connection); a frozen or unreachable database then answers 503 instead of hanging. Migrations and seeds have no such limit',
  },
  {
    key: 'SHUTDOWN_GRACE_S',
    defaultText: '`30`',
    meaning: 'on SIGTERM/Ctrl-C, how long requests in flight (imports included) may still run before their connections are cut',
  },
  { key: 'DATA_DIR', defaultText: '`.data`', meaning: 'where the private MariaDB and stored datasheets live' },
  {
    key: 'PUBLIC_URL',
    defaultText: '`http://HOST:PORT` under `npm start`',
    meaning:
      'address put into e-mailed links; required outside local mail-sink mode. Its host is also allowed as a request host ' +
      'at build time (besides 127.0.0.1 and localhost); a change rebuilds the app on the next start. When it is ' +
      '`https://…`, every response carries `Strict-Transport-Security: max-age=31536000; includeSubDomains`',
  },
  {
    key: 'SMTP_HOST',
    defaultText: 'the local sink',
    meaning: 'SMTP server for outgoing mail; when set (and `MAIL_SINK` is not `local`) no sink starts',
  },
  { key: 'SMTP_PORT', defaultText: "sink's port", meaning: 'SMTP port' },
  { key: 'SMTP_SECURE', defaultText: '`false`', meaning: '`true` for TLS from the first byte (port 465); otherwise STARTTLS when offered' },
  { key: 'SMTP_USER', defaultText: 'none', meaning: 'SMTP user name, when the server wants one' },
  { key: 'SMTP_PASSWORD', defaultText: 'none', meaning: 'SMTP password, when the server wants one' },
  { key: 'MAIL_FROM', defaultText: '`Stallpoint <no-reply@stallpoint.invalid>`', meaning: 'sender of invitations and reset links' },
  {
    key: 'MAIL_SINK',
    defaultText: '`local` under `npm start`/`npm test`',
    meaning: '`local`: mail is caught by the sink and shown to admins on `/mail`',
  },
  { key: 'SMTP_SINK_PORT', defaultText: '`2526` (`npm test`: a free port)', meaning: 'port of the local sink on 127.0.0.1' },
  { key: 'CALC_RATE_LIMIT_PER_MIN', defaultText: '`600`', meaning: 'calculator requests per client address per minute (per app server)' },
  { key: 'MATCH_CONCURRENCY', defaultText: '`4`', meaning: 'design matches ranked at once per app server; more get 429 with Retry-After' },
  {
    key: 'ORG_CURRENCY',
    defaultText: '`EUR`',
    meaning: "the organisation's currency (ISO 4217): shortlist totals are converted into it with the rates an admin keeps on `/rates`",
  },
  {
    key: 'ATTRITION_PCT',
    defaultText: '`2`',
    meaning: 'spares added to every shortlist line for set-up loss and rework, in percent of per-board quantity × boards (0–50)',
  },
  {
    key: 'TRUST_PROXY',
    defaultText: 'unset',
    meaning: '`1` behind a reverse proxy you run: client addresses (for the sign-in limit) are then taken from `X-Forwarded-For`',
  },
];

export const DEFAULT_MAIL_FROM = 'Stallpoint <no-reply@stallpoint.invalid>';
export const DEFAULT_SINK_PORT = 2526;

const blankToUndefined = (v: unknown): unknown => (typeof v === 'string' && v.trim() === '' ? undefined : v);
const port = (fallback: number) => z.preprocess(blankToUndefined, z.coerce.number().int().min(0).max(65_535).default(fallback));
const text = (fallback: string) => z.preprocess(blankToUndefined, z.string().default(fallback));
const optionalText = z.preprocess(blankToUndefined, z.string().optional());

const envSchema = z.object({
  NODE_ENV: optionalText,
  HOST: text('127.0.0.1'),
  PORT: port(4321),
  DB_HOST: text('127.0.0.1'),
  DB_PORT: port(3407),
  DB_NAME: text('stallpoint'),
  DB_USER: text('stallpoint'),
  DB_PASSWORD: z.string().default(''),
  DB_POOL_MAX: z.preprocess(blankToUndefined, z.coerce.number().int().min(1).max(500).default(10)),
  DB_QUERY_TIMEOUT_MS: z.preprocess(blankToUndefined, z.coerce.number().int().min(100).max(600_000).default(5_000)),
  SHUTDOWN_GRACE_S: z.preprocess(blankToUndefined, z.coerce.number().min(0).max(3_600).default(30)),
  DATA_DIR: text('.data'),
  PUBLIC_URL: z.preprocess(
    blankToUndefined,
    z
      .url({ protocol: /^https?$/, error: 'PUBLIC_URL must be an http(s) address such as https://stallpoint.example.org' })
      .transform((u) => u.replace(/\/+$/, ''))
      .optional(),
  ),
  SMTP_HOST: optionalText,
  SMTP_PORT: z.preprocess(blankToUndefined, z.coerce.number().int().min(1).max(65_535).optional()),
  SMTP_SECURE: z.preprocess(blankToUndefined, z.enum(['true', 'false']).default('false')),
  SMTP_USER: optionalText,
  SMTP_PASSWORD: optionalText,
  MAIL_FROM: text(DEFAULT_MAIL_FROM),
  MAIL_SINK: optionalText,
  SMTP_SINK_PORT: z.preprocess(blankToUndefined, z.coerce.number().int().min(0).max(65_535).optional()),
  CALC_RATE_LIMIT_PER_MIN: z.preprocess(blankToUndefined, z.coerce.number().int().min(1).default(600)),
  MATCH_CONCURRENCY: z.preprocess(blankToUndefined, z.coerce.number().int().min(1).max(64).default(4)),
  TRUST_PROXY: z.preprocess(blankToUndefined, z.enum(['0', '1']).default('0')),
  ORG_CURRENCY: z.preprocess(
    blankToUndefined,
    z
      .string()
      .regex(/^[A-Z]{3}$/, { error: 'ORG_CURRENCY is a three-letter ISO 4217 code such as EUR' })
      .default('EUR'),
  ),
  ATTRITION_PCT: z.preprocess(blankToUndefined, z.coerce.number().min(0).max(50).default(2)),
});

export interface DbConfig {
  host: string;
  port: number;
  database: string;
  user: string;
  password: string;
  poolMax: number;
  /** Deadline of one statement and of getting a connection (src/server/knex-client.ts). */
  queryTimeoutMs: number;
}

export interface MailConfig {
  host: string;
  port: number;
  /** TLS from the first byte (port 465); otherwise STARTTLS when the server offers it. */
  secure: boolean;
  user: string | null;
  password: string | null;
  from: string;
  /** MAIL_SINK=local: the local SMTP sink catches everything and admins can read it on /mail. */
  sinkLocal: boolean;
}

/** What the buyers' figures depend on. */
export interface BuyingConfig {
  /** ISO 4217 code of the organisation's currency. */
  orgCurrency: string;
  /** Spares per line, percent of per-board quantity × boards. */
  attritionPct: number;
}

export interface AppConfig {
  nodeEnv: string | null;
  host: string;
  port: number;
  db: DbConfig;
  dataDir: string;
  publicUrl: string | null;
  mail: MailConfig;
  /** Port of the local mail sink; null = the default for the run (2526, or a free one under test). */
  sinkPort: number | null;
  calcRateLimitPerMin: number;
  /** Design matches ranked at once per app server. */
  matchConcurrency: number;
  trustProxy: boolean;
  /** SIGTERM: how long requests in flight may still run. */
  shutdownGraceS: number;
  buying: BuyingConfig;
}

/** Raised when a variable does not parse; names every bad key. */
export class ConfigError extends Error {
  constructor(public readonly issues: { key: string; message: string }[]) {
    super(`Configuration is not valid: ${issues.map((i) => `${i.key}: ${i.message}`).join('; ')}`);
    this.name = 'ConfigError';
  }
}

/** Validates an environment and returns the typed configuration (throws ConfigError naming each bad key). */
export function readConfig(env: NodeJS.ProcessEnv): AppConfig {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    throw new ConfigError(parsed.error.issues.map((i) => ({ key: String(i.path[0] ?? '?'), message: i.message })));
  }
  const e = parsed.data;
  return {
    nodeEnv: e.NODE_ENV ?? null,
    host: e.HOST,
    port: e.PORT,
    db: {
      host: e.DB_HOST,
      port: e.DB_PORT,
      database: e.DB_NAME,
      user: e.DB_USER,
      password: e.DB_PASSWORD,
      poolMax: e.DB_POOL_MAX,
      queryTimeoutMs: e.DB_QUERY_TIMEOUT_MS,
    },
    dataDir: e.DATA_DIR,
    publicUrl: e.PUBLIC_URL ?? null,
    mail: {
      host: e.SMTP_HOST ?? '127.0.0.1',
      port: e.SMTP_PORT ?? DEFAULT_SINK_PORT,
      secure: e.SMTP_SECURE === 'true',
      user: e.SMTP_USER ?? null,
      password: e.SMTP_PASSWORD ?? null,
      from: e.MAIL_FROM,
      sinkLocal: e.MAIL_SINK === 'local',
    },
    sinkPort: e.SMTP_SINK_PORT ?? null,
    calcRateLimitPerMin: e.CALC_RATE_LIMIT_PER_MIN,
    matchConcurrency: e.MATCH_CONCURRENCY,
    trustProxy: e.TRUST_PROXY === '1',
    shutdownGraceS: e.SHUTDOWN_GRACE_S,
    buying: { orgCurrency: e.ORG_CURRENCY, attritionPct: e.ATTRITION_PCT },
  };
}

let cached: { env: NodeJS.ProcessEnv; config: AppConfig } | null = null;

/**
 * The configuration of this process, read from process.env once. The scripts fill process.env (from
 * .env and the services they start) before the app first asks.
 */
export function appConfig(): AppConfig {
  if (!cached) cached = { env: process.env, config: readConfig(process.env) };
  return cached.config;
}

/** Forgets the cached configuration (the scripts call it after they add the services' variables). */
export function resetAppConfig(): void {
  cached = null;
}

export function dbConfigFromEnv(env?: NodeJS.ProcessEnv): DbConfig {
  return env ? readConfig(env).db : appConfig().db;
}

export function dataDirFromEnv(env?: NodeJS.ProcessEnv): string {
  return env ? readConfig(env).dataDir : appConfig().dataDir;
}

/** What the build bakes in from the configuration (astro.config.mjs reads PUBLIC_URL's host). */
export function buildTimeConfig(env: NodeJS.ProcessEnv): Record<string, string> {
  return { PUBLIC_URL: readConfig(env).publicUrl ?? '' };
}
