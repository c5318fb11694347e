/**
 * The keys the app's datasheet store holds right now, read beside the app (not through it): the files in
 * DATA_DIR/datasheets, or with STORAGE=s3 the objects in the bucket (ListObjectsV2 on S3_ENDPOINT).
 */
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { readConfig } from '../../src/server/config.ts';

export async function storedKeys(env: NodeJS.ProcessEnv = process.env): Promise<string[]> {
  const config = readConfig(env);
  if (config.storage.kind === 'local') {
    const dir = path.resolve(config.dataDir, 'datasheets');
    return existsSync(dir) ? readdirSync(dir).sort() : [];
  }
  const { endpoint, bucket, region, accessKeyId, secretAccessKey } = config.storage.s3;
  if (!endpoint) throw new Error('STORAGE=s3 without S3_ENDPOINT: run the suite with `npm test`.');
  const client = new S3Client({ endpoint, region, forcePathStyle: true, credentials: { accessKeyId, secretAccessKey } });
  try {
    const keys: string[] = [];
    let token: string | undefined;
    do {
      const page = await client.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
      for (const o of page.Contents ?? []) if (o.Key) keys.push(o.Key);
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
    return keys.sort();
  } finally {
    client.destroy();
  }
}
