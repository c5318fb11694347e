/**
 * Local stand-ins for hosted services that the start and test commands run:
 * an SMTP sink on 127.0.0.1 (smtp-server) that parses every message (mailparser) and stores it in the
 * captured_mail table, where admins read it on /mail and tests find it. Real mail is configured by
 * setting SMTP_HOST (and MAIL_SINK unset); then no sink starts.
 * With STORAGE=s3 and no S3_ENDPOINT, a fake S3 (s3rver) on 127.0.0.1 with its files under DATA_DIR/s3
 * and the bucket created; a real store is configured by setting S3_ENDPOINT, and then no fake starts.
 * And the local fake distributor (distributor-fake.ts) that the distributor client asks for offers,
 * unless DISTRIBUTOR_URL names a real one.
 */
import path from 'node:path';
import S3rver from 's3rver';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import knexFactory, { type Knex } from 'knex';
import { knexConfig } from '../../knexfile.ts';
import { insertCapturedMail } from '../../src/server/repos/captured-mail.ts';
import { log } from './log.ts';
import { DEFAULT_DISTRIBUTOR_FAKE_PORT, DEFAULT_SINK_PORT, readConfig } from '../../src/server/config.ts';
import { startFakeDistributor } from './distributor-fake.ts';

export interface Services {
  env: Record<string, string>;
  close(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

function readAll(stream: NodeJS.ReadableStream): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    stream.on('data', (c: Buffer) => chunks.push(c));
    stream.on('end', () => resolve(Buffer.concat(chunks)));
    stream.on('error', reject);
  });
}

async function store(knex: Knex, raw: Buffer, from: string, to: string[]): Promise<void> {
  const parsed = await simpleParser(raw);
  await insertCapturedMail(knex, {
    received_at: new Date(),
    envelope_from: from.slice(0, 320),
    envelope_to: to
      .map((a) => a.toLowerCase())
      .join(',')
      .slice(0, 2000),
    subject: (parsed.subject ?? '').slice(0, 500),
    text_body: parsed.text ?? null,
    html_body: typeof parsed.html === 'string' ? parsed.html : null,
    attachments_json: parsed.attachments.length
      ? JSON.stringify(
          parsed.attachments.map((a) => ({ filename: a.filename ?? '', contentType: a.contentType, text: a.content.toString('utf8') })),
        )
      : null,
    message_id: parsed.messageId?.slice(0, 300) ?? null,
    size_bytes: raw.length,
  });
}

function createSink(knex: Knex): SMTPServer {
  return new SMTPServer({
    name: 'stallpoint-mail-sink',
    banner: 'Stallpoint local mail sink: messages are kept in the database, never delivered',
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
      const to = session.envelope.rcptTo.map((r) => r.address);
      // Answer 250 only once the message is stored, so a sender that got "sent" can find it at once.
      readAll(stream)
        .then((raw) => store(knex, raw, from, to))
        .then(
          () => callback(),
          (err: Error) => callback(err),
        );
    },
  });
}

export async function startMailSink(env: NodeJS.ProcessEnv): Promise<Services> {
  const knex = knexFactory(knexConfig(env));
  const sink = createSink(knex);
  const config = readConfig(env);
  const wanted = config.sinkPort ?? (config.nodeEnv === 'test' ? 0 : DEFAULT_SINK_PORT);
  await new Promise<void>((resolve, reject) => {
    sink.once('error', (err: NodeJS.ErrnoException) => {
      const inUse = err.code === 'EADDRINUSE';
      reject(new Error(inUse ? `port ${wanted} for the mail sink is in use: set SMTP_SINK_PORT to a free one` : err.message));
    });
    sink.listen(wanted, '127.0.0.1', () => resolve());
  });
  sink.on('error', (err: Error) => log(`mail sink: ${err.message}`));
  const address = sink.server.address();
  const port = typeof address === 'object' && address ? address.port : wanted;
  log(`mail sink on 127.0.0.1:${port} (admins read it at /mail)`);
  const out: Record<string, string> = { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(port), SMTP_SECURE: 'false', MAIL_SINK: 'local' };
  if (!config.publicUrl && config.nodeEnv !== 'test') out.PUBLIC_URL = `http://${config.host}:${config.port}`;
  return {
    env: out,
    async close() {
      await new Promise<void>((resolve) => sink.close(() => resolve()));
      await knex.destroy();
    },
  };
}

/**
 * The fake S3 store: s3rver on 127.0.0.1 (S3_FAKE_PORT, or a free port), objects under `directory`, the
 * bucket made at start. Its access key is s3rver's fixed S3RVER/S3RVER (S3_ACCESS_KEY_ID/… defaults).
 */
export async function startS3Fake(directory: string, bucket: string, port = 0): Promise<Services> {
  const server = new S3rver({ address: '127.0.0.1', port, silent: true, directory, configureBuckets: [{ name: bucket, configs: [] }] });
  let address: { port: number };
  try {
    address = (await server.run()) as unknown as { port: number };
  } catch (err) {
    const inUse = (err as NodeJS.ErrnoException).code === 'EADDRINUSE';
    throw new Error(inUse ? `port ${port} for the fake S3 is in use: set S3_FAKE_PORT to a free one` : (err as Error).message);
  }
  log(`fake S3 on 127.0.0.1:${address.port}, bucket ${bucket}, files in ${directory}`);
  return {
    env: { S3_ENDPOINT: `http://127.0.0.1:${address.port}` },
    async close() {
      await server.close();
    },
  };
}

function combine(parts: Services[]): Services {
  return {
    env: Object.assign({}, ...parts.map((p) => p.env)),
    async close() {
      for (const p of [...parts].reverse()) await p.close();
    },
  };
}

async function startDistributorFake(env: NodeJS.ProcessEnv): Promise<Services> {
  const config = readConfig(env);
  const wanted = config.distributor.fakePort ?? (config.nodeEnv === 'test' ? 0 : DEFAULT_DISTRIBUTOR_FAKE_PORT);
  const fake = await startFakeDistributor(wanted);
  log(`fake distributor on ${fake.url} (stands in for a hosted distributor API)`);
  return { env: { DISTRIBUTOR_URL: fake.url }, close: () => fake.close() };
}

/** Starts what the configuration leaves to local stand-ins; close() stops them all (also after a half start). */
export async function startServices(env: NodeJS.ProcessEnv): Promise<Services> {
  const config = readConfig(env);
  const parts: Services[] = [];
  try {
    if (config.storage.kind === 's3' && !config.storage.s3.endpoint)
      parts.push(await startS3Fake(path.resolve(config.dataDir, 's3'), config.storage.s3.bucket, config.storage.s3.fakePort ?? 0));
    if (!(env.SMTP_HOST && !config.mail.sinkLocal)) parts.push(await startMailSink(env));
    if (!config.distributor.url) parts.push(await startDistributorFake(env));
  } catch (err) {
    await combine(parts).close();
    throw err;
  }
  return combine(parts);
}
