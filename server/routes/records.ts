// Bench records: what the bench measured on a bake day (dough and water temperatures, a note,
// photos), the photos themselves, hiding a wrong record, the CSV for the food-safety file, and the
// friction learned from the records (shared/friction.ts). The contract: docs/api.md.
import type { Request, Response } from 'express';
import { Router } from 'express';
import type { Multer, MulterError } from 'multer';
import type { BenchRecord, FrictionResponse, RecordListResponse, RecordResponse } from '#shared/api';
import { frictionTable, type CurrentRise } from '#shared/friction';
import { roleHasPermission, type Role } from '#shared/permissions';
import {
  DOUGH_TEMPERATURE_RANGE, findTarget, INITIALS_MAX, NOTE_MAX, PHOTO_BYTES_MAX, PHOTOS_MAX, recordTargets, WATER_TEMPERATURE_RANGE,
} from '#shared/records';
import type { Sheet } from '#shared/sheet/types';
import { requirePermission } from '../auth/guards.ts';
import type { ServerContext } from '../context.ts';
import { readStringFields } from '../http/body.ts';
import { HttpError, invalid, notFound, rateLimited } from '../http/errors.ts';
import { queryString } from '../http/query.ts';
import { ImageRefused, preparePhoto, type PreparedPhoto } from '../records/images.ts';
import type { PhotoStore } from '../records/photo-store.ts';
import { frictionResponse } from '../records/friction.ts';
import {
  ClientIdTaken, findRecord, frictionRecords, hideRecord, insertRecord, listRecords, photosOf, correctionsOf, recordJson, type RecordRow,
} from '../records/store.ts';
import type { Snapshot } from './data.ts';
import { planFor, planVisible } from './plans.ts';

const DATE_RE = /^[0-9]{4}-[0-9]{2}-[0-9]{2}$/;
const CLIENT_ID_RE = /^[A-Za-z0-9_-]{8,100}$/;
/** A tablet's clock may run a little ahead of the server's. */
const FUTURE_SLACK_MS = 5 * 60_000;

/** Whether this request is the one that may send multipart (see csrfProtection). */
export const isRecordUpload = (req: Request): boolean => req.method === 'POST' && /^\/plans\/[^/]+\/records\/?$/.test(req.path);

/** multer, loaded on the first upload rather than at start. */
let upload: { multer: typeof import('multer'); upload: Multer } | null = null;
async function uploader(): Promise<NonNullable<typeof upload>> {
  if (!upload) {
    const { default: multer } = await import('multer');
    upload = {
      multer,
      upload: multer({
        storage: multer.memoryStorage(),
        limits: { fileSize: PHOTO_BYTES_MAX, files: PHOTOS_MAX, fields: 20, fieldSize: 16 * 1024, parts: PHOTOS_MAX + 20 },
      }),
    };
  }
  return upload;
}

/** Reads the multipart body; multer's refusals become the API's error answers. */
async function readMultipart(req: Request, res: Response): Promise<void> {
  const { multer, upload } = await uploader();
  return new Promise((ok, fail) => {
    upload.any()(req, res, (caught: unknown) => {
      if (!caught) return ok();
      const err = caught as MulterError;
      if (caught instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return fail(new HttpError(413, { error: 'payload_too_large', message: `a photo is larger than ${PHOTO_BYTES_MAX / 1024 / 1024} MB; nothing was stored`, issues: [{ path: 'photo', message: 'larger than 10 MB' }] }));
        }
        if (err.code === 'LIMIT_FILE_COUNT') {
          return fail(new HttpError(413, { error: 'payload_too_large', message: `at most ${PHOTOS_MAX} photos a record; nothing was stored`, issues: [{ path: 'photo', message: `more than ${PHOTOS_MAX} photos` }] }));
        }
        return fail(invalid(`the form cannot be read: ${err.message}; nothing was stored`, [{ path: err.field ?? 'body', message: err.message }]));
      }
      fail(invalid(`the form cannot be read: ${(err as Error).message}; nothing was stored`));
    });
  });
}

type Issues = { path: string; message: string }[];

function readNumber(fields: Record<string, unknown>, name: string, range: { min: number; max: number }, issues: Issues): number | null {
  const raw = fields[name];
  if (raw === undefined || raw === '') return null;
  const text = String(raw).trim().replace(',', '.');
  const v = /^-?[0-9]+(\.[0-9]+)?$/.test(text) ? Number(text) : NaN;
  if (Number.isNaN(v)) issues.push({ path: name, message: `${name} must be a number of °C, like 24.5; got "${String(raw)}"` });
  else if (v < range.min || v > range.max) issues.push({ path: name, message: `${name} must be from ${range.min} to ${range.max} °C; got ${v}` });
  else return v;
  return null;
}

function readBool(raw: unknown, name: string, issues: Issues): boolean | null {
  if (raw === undefined || raw === '') return null;
  const t = String(raw).trim().toLowerCase();
  if (['true', 'yes', '1'].includes(t)) return true;
  if (['false', 'no', '0'].includes(t)) return false;
  issues.push({ path: name, message: `${name} must be true or false; got "${String(raw)}"` });
  return null;
}

function one(fields: Record<string, unknown>, name: string, issues: Issues): string | undefined {
  const v = fields[name];
  if (Array.isArray(v)) {
    issues.push({ path: name, message: `${name} was sent more than once` });
    return undefined;
  }
  return v === undefined ? undefined : String(v);
}

/** The records a role may see on a day: the day's plan must be visible to it. */
function dayVisible(snapshot: Snapshot, date: string, role: Role): boolean {
  const entry = snapshot.plans.find((p) => p.date === date);
  return !entry || planVisible(snapshot, entry, role);
}

export function recordsRouter(ctx: ServerContext, photos: PhotoStore): Router {
  const r = Router();

  async function recordsWithDetail(rows: RecordRow[]): Promise<BenchRecord[]> {
    const ids = rows.map((x) => x.id);
    const [ph, corr] = await Promise.all([photosOf(ctx.db, ids), correctionsOf(ctx.db, ids)]);
    return rows.map((row) => recordJson(row, ph.get(row.id) ?? [], corr.get(row.id) ?? null));
  }

  r.post('/plans/:date/records', async (req, res) => {
    const user = requirePermission(req, 'write:record');
    if (!req.is('multipart/form-data')) {
      throw new HttpError(415, { error: 'invalid', message: `send a record as multipart/form-data (fields and photo files); got ${req.get('content-type') ?? 'no content type'}` });
    }
    const date = String(req.params.date);
    const snapshot = await ctx.data.snapshot();
    const { sheet } = planFor(snapshot, date, user.role);
    const wait = await ctx.limiters.records.post(user.id);
    if (wait > 0) throw rateLimited('too many records sent in a minute; the tablet keeps them and sends again shortly', wait / 1000);
    await readMultipart(req, res);

    const fields = (req.body ?? {}) as Record<string, unknown>;
    const files = (req.files ?? []) as Express.Multer.File[];
    const issues: Issues = [];
    const stray = files.filter((f) => f.fieldname !== 'photo');
    if (stray.length > 0) issues.push({ path: stray[0].fieldname, message: `files go in the field "photo"; got one in "${stray[0].fieldname}"` });

    const targetName = one(fields, 'target', issues)?.trim();
    const targets = recordTargets(sheet);
    let target = undefined as ReturnType<typeof recordTargets>[number] | undefined;
    if (!targetName) issues.push({ path: 'target', message: `target is required: one of ${targets.map((t) => t.target).join(', ')}` });
    else {
      const found = findTarget(targets, targetName);
      if ('error' in found) issues.push({ path: 'target', message: found.error });
      else target = found;
    }
    const kind = one(fields, 'kind', issues);
    if (kind !== undefined && kind !== '' && kind !== 'mix' && kind !== 'build') issues.push({ path: 'kind', message: `kind must be mix or build; got "${kind}"` });
    else if (target && kind && kind !== target.kind) issues.push({ path: 'kind', message: `${target.target} is a ${target.kind}, not a ${kind}` });

    const doughTemperature = readNumber(fields, 'dough_temperature', DOUGH_TEMPERATURE_RANGE, issues);
    const waterTemperature = readNumber(fields, 'water_temperature', WATER_TEMPERATURE_RANGE, issues);
    if (target?.kind === 'mix' && doughTemperature === null && !issues.some((i) => i.path === 'dough_temperature')) {
      issues.push({ path: 'dough_temperature', message: 'dough_temperature is required for a mix: the temperature off the mixer, °C' });
    }
    const ripe = readBool(one(fields, 'ripe', issues), 'ripe', issues);
    if (ripe !== null && target?.kind === 'mix') issues.push({ path: 'ripe', message: 'ripe is for builds (pre-ferments), not mixes' });

    const note = (one(fields, 'note', issues) ?? '').trim();
    if (note.length > NOTE_MAX) issues.push({ path: 'note', message: `note may have at most ${NOTE_MAX} characters` });
    const initials = (one(fields, 'initials', issues) ?? '').trim();
    if (initials.length < 1 || initials.length > INITIALS_MAX) issues.push({ path: 'initials', message: `initials are required, 1 to ${INITIALS_MAX} characters` });

    const now = ctx.now();
    let recordedAt = new Date(now);
    const at = one(fields, 'recorded_at', issues);
    if (at) {
      const t = /^[0-9]{4}-[0-9]{2}-[0-9]{2}T[0-9]{2}:[0-9]{2}(:[0-9]{2}(\.[0-9]+)?)?(Z|[+-][0-9]{2}:[0-9]{2})$/.test(at) ? Date.parse(at) : NaN;
      if (Number.isNaN(t)) issues.push({ path: 'recorded_at', message: `recorded_at must be a date-time with its offset, like 2026-12-03T02:14:00+01:00; got "${at}"` });
      else if (t > now + FUTURE_SLACK_MS) issues.push({ path: 'recorded_at', message: 'recorded_at is in the future: check the tablet\'s clock' });
      else recordedAt = new Date(t);
    }

    const clientId = (one(fields, 'client_id', issues) ?? req.get('idempotency-key') ?? '').trim() || null;
    if (clientId !== null && !CLIENT_ID_RE.test(clientId)) issues.push({ path: 'client_id', message: 'client_id must be 8 to 100 letters, digits, - or _ (a UUID)' });

    let corrects: number | null = null;
    const correctsText = one(fields, 'corrects', issues);
    if (correctsText) {
      const id = /^[0-9]{1,9}$/.test(correctsText) ? Number(correctsText) : NaN;
      const old = Number.isNaN(id) ? undefined : await findRecord(ctx.db, id);
      if (!old || old.planDate !== date || (old.hiddenAt && user.role !== 'admin')) issues.push({ path: 'corrects', message: `no record ${correctsText} on ${date} to correct` });
      else corrects = id;
    }
    if (issues.length > 0) throw invalid(`the record was not stored: ${issues.map((i) => i.message).join('; ')}`, issues);

    // Check every photo before storing anything.
    const prepared: PreparedPhoto[] = [];
    for (const f of files) {
      try {
        prepared.push(await preparePhoto(f.buffer, f.originalname));
      } catch (e) {
        if (e instanceof ImageRefused) throw invalid(`the record was not stored: ${e.message}`, [{ path: 'photo', message: e.message }]);
        throw e;
      }
    }
    let result;
    try {
      result = await insertRecord(ctx.db, photos, {
        date, target: target!, doughTemperature, waterTemperature, ripe, note, initials, recordedAt, createdAt: new Date(now),
        by: { id: user.id, email: user.email, name: user.name }, clientId, corrects,
      }, prepared);
    } catch (e) {
      if (e instanceof ClientIdTaken) throw new HttpError(409, { error: 'conflict', message: e.message });
      throw e;
    }
    const [record] = await recordsWithDetail([result.row]);
    if (result.replayed) res.set('Idempotent-Replayed', 'true');
    res.status(result.replayed ? 200 : 201).json({ record } satisfies RecordResponse);
  });

  r.get('/plans/:date/records', async (req, res) => {
    const user = requirePermission(req, 'read:record');
    const date = String(req.params.date);
    const snapshot = await ctx.data.snapshot();
    const { sheet } = planFor(snapshot, date, user.role);
    const formula = queryString(req, 'formula');
    const hidden = queryString(req, 'hidden') === '1' && roleHasPermission(user.role, 'manage:records');
    const rows = await listRecords(ctx.db, { date, formula, includeHidden: hidden });
    const body: RecordListResponse = {
      date,
      targets: recordTargets(sheet)
        .filter((t) => !formula || t.formulas.includes(formula))
        .map(({ inputs: _inputs, ...t }) => t),
      records: rows.map((x) => recordJson(x.row, x.photos, x.correctedBy)),
    };
    res.json(body);
  });

  r.get('/records/:id/photos/:n', async (req, res) => {
    const user = requirePermission(req, 'read:record');
    const size = queryString(req, 'size') ?? 'full';
    if (size !== 'full' && size !== 'preview') throw invalid(`size must be full or preview; got "${size}"`, [{ path: 'size', message: 'unknown size' }]);
    const id = /^[0-9]{1,9}$/.test(String(req.params.id)) ? Number(req.params.id) : NaN;
    const n = /^[0-9]{1,3}$/.test(String(req.params.n)) ? Number(req.params.n) : NaN;
    const rec = Number.isNaN(id) ? undefined : await findRecord(ctx.db, id);
    const snapshot = await ctx.data.snapshot();
    const gone = () => notFound(`no photo ${String(req.params.n)} of record ${String(req.params.id)}`);
    if (!rec || (rec.hiddenAt && !roleHasPermission(user.role, 'manage:records')) || !dayVisible(snapshot, rec.planDate, user.role)) throw gone();
    const photo = (await photosOf(ctx.db, [rec.id])).get(rec.id)?.find((p) => p.n === n);
    if (!photo) throw gone();
    const data = await photos.get(ctx.db, size === 'preview' ? photo.previewKey : photo.key);
    if (!data) throw gone();
    res.type(photo.contentType).set('X-Content-Type-Options', 'nosniff').set('Content-Disposition', `inline; filename="record-${rec.id}-${n}${size === 'preview' ? '-preview' : ''}.jpg"`).send(data);
  });

  r.post('/records/:id/hide', async (req, res) => {
    const admin = requirePermission(req, 'manage:records');
    const body = readStringFields(req.body ?? {}, { reason: { max: 500 } });
    const id = /^[0-9]{1,9}$/.test(String(req.params.id)) ? Number(req.params.id) : NaN;
    const rec = Number.isNaN(id) ? undefined : await findRecord(ctx.db, id);
    if (!rec) throw notFound(`no record ${String(req.params.id)}`);
    if (rec.hiddenAt) throw new HttpError(409, { error: 'conflict', message: `record ${rec.id} is already hidden (by ${rec.hiddenBy})` });
    const row = await hideRecord(ctx.db, rec.id, admin.email, body.reason.trim(), new Date(ctx.now()));
    if (!row) throw new HttpError(409, { error: 'conflict', message: `record ${rec.id} is already hidden` });
    const [record] = await recordsWithDetail([row]);
    res.json({ record } satisfies RecordResponse);
  });

  const sendCsv = async (res: Response, name: string, records: BenchRecord[]) => {
    const csv = await recordsCsv(records);
    res.type('text/csv; charset=utf-8').set('Content-Disposition', `attachment; filename="panform-records-${name}.csv"`).send(csv);
  };

  r.get('/plans/:date/records.csv', async (req, res) => {
    const user = requirePermission(req, 'read:record');
    const date = String(req.params.date);
    planFor(await ctx.data.snapshot(), date, user.role);
    const formula = queryString(req, 'formula');
    const rows = await listRecords(ctx.db, { date, formula });
    await sendCsv(res, date, rows.map((x) => recordJson(x.row, x.photos, x.correctedBy)));
  });

  r.get('/records.csv', async (req, res) => {
    const user = requirePermission(req, 'read:record');
    const from = queryString(req, 'from');
    const to = queryString(req, 'to');
    const issues: Issues = [];
    if (from !== undefined && !DATE_RE.test(from)) issues.push({ path: 'from', message: 'from must be a date like 2026-12-01' });
    if (to !== undefined && !DATE_RE.test(to)) issues.push({ path: 'to', message: 'to must be a date like 2026-12-31' });
    if (issues.length > 0) throw invalid(issues.map((i) => i.message).join('; '), issues);
    const formula = queryString(req, 'formula');
    const snapshot = await ctx.data.snapshot();
    const rows = (await listRecords(ctx.db, { from, to, formula })).filter((x) => dayVisible(snapshot, x.row.planDate, user.role));
    await sendCsv(res, `${from ?? 'start'}_${to ?? 'end'}`, rows.map((x) => recordJson(x.row, x.photos, x.correctedBy)));
  });

  r.get('/friction', async (req, res) => {
    const user = requirePermission(req, 'read:record');
    const mixer = queryString(req, 'mixer');
    const formula = queryString(req, 'formula');
    const date = queryString(req, 'date');
    if (date !== undefined && !DATE_RE.test(date)) throw invalid(`date must be like 2026-12-03; got "${date}"`, [{ path: 'date', message: 'not yyyy-mm-dd' }]);
    const body: FrictionResponse = await frictionResponse(ctx.db, await ctx.data.snapshot(), user.role, { mixer, formula, date });
    res.json(body);
  });

  return r;
}

/** A day's sheet with the friction proposals for its mixers and formulas (records up to that day). */
export async function sheetWithProposals(ctx: ServerContext, snapshot: Snapshot, sheet: Sheet, role: Role): Promise<Sheet> {
  const pairs = new Set(sheet.mixes.map((m) => `${m.mixer}\u0000${m.formula}`));
  const records = (await frictionRecords(ctx.db, (id) => snapshot.formulas.get(id)?.title ?? id, sheet.date)).filter((r) => pairs.has(`${r.mixer}\u0000${r.formula}`));
  if (records.length === 0) return sheet;
  const entry = snapshot.plans.find((p) => p.date === sheet.date);
  const current = (mixer: string): CurrentRise | null => {
    const m = sheet.mixers.find((x) => x.name === mixer);
    return m && Number.isFinite(m.rise) ? { rise: m.rise, riseFrom: m.riseFrom, plan: sheet.date, path: entry?.path ?? '' } : null;
  };
  void role;
  return { ...sheet, frictionProposals: frictionTable(records, current) };
}

/**
 * The food-safety file's CSV: one row per record (corrections are rows of their own), RFC 4180
 * quoting. The CSV writer is loaded on the first export rather than at start.
 */
export async function recordsCsv(records: BenchRecord[]): Promise<string> {
  const { stringify } = await import('csv-stringify/sync');
  const header = [
    'id', 'date', 'target', 'kind', 'formula', 'mixer', 'dough_temperature_c', 'water_temperature_c', 'ripe', 'note', 'initials', 'recorded_at',
    'stored_at', 'by', 'corrects', 'corrected_by', 'photos',
  ];
  // A cell a spreadsheet would run as a formula starts with a quote mark (OWASP, "CSV Injection").
  const text = (v: string) => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v);
  const rows = records.map((r) => [
    r.id, r.date, r.target, r.kind, r.formula ?? '', r.mixer ?? '', r.doughTemperature ?? '', r.waterTemperature ?? '', r.ripe === null ? '' : r.ripe ? 'yes' : 'no',
    text(r.note), text(r.initials), r.recordedAt, r.createdAt, r.by.email, r.corrects ?? '', r.correctedBy ?? '', r.photos.length,
  ]);
  return stringify([header, ...rows], { record_delimiter: '\r\n' });
}
