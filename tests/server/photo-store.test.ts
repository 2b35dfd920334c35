// The photo stores behind one interface: the same tests on the database store and on an
// S3-compatible store (s3rver, a fake S3 server from npm, in this process). Then a record with a
// photo through the API with PANFORM_S3_* set: the bytes go to the bucket, none to photo_blobs,
// and a record that fails to be written leaves no object behind.
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import exifr from 'exifr';
import { count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BenchRecord } from '#shared/api';
import { recordTargets } from '#shared/records';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { photoBlobsTable, recordPhotosTable } from '../../server/db/schema.ts';
import { readEnv } from '../../server/env.ts';
import { preparePhoto } from '../../server/records/images.ts';
import { createPhotoStore, DatabasePhotoStore, S3PhotoStore, type PhotoStore } from '../../server/records/photo-store.ts';
import { insertRecord } from '../../server/records/store.ts';
import { buildSheet } from '#shared/sheet/build';
import { startFakeS3, type FakeS3 } from './fake-s3.ts';
import { forEachDatabase } from '../setup/databases.ts';
import { openTestDatabase, startTestServer } from './harness.ts';
import { photoWithLocation, postRecord } from './records-helpers.ts';
import { DEMO_PLANS, sheetInput } from '../shared/sheet-fixtures.ts';

let s3: FakeS3;
let handle: DatabaseHandle;

beforeAll(async () => {
  s3 = await startFakeS3();
  handle = await openTestDatabase();
}, 180_000);
afterAll(async () => {
  await handle?.close();
  await s3?.close();
});

const backends: [string, () => PhotoStore][] = [
  ['the database', () => new DatabasePhotoStore()],
  ['an S3-compatible store', () => new S3PhotoStore(s3.settings)],
];

describe.each(backends)('photos kept in %s', (_name, make) => {
  it('gives back what was put, nothing for an unknown key, and nothing once removed', () => putGetRemove(handle, make()));
  it('stores a record and its photo together, and leaves nothing when the record cannot be written', () => allOrNothing(handle, make()));
});

// The database store on each database setup (PGlite and PostgreSQL 15): the same two tests.
forEachDatabase('photos kept in the database', (setup) => {
  it('gives back what was put, nothing for an unknown key, and nothing once removed', async () => putGetRemove(await setup.fresh(), new DatabasePhotoStore()));
  it('stores a record and its photo together, and leaves nothing when the record cannot be written', async () => allOrNothing(await setup.fresh(), new DatabasePhotoStore()), 120_000);
});

async function putGetRemove(handle: DatabaseHandle, store: PhotoStore): Promise<void> {
  try {
    const bytes = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 0, 255]);
    await store.put(handle.db, 'records/test/a.jpg', bytes, 'image/jpeg');
    expect(await store.get(handle.db, 'records/test/a.jpg')).toEqual(bytes);
    expect(await store.get(handle.db, 'records/test/none.jpg')).toBeNull();
    await store.remove(handle.db, ['records/test/a.jpg']);
    expect(await store.get(handle.db, 'records/test/a.jpg')).toBeNull();
  } finally {
    store.close();
  }
}

async function allOrNothing(handle: DatabaseHandle, store: PhotoStore): Promise<void> {
  try {
    const sheet = buildSheet(sheetInput(DEMO_PLANS[0]));
    const target = recordTargets(sheet).find((t) => t.target === 'harbour-ciabatta/1')!;
    const photo = await preparePhoto(await photoWithLocation(), 'crumb.jpg');
    const input = {
      date: '2026-12-03', target, doughTemperature: 25, waterTemperature: null, ripe: null, note: '', initials: 'MK',
      recordedAt: new Date(), createdAt: new Date(), by: { id: 1, email: 'bench@tidewater.example', name: '' }, clientId: null, corrects: null,
    };
    const { row } = await insertRecord(handle.db, store, input, [photo]);
    const [p] = await handle.db.select().from(recordPhotosTable).where(eq(recordPhotosTable.recordId, row.id));
    expect(p).toMatchObject({ recordId: row.id, n: 1, storage: store.kind });
    const stored = (await store.get(handle.db, p.key))!;
    expect(stored.equals(photo.data)).toBe(true);
    expect(await exifr.gps(stored)).toBeUndefined();
    expect((await store.get(handle.db, p.previewKey))!.equals(photo.preview)).toBe(true);

    // corrects names no record: the foreign key refuses the row, and the photo goes too.
    const before = await keysIn(handle, store);
    await expect(insertRecord(handle.db, store, { ...input, corrects: 999_999 }, [photo])).rejects.toThrow();
    expect(await keysIn(handle, store)).toEqual(before);
    const photosBefore = Number((await handle.db.select({ n: count() }).from(recordPhotosTable))[0].n);
    await expect(insertRecord(handle.db, store, { ...input, corrects: 999_998 }, [photo])).rejects.toThrow();
    expect(Number((await handle.db.select({ n: count() }).from(recordPhotosTable))[0].n)).toBe(photosBefore);
  } finally {
    store.close();
  }
}

/** Every key the store holds (the bucket's objects, or photo_blobs' rows). */
async function keysIn(handle: DatabaseHandle, store: PhotoStore): Promise<string[]> {
  if (store.kind === 'database') return (await handle.db.select({ key: photoBlobsTable.key }).from(photoBlobsTable)).map((r) => r.key).sort();
  const client = new S3Client({ region: 'us-east-1', endpoint: s3.settings.endpoint, forcePathStyle: true, credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } });
  try {
    const out = await client.send(new ListObjectsV2Command({ Bucket: s3.settings.bucket }));
    return (out.Contents ?? []).map((o) => o.Key!).sort();
  } finally {
    client.destroy();
  }
}

describe('the server with PANFORM_S3_* set', () => {
  it('reads the settings and keeps photos in the bucket, none in the database', async () => {
    const env = readEnv({ NODE_ENV: 'test', ...s3.env });
    expect(env.photoStore).toEqual(s3.settings);
    expect(createPhotoStore(env.photoStore).kind).toBe('s3');

    const db = await openTestDatabase();
    const t = await startTestServer(db, { envVars: s3.env });
    try {
      const bench = await t.signIn('bench');
      const before = (await keysIn(db, new S3PhotoStore(s3.settings))).length;
      const sent = await postRecord(t, bench, '2026-12-03', [
        { name: 'target', value: 'harbour-ciabatta/2' },
        { name: 'dough_temperature', value: '24.5' },
        { name: 'initials', value: 'MK' },
        { name: 'photo', value: await photoWithLocation(), filename: 'crumb.jpg', type: 'image/jpeg' },
      ]);
      expect(sent.status).toBe(201);
      const rec = sent.body.record as BenchRecord;
      expect((await keysIn(db, new S3PhotoStore(s3.settings))).length).toBe(before + 2);
      expect(Number((await db.db.select({ n: count() }).from(photoBlobsTable))[0].n)).toBe(0);
      const res = await fetch(`${t.url}${rec.photos[0].url}`, { headers: { cookie: bench } });
      expect(res.headers.get('content-type')).toBe('image/jpeg');
      expect(await exifr.gps(Buffer.from(await res.arrayBuffer()))).toBeUndefined();
    } finally {
      await t.close();
      await db.close();
    }
  }, 180_000);

  it('refuses half a setting', () => {
    expect(() => readEnv({ PANFORM_S3_ENDPOINT: 'http://127.0.0.1:9000' })).toThrow(/PANFORM_S3_BUCKET: is needed with PANFORM_S3_ENDPOINT/);
    expect(() => readEnv({ PANFORM_S3_BUCKET: 'photos', PANFORM_S3_ACCESS_KEY_ID: 'x' })).toThrow(/PANFORM_S3_SECRET_ACCESS_KEY/);
    expect(() => readEnv({ PANFORM_S3_BUCKET: 'Photos_Bucket' })).toThrow(/must be a bucket name/);
    expect(readEnv({}).photoStore).toEqual({ kind: 'database' });
  });
});
