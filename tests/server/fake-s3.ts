// A local S3-compatible server for tests: s3rver (npm), in this process, on a random loopback
// port, keeping objects in a throwaway folder. Its fixed credentials are S3RVER / S3RVER.
import { mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';
import type { PhotoStoreSettings } from '../../server/env.ts';

export const FAKE_S3_BUCKET = 'panform-photos';

export interface FakeS3 {
  /** What PANFORM_S3_* would say for this server. */
  env: Record<string, string>;
  settings: Extract<PhotoStoreSettings, { kind: 's3' }>;
  close(): Promise<void>;
}

export async function startFakeS3(): Promise<FakeS3> {
  const directory = mkdtempSync(join(tmpdir(), 'panform-s3-'));
  const server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory, configureBuckets: [{ name: FAKE_S3_BUCKET, configs: [] }] });
  const address = (await server.run()) as AddressInfo;
  const endpoint = `http://127.0.0.1:${address.port}`;
  const env = {
    PANFORM_S3_BUCKET: FAKE_S3_BUCKET,
    PANFORM_S3_ENDPOINT: endpoint,
    PANFORM_S3_REGION: 'us-east-1',
    PANFORM_S3_ACCESS_KEY_ID: 'S3RVER',
    PANFORM_S3_SECRET_ACCESS_KEY: 'S3RVER',
    PANFORM_S3_FORCE_PATH_STYLE: 'true',
    PANFORM_S3_PREFIX: 'test/',
  };
  return {
    env,
    settings: { kind: 's3', bucket: FAKE_S3_BUCKET, endpoint, region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true, prefix: 'test/' },
    async close() {
      await server.close();
      rmSync(directory, { recursive: true, force: true });
    },
  };
}
