/**
 * The one configuration module: defaults, validation naming the key, and the README table in step with
 * CONFIG_KEYS. Expected defaults are written out here by hand from README "Configuration".
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CONFIG_KEYS, ConfigError, readConfig } from '../../src/server/config.ts';

describe('readConfig', () => {
  it('gives the documented defaults for an empty environment', () => {
    const c = readConfig({});
    expect(c.host).toBe('127.0.0.1');
    expect(c.port).toBe(4321);
    expect(c.db).toEqual({
      host: '127.0.0.1',
      port: 3407,
      database: 'stallpoint',
      user: 'stallpoint',
      password: '',
      poolMax: 10,
      queryTimeoutMs: 5000,
    });
    expect(c.dataDir).toBe('.data');
    expect(c.publicUrl).toBeNull();
    expect(c.mail).toEqual({
      host: '127.0.0.1',
      port: 2526,
      secure: false,
      user: null,
      password: null,
      from: 'Stallpoint <no-reply@stallpoint.invalid>',
      sinkLocal: false,
    });
    expect(c.sinkPort).toBeNull();
    expect(c.calcRateLimitPerMin).toBe(600);
    expect(c.trustProxy).toBe(false);
    expect(c.shutdownGraceS).toBe(30);
    expect(c.buying).toEqual({ orgCurrency: 'EUR', attritionPct: 2 });
    expect(c.dbBufferPoolSize).toBe('512M');
    expect(c.dbReplica).toBeNull();
    expect(c.storage).toEqual({
      kind: 'local',
      s3: {
        endpoint: null,
        fakePort: null,
        bucket: 'stallpoint-datasheets',
        region: 'us-east-1',
        accessKeyId: 'S3RVER',
        secretAccessKey: 'S3RVER',
      },
    });
    expect(c.distributor).toEqual({ url: null, fakePort: null, timeoutMs: 3000, retries: 3, refreshMin: 15, lockS: 600 });
  });

  it('reads the scale-out keys: S3 store, replica (port defaults to DB_PORT), buffer pool', () => {
    const c = readConfig({
      STORAGE: 's3',
      S3_ENDPOINT: 'http://127.0.0.1:9000/',
      S3_BUCKET: 'sheets.example',
      DB_PORT: '3306',
      DB_REPLICA_HOST: '10.0.0.7',
      DB_BUFFER_POOL_SIZE: '2G',
    });
    expect(c.storage.kind).toBe('s3');
    expect(c.storage.s3.endpoint).toBe('http://127.0.0.1:9000');
    expect(c.storage.s3.bucket).toBe('sheets.example');
    expect(c.dbReplica).toEqual({ host: '10.0.0.7', port: 3306, local: false });
    expect(readConfig({ DB_REPLICA_HOST: '127.0.0.1', DB_REPLICA_PORT: '3408' }).dbReplica).toEqual({
      host: '127.0.0.1',
      port: 3408,
      local: false,
    });
    // `local`: npm start runs it on loopback, one port above the primary's default 3407 unless DB_REPLICA_PORT says otherwise.
    expect(readConfig({ DB_REPLICA_HOST: 'local' }).dbReplica).toEqual({ host: '127.0.0.1', port: 3408, local: true });
    expect(c.dbBufferPoolSize).toBe('2G');
  });

  it('turns the distributor refresh schedule off under test unless asked for', () => {
    expect(readConfig({ NODE_ENV: 'test' }).distributor.refreshMin).toBe(0);
    expect(readConfig({ NODE_ENV: 'test', DISTRIBUTOR_REFRESH_MIN: '5' }).distributor.refreshMin).toBe(5);
  });

  it('sweeps unsent change alerts every 60 s, not under test unless asked for (README defaults)', () => {
    expect(readConfig({}).alertSweepS).toBe(60);
    expect(readConfig({ NODE_ENV: 'test' }).alertSweepS).toBe(0);
    expect(readConfig({ NODE_ENV: 'test', ALERT_SWEEP_S: '0.5' }).alertSweepS).toBe(0.5);
    expect(readConfig({ NODE_ENV: 'test', DISTRIBUTOR_LOCK_S: '3' }).distributor.lockS).toBe(3);
    expect(() => readConfig({ DISTRIBUTOR_LOCK_S: '0' })).toThrow(/DISTRIBUTOR_LOCK_S/);
  });

  it('reads set values and treats blank ones as unset', () => {
    const c = readConfig({
      PORT: '8080',
      DB_PORT: '3306',
      DB_POOL_MAX: '4',
      PUBLIC_URL: 'https://stallpoint.example.org/',
      SMTP_SECURE: 'true',
      SMTP_USER: 'u',
      MAIL_SINK: 'local',
      TRUST_PROXY: '1',
      HOST: '  ',
      DB_QUERY_TIMEOUT_MS: '2500',
      SHUTDOWN_GRACE_S: '0',
      ORG_CURRENCY: 'GBP',
      ATTRITION_PCT: '5.5',
    });
    expect(c.port).toBe(8080);
    expect(c.db.port).toBe(3306);
    expect(c.db.poolMax).toBe(4);
    expect(c.publicUrl).toBe('https://stallpoint.example.org');
    expect(c.mail.secure).toBe(true);
    expect(c.mail.user).toBe('u');
    expect(c.mail.sinkLocal).toBe(true);
    expect(c.trustProxy).toBe(true);
    expect(c.host).toBe('127.0.0.1');
    expect(c.db.queryTimeoutMs).toBe(2500);
    expect(c.shutdownGraceS).toBe(0);
    expect(c.buying).toEqual({ orgCurrency: 'GBP', attritionPct: 5.5 });
  });

  it.each([
    ['PORT', 'eighty'],
    ['DB_PORT', '70000'],
    ['DB_POOL_MAX', '0'],
    ['PUBLIC_URL', 'ftp://files.example.org'],
    ['PUBLIC_URL', 'not a url'],
    ['SMTP_SECURE', 'yes'],
    ['TRUST_PROXY', 'true'],
    ['CALC_RATE_LIMIT_PER_MIN', '-5'],
    ['DB_QUERY_TIMEOUT_MS', '10'],
    ['SHUTDOWN_GRACE_S', 'soon'],
    ['ORG_CURRENCY', 'euro'],
    ['ORG_CURRENCY', 'eur'],
    ['ATTRITION_PCT', '-1'],
    ['ATTRITION_PCT', '80'],
    ['STORAGE', 'cloud'],
    ['S3_ENDPOINT', 'ftp://files.example.org'],
    ['S3_BUCKET', 'Upper_Case'],
    ['S3_FAKE_PORT', '70000'],
    ['DB_REPLICA_PORT', '0'],
    ['DB_BUFFER_POOL_SIZE', '512'],
    ['DB_BUFFER_POOL_SIZE', '1T'],
  ])('refuses %s=%s naming the key', (key, value) => {
    let err: unknown;
    try {
      readConfig({ [key]: value });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ConfigError);
    expect((err as ConfigError).issues.map((i) => i.key)).toEqual([key]);
    expect((err as ConfigError).message).toContain(key);
  });
});

describe('README "Configuration" table', () => {
  it('lists exactly CONFIG_KEYS, in order, with the same defaults and meanings', () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    const start = readme.indexOf('## Configuration');
    const section = readme.slice(start, readme.indexOf('\n## ', start + 1));
    const rows = section
      .split('\n')
      .filter((l) => l.startsWith('| `'))
      .map((l) => l.split(' | ').map((cell) => cell.replace(/^\| /, '').replace(/ \|$/, '')));
    const expected = CONFIG_KEYS.map((k) => [`\`${k.key}\``, k.defaultText, k.meaning]);
    // On a mismatch, copy the rows printed here into README.md (they are rendered from src/server/config.ts).
    expect(rows, CONFIG_KEYS.map((k) => `| \`${k.key}\` | ${k.defaultText} | ${k.meaning} |`).join('\n')).toEqual(expected);
  });
});
