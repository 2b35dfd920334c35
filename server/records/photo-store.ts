// Where record photos' bytes are kept, behind one interface: the database (the default; the same
// on PGlite and on a PostgreSQL server several servers share), or an S3-compatible object store
// named by PANFORM_S3_* (docs/operations.md). The record_photos rows say which and under what key.
import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
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
  private readonly client: S3Client;

  constructor(private readonly settings: Extract<PhotoStoreSettings, { kind: 's3' }>) {
    this.client = new S3Client({
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
  }

  private objectKey(key: string): string {
    return `${this.settings.prefix}${key}`;
  }

  async put(_db: Database, key: string, data: Buffer, contentType: string): Promise<void> {
    await this.client.send(new PutObjectCommand({ Bucket: this.settings.bucket, Key: this.objectKey(key), Body: data, ContentType: contentType }));
  }

  async get(_db: Database, key: string): Promise<Buffer | null> {
    try {
      const out = await this.client.send(new GetObjectCommand({ Bucket: this.settings.bucket, Key: this.objectKey(key) }));
      if (!out.Body) return null;
      return Buffer.from(await out.Body.transformToByteArray());
    } catch (e) {
      if (e instanceof NoSuchKey || (e as { name?: string }).name === 'NoSuchKey') return null;
      throw e;
    }
  }

  async remove(_db: Database, keys: string[]): Promise<void> {
    for (const key of keys) await this.client.send(new DeleteObjectCommand({ Bucket: this.settings.bucket, Key: this.objectKey(key) }));
  }

  close(): void {
    this.client.destroy();
  }
}

export function createPhotoStore(settings: PhotoStoreSettings): PhotoStore {
  return settings.kind === 's3' ? new S3PhotoStore(settings) : new DatabasePhotoStore();
}
