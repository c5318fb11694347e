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
  {
    key: 'DB_BUFFER_POOL_SIZE',
    defaultText: '`512M`',
    meaning:
      'InnoDB buffer pool of the private MariaDB that `npm start`/`npm test` run (sized so a catalogue of tens of thousands of parts stays in memory); `M` or `G` suffix',
  },
  {
    key: 'DB_REPLICA_HOST',
    defaultText: 'unset',
    meaning:
      'a MariaDB replica of the database (MariaDB replication): when set, search and catalogue reads go to it, writes always to `DB_HOST`; while it does not answer, those reads go to `DB_HOST`. ' +
      '`local`: `npm start` runs a private replica of its private MariaDB on 127.0.0.1 (data in `DATA_DIR/mariadb-replica`)',
  },
  {
    key: 'DB_REPLICA_PORT',
    defaultText: '`DB_PORT` (`local`: `DB_PORT` + 1)',
    meaning: 'port of the replica (same database name, user and password as the primary)',
  },
  { key: 'DATA_DIR', defaultText: '`.data`', meaning: 'where the private MariaDB and stored datasheets live' },
  {
    key: 'STORAGE',
    defaultText: '`local`',
    meaning: '`local`: datasheets on disk under `DATA_DIR/datasheets`; `s3`: in an S3-compatible bucket (below)',
  },
  {
    key: 'S3_ENDPOINT',
    defaultText: 'the local fake',
    meaning:
      'address of the S3-compatible store (path-style requests). Unset with `STORAGE=s3`: `npm start`/`npm test` run a local fake (s3rver) on 127.0.0.1 with its files under `DATA_DIR/s3`',
  },
  { key: 'S3_FAKE_PORT', defaultText: 'a free port', meaning: 'port of the local fake S3 on 127.0.0.1' },
  { key: 'S3_BUCKET', defaultText: '`stallpoint-datasheets`', meaning: 'bucket for datasheets (the local fake creates it)' },
  { key: 'S3_REGION', defaultText: '`us-east-1`', meaning: 'region name sent to the store' },
  { key: 'S3_ACCESS_KEY_ID', defaultText: "`S3RVER` (the fake's)", meaning: 'access key of the store' },
  { key: 'S3_SECRET_ACCESS_KEY', defaultText: "`S3RVER` (the fake's)", meaning: 'secret key of the store' },
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
    key: 'HEAP_GROWTH_PERCENT',
    defaultText: '`50`',
    meaning:
      "how far the app server's JavaScript heap may grow past what was live at the last full collection before the next one (V8's heap growing factor, 1 + this/100); `0` leaves V8's own choice, which lets a busy server grow to about four times its live heap. Lower bounds memory, at the cost of more frequent collections",
  },
  {
    key: 'MATCH_CACHE',
    defaultText: '`on`',
    meaning:
      '`on` keeps the match candidates in memory, reloaded when the catalogue version changes (about 200 MiB of RSS at 67,000 parts); `off` reads them from the database on every match',
  },
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
    key: 'DISTRIBUTOR_URL',
    defaultText: 'the local fake',
    meaning:
      'base address of the distributor offers API (`GET /v1/offers?mpn=…`); when unset, `npm start`/`npm test` start the local fake distributor on 127.0.0.1 and point here at it',
  },
  {
    key: 'DISTRIBUTOR_FAKE_PORT',
    defaultText: '`2527` (`npm test`: a free port)',
    meaning: 'port of the local fake distributor on 127.0.0.1',
  },
  { key: 'DISTRIBUTOR_TIMEOUT_MS', defaultText: '`3000`', meaning: 'deadline of one request to the distributor (each retry has its own)' },
  {
    key: 'DISTRIBUTOR_RETRIES',
    defaultText: '`3`',
    meaning: 'further tries after a 429, a 5xx, a timeout or a dropped connection (0–10), with backoff and Retry-After honoured up to 30 s',
  },
  {
    key: 'DISTRIBUTOR_REFRESH_MIN',
    defaultText: '`15` (`npm test`: `0`)',
    meaning:
      'minutes between scheduled refreshes of the cached distributor offers in each app server (one server at a time, by a lock in the database); `0` turns the schedule off',
  },
  {
    key: 'DISTRIBUTOR_LOCK_S',
    defaultText: '`600`',
    meaning:
      'seconds the refresh lock is held at most: when the server holding it dies mid-refresh, another takes it over once this has passed (keep it above the longest refresh)',
  },
  {
    key: 'ALERT_SWEEP_S',
    defaultText: '`60` (`npm test`: `0`)',
    meaning:
      'seconds between sweeps of change alerts not yet mailed (after a mail failure, or a server that stopped mid-way) in each app server; each alert is mailed once however many servers sweep; `0` turns the sweep off',
  },
  {
    key: 'OUTBOX_INTERVAL_S',
    defaultText: '`15` (`npm test`: `0`)',
    meaning:
      'seconds between background runs in each app server that deliver e-mail still pending (requests for quotation) and delete datasheet objects still to be deleted; `0` turns the runs off (a send or removal still tries once at once)',
  },
  {
    key: 'OUTBOX_RETRY_BASE_S',
    defaultText: '`30`',
    meaning: 'wait before the first retry of a failed mail delivery or object deletion; doubled after each further failure, up to 1 hour',
  },
  {
    key: 'OUTBOX_MAIL_ATTEMPTS',
    defaultText: '`8`',
    meaning: 'tries of one pending e-mail before it is marked failed (shown to the buyer); object deletions are retried until they succeed',
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
  DB_BUFFER_POOL_SIZE: z.preprocess(
    blankToUndefined,
    z
      .string()
      .regex(/^[1-9][0-9]{0,5}[MG]$/, { error: 'DB_BUFFER_POOL_SIZE is a size such as 512M or 2G' })
      .default('512M'),
  ),
  DB_REPLICA_HOST: optionalText,
  DB_REPLICA_PORT: z.preprocess(blankToUndefined, z.coerce.number().int().min(1).max(65_535).optional()),
  DATA_DIR: text('.data'),
  STORAGE: z.preprocess(blankToUndefined, z.enum(['local', 's3']).default('local')),
  S3_ENDPOINT: z.preprocess(blankToUndefined, z.url({ protocol: /^https?$/, error: 'S3_ENDPOINT must be an http(s) address' }).optional()),
  S3_FAKE_PORT: z.preprocess(blankToUndefined, z.coerce.number().int().min(0).max(65_535).optional()),
  S3_BUCKET: z.preprocess(
    blankToUndefined,
    z
      .string()
      .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, { error: 'S3_BUCKET is a bucket name: 3–63 lower-case letters, digits, dots, dashes' })
      .default('stallpoint-datasheets'),
  ),
  S3_REGION: text('us-east-1'),
  S3_ACCESS_KEY_ID: text('S3RVER'),
  S3_SECRET_ACCESS_KEY: text('S3RVER'),
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
  HEAP_GROWTH_PERCENT: z.preprocess(blankToUndefined, z.coerce.number().int().min(0).max(400).default(50)),
  MATCH_CACHE: z.preprocess(blankToUndefined, z.enum(['on', 'off']).default('on')),
  TRUST_PROXY: z.preprocess(blankToUndefined, z.enum(['0', '1']).default('0')),
  ORG_CURRENCY: z.preprocess(
    blankToUndefined,
    z
      .string()
      .regex(/^[A-Z]{3}$/, { error: 'ORG_CURRENCY is a three-letter ISO 4217 code such as EUR' })
      .default('EUR'),
  ),
  ATTRITION_PCT: z.preprocess(blankToUndefined, z.coerce.number().min(0).max(50).default(2)),
  DISTRIBUTOR_URL: z.preprocess(
    blankToUndefined,
    z
      .url({ protocol: /^https?$/, error: 'DISTRIBUTOR_URL must be an http(s) address such as http://127.0.0.1:2527' })
      .transform((u) => u.replace(/\/+$/, ''))
      .optional(),
  ),
  DISTRIBUTOR_FAKE_PORT: z.preprocess(blankToUndefined, z.coerce.number().int().min(0).max(65_535).optional()),
  DISTRIBUTOR_TIMEOUT_MS: z.preprocess(blankToUndefined, z.coerce.number().int().min(50).max(120_000).default(3_000)),
  DISTRIBUTOR_RETRIES: z.preprocess(blankToUndefined, z.coerce.number().int().min(0).max(10).default(3)),
  DISTRIBUTOR_REFRESH_MIN: z.preprocess(blankToUndefined, z.coerce.number().min(0).max(10_080).optional()),
  DISTRIBUTOR_LOCK_S: z.preprocess(blankToUndefined, z.coerce.number().int().min(1).max(86_400).default(600)),
  ALERT_SWEEP_S: z.preprocess(blankToUndefined, z.coerce.number().min(0).max(86_400).optional()),
  OUTBOX_INTERVAL_S: z.preprocess(blankToUndefined, z.coerce.number().min(0).max(86_400).optional()),
  OUTBOX_RETRY_BASE_S: z.preprocess(blankToUndefined, z.coerce.number().min(0.1).max(86_400).default(30)),
  OUTBOX_MAIL_ATTEMPTS: z.preprocess(blankToUndefined, z.coerce.number().int().min(1).max(100).default(8)),
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

/** Where datasheets are kept. */
export interface StorageConfig {
  kind: 'local' | 's3';
  s3: {
    /** null: the local fake, started by the scripts, which then set S3_ENDPOINT. */
    endpoint: string | null;
    fakePort: number | null;
    bucket: string;
    region: string;
    accessKeyId: string;
    secretAccessKey: string;
  };
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

/** Where the distributor offers come from and how often they are refreshed. */
export interface DistributorConfig {
  /** Base address of the offers API; null until the start/test scripts set the local fake's. */
  url: string | null;
  /** Port of the local fake; null = the default for the run (2527, or a free one under test). */
  fakePort: number | null;
  timeoutMs: number;
  retries: number;
  /** Minutes between scheduled refreshes; 0 = no schedule. */
  refreshMin: number;
  /** Longest hold of the refresh lock, s (a dead holder's lock frees itself after this). */
  lockS: number;
}

export const DEFAULT_DISTRIBUTOR_FAKE_PORT = 2527;

/** The background runs that finish side effects after their transaction committed (mail, object deletions). */
export interface OutboxConfig {
  /** Seconds between runs; 0 = no background runs. */
  intervalS: number;
  /** Wait before the first retry, seconds (doubled per failure, capped at an hour). */
  retryBaseS: number;
  /** Tries of one e-mail before it is marked failed. */
  mailAttempts: number;
}

export interface AppConfig {
  nodeEnv: string | null;
  host: string;
  port: number;
  db: DbConfig;
  /** The read replica (search and catalogue reads), or null when there is none. */
  dbReplica: { host: string; port: number; /** DB_REPLICA_HOST=local: `npm start` runs it. */ local: boolean } | null;
  /** innodb_buffer_pool_size of the private MariaDB the scripts run. */
  dbBufferPoolSize: string;
  dataDir: string;
  storage: StorageConfig;
  publicUrl: string | null;
  mail: MailConfig;
  /** Port of the local mail sink; null = the default for the run (2526, or a free one under test). */
  sinkPort: number | null;
  calcRateLimitPerMin: number;
  /** Design matches ranked at once per app server. */
  matchConcurrency: number;
  /** V8's heap growing factor as a percentage over 1; 0 = V8's own. */
  heapGrowthPercent: number;
  matchCache: 'on' | 'off';
  trustProxy: boolean;
  /** SIGTERM: how long requests in flight may still run. */
  shutdownGraceS: number;
  buying: BuyingConfig;
  /** Seconds between sweeps of unsent change alerts in each app server; 0 = none. */
  alertSweepS: number;
  distributor: DistributorConfig;
  outbox: OutboxConfig;
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
    dbReplica: !e.DB_REPLICA_HOST
      ? null
      : e.DB_REPLICA_HOST === 'local'
        ? { host: '127.0.0.1', port: e.DB_REPLICA_PORT ?? e.DB_PORT + 1, local: true }
        : { host: e.DB_REPLICA_HOST, port: e.DB_REPLICA_PORT ?? e.DB_PORT, local: false },
    dbBufferPoolSize: e.DB_BUFFER_POOL_SIZE,
    dataDir: e.DATA_DIR,
    storage: {
      kind: e.STORAGE,
      s3: {
        endpoint: e.S3_ENDPOINT?.replace(/\/+$/, '') ?? null,
        fakePort: e.S3_FAKE_PORT ?? null,
        bucket: e.S3_BUCKET,
        region: e.S3_REGION,
        accessKeyId: e.S3_ACCESS_KEY_ID,
        secretAccessKey: e.S3_SECRET_ACCESS_KEY,
      },
    },
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
    heapGrowthPercent: e.HEAP_GROWTH_PERCENT,
    matchCache: e.MATCH_CACHE,
    trustProxy: e.TRUST_PROXY === '1',
    shutdownGraceS: e.SHUTDOWN_GRACE_S,
    buying: { orgCurrency: e.ORG_CURRENCY, attritionPct: e.ATTRITION_PCT },
    distributor: {
      url: e.DISTRIBUTOR_URL ?? null,
      fakePort: e.DISTRIBUTOR_FAKE_PORT ?? null,
      timeoutMs: e.DISTRIBUTOR_TIMEOUT_MS,
      retries: e.DISTRIBUTOR_RETRIES,
      refreshMin: e.DISTRIBUTOR_REFRESH_MIN ?? (e.NODE_ENV === 'test' ? 0 : 15),
      lockS: e.DISTRIBUTOR_LOCK_S,
    },
    alertSweepS: e.ALERT_SWEEP_S ?? (e.NODE_ENV === 'test' ? 0 : 60),
    outbox: {
      intervalS: e.OUTBOX_INTERVAL_S ?? (e.NODE_ENV === 'test' ? 0 : 15),
      retryBaseS: e.OUTBOX_RETRY_BASE_S,
      mailAttempts: e.OUTBOX_MAIL_ATTEMPTS,
    },
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
