// Bench records through the API, on each database (PGlite and PostgreSQL 15): a mix recorded with
// a photo (stored without its location), read back by another role, a build, a resend stored
// once, a correction, an admin's hide, the CSV, and every refusal storing nothing.
import { resolve } from 'node:path';
import exifr from 'exifr';
import sharp from 'sharp';
import { count } from 'drizzle-orm';
import { expect, it } from 'vitest';
import type { BenchRecord, FrictionResponse, PlanDetail, RecordListResponse } from '#shared/api';
import { createUser } from '../../server/auth/users.ts';
import { DEFAULT_LIMITS } from '../../server/auth/rate-limit.ts';
import type { DatabaseHandle } from '../../server/db/client.ts';
import { benchRecordsTable, photoBlobsTable, recordPhotosTable } from '../../server/db/schema.ts';
import { loadFolder } from '../../server/load/index.ts';
import { forEachDatabase } from '../setup/databases.ts';
import { emailOf, getJson, PASSWORD, sendJson, startTestServer, TEST_SCRYPT } from './harness.ts';
import { photoWithLocation, postRecord, type Part } from './records-helpers.ts';
import { ROLES } from '#shared/permissions';

async function counts(h: DatabaseHandle) {
  const [r] = await h.db.select({ n: count() }).from(benchRecordsTable);
  const [p] = await h.db.select({ n: count() }).from(recordPhotosTable);
  const [b] = await h.db.select({ n: count() }).from(photoBlobsTable);
  return { records: Number(r.n), photos: Number(p.n), blobs: Number(b.n) };
}

const fields = (o: Record<string, string>): Part[] => Object.entries(o).map(([name, value]) => ({ name, value }));

forEachDatabase('bench records', (setup) => {
  async function server(limits = DEFAULT_LIMITS) {
    const handle = await setup.fresh();
    await loadFolder(handle, resolve('formulas'), { git: false });
    for (const role of ROLES) await createUser(handle.db, { email: emailOf(role), name: `Test ${role}`, role, password: PASSWORD }, TEST_SCRYPT);
    return { handle, t: await startTestServer(handle, { limits }) };
  }

  it('records a mix with a photo, stored without location or camera data, and another role reads it', async () => {
    const { handle, t } = await server();
    try {
      const bench = await t.signIn('bench');
      const photo = await photoWithLocation();
      expect((await exifr.gps(photo))?.latitude).toBeCloseTo(50.5); // the fixture does carry a location
      const sent = await postRecord(t, bench, '2026-12-03', [
        ...fields({ target: 'harbour-ciabatta/1', dough_temperature: '25.5', water_temperature: '9', note: 'slack, added 1 % water', initials: 'MK', client_id: 'rec-0001-abcdef', recorded_at: '2026-12-02T21:03:00+01:00' }),
        { name: 'photo', value: photo, filename: 'crumb.jpg', type: 'image/jpeg' },
      ]);
      expect(sent.status).toBe(201);
      const rec = sent.body.record as BenchRecord;
      expect(rec).toMatchObject({ target: 'harbour-ciabatta/1', kind: 'mix', formula: 'harbour-ciabatta', mixer: 'spiral', doughTemperature: 25.5, waterTemperature: 9, initials: 'MK', note: 'slack, added 1 % water' });
      expect(rec.by.email).toBe(emailOf('bench'));
      expect(rec.recordedAt).toBe('2026-12-02T20:03:00.000Z');
      expect(rec.photos).toHaveLength(1);
      expect(rec.friction?.waterFrom).toBe('measured');

      const reviewer = await t.signIn('reviewer');
      const list = (await getJson(`${t.url}/api/plans/2026-12-03/records`, reviewer)).body as RecordListResponse;
      expect(list.records.map((r) => r.id)).toEqual([rec.id]);
      expect(list.targets.map((x) => x.target)).toContain('harbour-ciabatta/2');
      expect(list.targets.map((x) => x.target)).toContain('poolish');

      const full = await fetch(`${t.url}${rec.photos[0].url}`, { headers: { cookie: reviewer } });
      expect(full.status).toBe(200);
      expect(full.headers.get('content-type')).toBe('image/jpeg');
      expect(full.headers.get('x-content-type-options')).toBe('nosniff');
      const stored = Buffer.from(await full.arrayBuffer());
      // The stored bytes: no EXIF at all, so no GPS and no camera (exifr answers undefined).
      expect(await exifr.parse(stored, { gps: true, tiff: true, exif: true, xmp: true })).toBeUndefined();
      expect(await exifr.gps(stored)).toBeUndefined();
      expect(stored.includes(Buffer.from('TestCam'))).toBe(false);
      expect(stored.includes(Buffer.from('Exif\0\0'))).toBe(false);
      const preview = await fetch(`${t.url}${rec.photos[0].previewUrl}`, { headers: { cookie: reviewer } });
      const meta = await sharp(Buffer.from(await preview.arrayBuffer())).metadata();
      expect(Math.max(meta.width!, meta.height!)).toBeLessThanOrEqual(320);
      expect((await fetch(`${t.url}${rec.photos[0].url}`)).status).toBe(401);
      expect((await fetch(`${t.url}/api/records/${rec.id}/photos/2`, { headers: { cookie: reviewer } })).status).toBe(404);

      // A resend (the tablet lost the answer) stores nothing new.
      const again = await postRecord(t, bench, '2026-12-03', [
        ...fields({ target: 'harbour-ciabatta/1', dough_temperature: '25.5', initials: 'MK', client_id: 'rec-0001-abcdef' }),
        { name: 'photo', value: photo, filename: 'crumb.jpg', type: 'image/jpeg' },
      ]);
      expect(again.status).toBe(200);
      expect(again.res.headers.get('idempotent-replayed')).toBe('true');
      expect(again.body.record.id).toBe(rec.id);
      expect(await counts(handle)).toEqual({ records: 1, photos: 1, blobs: 2 });
      // The same key from another account is refused.
      const author = await t.signIn('author');
      expect((await postRecord(t, author, '2026-12-03', fields({ target: 'harbour-ciabatta/1', dough_temperature: '25', initials: 'IA', client_id: 'rec-0001-abcdef' }))).status).toBe(409);

      // A build: its temperature and whether it was ripe.
      const build = await postRecord(t, bench, '2026-12-03', fields({ target: 'poolish', dough_temperature: '21', ripe: 'yes', initials: 'MK' }));
      expect(build.status).toBe(201);
      expect(build.body.record).toMatchObject({ kind: 'build', ripe: true, friction: null });

      // A correction is a new row; the old one stays, marked.
      const fix = await postRecord(t, bench, '2026-12-03', fields({ target: 'harbour-ciabatta/1', dough_temperature: '26.5', water_temperature: '9', initials: 'MK', corrects: String(rec.id), note: 'misread the probe' }));
      expect(fix.status).toBe(201);
      const after = (await getJson(`${t.url}/api/plans/2026-12-03/records`, reviewer)).body as RecordListResponse;
      expect(after.records.find((r) => r.id === rec.id)?.correctedBy).toBe(fix.body.record.id);
      expect(after.records.find((r) => r.id === fix.body.record.id)?.corrects).toBe(rec.id);

      // An admin hides the build: kept, marked, gone from the others' lists.
      expect((await sendJson(`${t.url}/api/records/${build.body.record.id}/hide`, 'POST', { reason: 'wrong day' }, { cookie: bench })).status).toBe(403);
      const admin = await t.signIn('admin');
      const hid = await sendJson(`${t.url}/api/records/${build.body.record.id}/hide`, 'POST', { reason: 'wrong day' }, { cookie: admin });
      expect(hid.status).toBe(200);
      expect((hid.body as { record: BenchRecord }).record.hidden).toMatchObject({ by: emailOf('admin'), reason: 'wrong day' });
      expect((await sendJson(`${t.url}/api/records/${build.body.record.id}/hide`, 'POST', { reason: 'again' }, { cookie: admin })).status).toBe(409);
      const seen = (await getJson(`${t.url}/api/plans/2026-12-03/records`, reviewer)).body as RecordListResponse;
      expect(seen.records.map((r) => r.kind)).toEqual(['mix', 'mix']);
      const adminSees = (await getJson(`${t.url}/api/plans/2026-12-03/records?hidden=1`, admin)).body as RecordListResponse;
      expect(adminSees.records).toHaveLength(3);
      expect((await counts(handle)).records).toBe(3);

      // Per formula.
      const ciabatta = (await getJson(`${t.url}/api/plans/2026-12-03/records?formula=harbour-ciabatta`, reviewer)).body as RecordListResponse;
      expect(ciabatta.records).toHaveLength(2);
      const baguette = (await getJson(`${t.url}/api/plans/2026-12-03/records?formula=tidewater-baguette`, reviewer)).body as RecordListResponse;
      expect(baguette.records).toHaveLength(0);

      // The CSV for the food-safety file.
      const csv = await fetch(`${t.url}/api/plans/2026-12-03/records.csv`, { headers: { cookie: reviewer } });
      expect(csv.headers.get('content-type')).toMatch(/^text\/csv/);
      const text = await csv.text();
      expect(text.split('\r\n')[0]).toBe('id,date,target,kind,formula,mixer,dough_temperature_c,water_temperature_c,ripe,note,initials,recorded_at,stored_at,by,corrects,corrected_by,photos');
      expect(text).toContain('"slack, added 1 % water"');
      const range = await (await fetch(`${t.url}/api/records.csv?from=2026-12-01&to=2026-12-31`, { headers: { cookie: reviewer } })).text();
      expect(range).toBe(text);
    } finally {
      await t.close();
    }
  }, 180_000);

  it('refuses bad records with a clear message and stores nothing', async () => {
    const { handle, t } = await server({ ...DEFAULT_LIMITS, recordPosts: { max: 8, windowMs: 60_000 } });
    try {
      const bench = await t.signIn('bench');
      const photo = await photoWithLocation();
      const ok = { target: 'harbour-ciabatta/1', dough_temperature: '25', initials: 'MK' };
      const notImage = await postRecord(t, bench, '2026-12-03', [...fields(ok), { name: 'photo', value: Buffer.from('%PDF-1.4 not a photo at all'), filename: 'crumb.jpg', type: 'image/jpeg' }]);
      expect(notImage.status).toBe(422);
      expect(notImage.body.issues[0]).toMatchObject({ path: 'photo' });
      expect(notImage.body.message).toMatch(/crumb\.jpg is not a JPEG, PNG or WebP image/);

      const big = Buffer.concat([photo, Buffer.alloc(10 * 1024 * 1024)]);
      const tooBig = await postRecord(t, bench, '2026-12-03', [...fields(ok), { name: 'photo', value: big, filename: 'big.jpg', type: 'image/jpeg' }]);
      expect(tooBig.status).toBe(413);
      expect(tooBig.body.error).toBe('payload_too_large');

      const hot = await postRecord(t, bench, '2026-12-03', fields({ ...ok, dough_temperature: '61' }));
      expect(hot.status).toBe(422);
      expect(hot.body.issues).toEqual([{ path: 'dough_temperature', message: 'dough_temperature must be from 0 to 60 °C; got 61' }]);
      expect((await postRecord(t, bench, '2026-12-03', fields({ ...ok, dough_temperature: '-1' }))).status).toBe(422);

      const elsewhere = await postRecord(t, bench, '2026-12-03', fields({ ...ok, target: 'harbour-tin-loaf/1' }));
      expect(elsewhere.status).toBe(422);
      expect(elsewhere.body.issues[0].message).toMatch(/"harbour-tin-loaf\/1" is not on that day's sheet; it has harbour-ciabatta\/1/);
      const twice = await postRecord(t, bench, '2026-12-03', fields({ ...ok, target: 'levain' }));
      expect(twice.body.issues[0].message).toMatch(/levain\/1, levain\/2/);

      // A good record with a bad photo after a good one: neither is kept.
      const mixed = await postRecord(t, bench, '2026-12-03', [
        ...fields(ok),
        { name: 'photo', value: photo, filename: 'a.jpg', type: 'image/jpeg' },
        { name: 'photo', value: Buffer.from('GIF89a nonsense'), filename: 'b.jpg', type: 'image/jpeg' },
      ]);
      expect(mixed.status).toBe(422);

      const json = await sendJson(`${t.url}/api/plans/2026-12-03/records`, 'POST', ok, { cookie: bench });
      expect(json.status).toBe(415);
      expect(await counts(handle)).toEqual({ records: 0, photos: 0, blobs: 0 });

      // Too many in a minute: 429 with Retry-After (8 allowed in this test, 7 used above).
      expect((await postRecord(t, bench, '2026-12-03', fields(ok))).status).toBe(201);
      const limited = await postRecord(t, bench, '2026-12-03', fields(ok));
      expect(limited.status).toBe(429);
      expect(Number(limited.res.headers.get('retry-after'))).toBeGreaterThan(0);
      t.clock.now += 61_000;
      expect((await postRecord(t, bench, '2026-12-03', fields(ok))).status).toBe(201);
      expect((await counts(handle)).records).toBe(2);
    } finally {
      await t.close();
    }
  }, 180_000);

  it('learns the friction from the records and proposes it on the sheet and in /api/friction', async () => {
    const { t } = await server();
    try {
      const bench = await t.signIn('bench');
      const plan = (await getJson(`${t.url}/api/plans/2026-12-03`, bench)).body as PlanDetail;
      const mix = plan.sheet.mixes.find((m) => m.formula === 'harbour-ciabatta')!;
      expect(plan.sheet.frictionProposals).toBeUndefined();
      // Made as printed, each dough 1 °C warmer than aimed at: the rise is 1 °C-degree more than the file's.
      for (const n of [1, 2]) {
        expect((await postRecord(t, bench, '2026-12-03', fields({ target: `harbour-ciabatta/${n}`, dough_temperature: String(mix.doughTemperature! + 1), initials: 'MK' }))).status).toBe(201);
      }
      let friction = (await getJson(`${t.url}/api/friction?mixer=spiral&formula=harbour-ciabatta`, bench)).body as FrictionResponse;
      expect(friction.proposals[0]).toMatchObject({ status: 'too few', mixes: 2, rise: null });
      expect((await postRecord(t, bench, '2026-12-03', fields({ target: 'harbour-ciabatta/1', dough_temperature: String(mix.doughTemperature! + 1), initials: 'MK' }))).status).toBe(201);
      friction = (await getJson(`${t.url}/api/friction?mixer=spiral&formula=harbour-ciabatta&date=2026-12-03`, bench)).body as FrictionResponse;
      const p = friction.proposals[0];
      expect(p.status).toBe('propose');
      expect(p.rise).toBeCloseTo(mix.factors!.rise + 1, 9);
      expect(p.basis).toBe('from 3 mixes, 3 Dec');
      expect(p.change).toBe('in formulas/plans/2026-12-03.yaml, mixer spiral: friction: 13 °C becomes friction: 16 °C');
      const sheet = ((await getJson(`${t.url}/api/plans/2026-12-03`, bench)).body as PlanDetail).sheet;
      expect(sheet.frictionProposals?.find((x) => x.formula === 'harbour-ciabatta')).toEqual(p);
      // The file's value is untouched.
      expect(sheet.mixers.find((m) => m.name === 'spiral')!.rise).toBeCloseTo(13 / 3, 9);
      const pdf = await fetch(`${t.url}/api/plans/2026-12-03/sheet.pdf`, { headers: { cookie: bench } });
      expect(pdf.status).toBe(200);
    } finally {
      await t.close();
    }
  }, 180_000);
});

