// Where record photos' bytes are kept, behind one interface: the database (the default; the same
// on PGlite and on a PostgreSQL server several servers share), or an S3-compatible object store
// named by PANFORM_S3_* (docs/operations.md). The record_photos rows say which and under what key.
import type { S3Client } from '@aws-sdk/client-s3';
import { eq, inArray } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { photoBlobsTable } from '../db/schema.ts';
import type { PhotoStoreSettings } from '../env.ts';

export interface PhotoStore {
  readonly kind: 'database' | 's3';
  /**
   * Keeps bytes under a key. `db` is the transaction the record is written in: the database store
   * writes in it (nothing stays if it rolls back); an object store writes at once, and the caller
   * takes the objects back with `remove` when the transaction fails.
   */
  put(db: Database, key: string, data: Buffer, contentType: string): Promise<void>;
  /** The bytes, or null when the key holds nothing. */
  get(db: Database, key: string): Promise<Buffer | null>;
  remove(db: Database, keys: string[]): Promise<void>;
  /** Releases connections (the S3 client's sockets). */
  close(): void;
}

export class DatabasePhotoStore implements PhotoStore {
  readonly kind = 'database' as const;

  async put(db: Database, key: string, data: Buffer): Promise<void> {
    await db.insert(photoBlobsTable).values({ key, data });
  }

  async get(db: Database, key: string): Promise<Buffer | null> {
    const rows = await db.select({ data: photoBlobsTable.data }).from(photoBlobsTable).where(eq(photoBlobsTable.key, key));
    return rows[0]?.data ?? null;
  }

  async remove(db: Database, keys: string[]): Promise<void> {
    if (keys.length > 0) await db.delete(photoBlobsTable).where(inArray(photoBlobsTable.key, keys));
  }

  close(): void {}
}

export class S3PhotoStore implements PhotoStore {
  readonly kind = 's3' as const;
  /** The S3 client, loaded on first use (the SDK holds tens of MB a database-store server never needs). */
  private client: S3Client | null = null;
  private sdk: typeof import('@aws-sdk/client-s3') | null = null;

  constructor(private readonly settings: Extract<PhotoStoreSettings, { kind: 's3' }>) {}

  private async open(): Promise<{ client: S3Client; sdk: typeof import('@aws-sdk/client-s3') }> {
    if (!this.client || !this.sdk) {
      const sdk = await import('@aws-sdk/client-s3');
      const settings = this.settings;
      this.client = new sdk.S3Client({
        region: settings.region,
        endpoint: settings.endpoint,
        forcePathStyle: settings.forcePathStyle,
        // Checksums only where S3 requires them: stores other than AWS's may not know the newer ones.
        requestChecksumCalculation: 'WHEN_REQUIRED',
        responseChecksumValidation: 'WHEN_REQUIRED',
        credentials: settings.accessKeyId && settings.secretAccessKey ? { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey } : undefined,
        // A stuck store must not hold a bench request for minutes.
        requestHandler: { requestTimeout: 30_000, connectionTimeout: 5_000 },
      });
      this.sdk = sdk;
    }
    return { client: this.client, sdk: this.sdk };
  }

  private objectKey(key: string): string {
    return `${this.settings.prefix}${key}`;
  }

  async put(_db: Database, key: string, data: Buffer, contentType: string): Promise<void> {
    const { client, sdk } = await this.open();
    await client.send(new sdk.PutObjectCommand({ Bucket: this.settings.bucket, Key: this.objectKey(key), Body: data, ContentType: contentType }));
  }

  async get(_db: Database, key: string): Promise<Buffer | null> {
    const { client, sdk } = await this.open();
    try {
      const out = await client.send(new sdk.GetObjectCommand({ Bucket: this.settings.bucket, Key: this.objectKey(key) }));
      if (!out.Body) return null;
      return Buffer.from(await out.Body.transformToByteArray());
    } catch (e) {
      if (e instanceof sdk.NoSuchKey || (e as { name?: string }).name === 'NoSuchKey') return null;
      throw e;
    }
  }

  async remove(_db: Database, keys: string[]): Promise<void> {
    const { client, sdk } = await this.open();
    for (const key of keys) await client.send(new sdk.DeleteObjectCommand({ Bucket: this.settings.bucket, Key: this.objectKey(key) }));
  }

  close(): void {
    this.client?.destroy();
  }
}

export function createPhotoStore(settings: PhotoStoreSettings): PhotoStore {
  return settings.kind === 's3' ? new S3PhotoStore(settings) : new DatabasePhotoStore();
}
