// Bench records in the database: written once (a correction is a new row), hidden by an admin
// (kept, marked), read per bake day, per formula, and as the friction table's readings.
import { randomUUID } from 'node:crypto';
import { and, asc, eq, inArray, isNotNull, isNull, lte, sql } from 'drizzle-orm';
import type { BenchRecord, RecordPhoto } from '#shared/api';
import { mixFriction, type FrictionRecord, type SheetMixInputs } from '#shared/friction';
import type { RecordTarget } from '#shared/records';
import type { Database } from '../db/client.ts';
import { benchRecordsTable, recordPhotosTable } from '../db/schema.ts';
import type { PreparedPhoto } from './images.ts';
import type { PhotoStore } from './photo-store.ts';

export type RecordRow = typeof benchRecordsTable.$inferSelect;
export type PhotoRow = typeof recordPhotosTable.$inferSelect;

export interface NewRecord {
  date: string;
  target: RecordTarget;
  doughTemperature: number | null;
  waterTemperature: number | null;
  ripe: boolean | null;
  note: string;
  initials: string;
  recordedAt: Date;
  createdAt: Date;
  by: { id: number; email: string; name: string };
  clientId: string | null;
  corrects: number | null;
}

/** The same client_id was sent by another account. */
export class ClientIdTaken extends Error {}

/** A record already stored under this client_id by this account (a resend), or undefined. */
export async function recordByClientId(db: Database, clientId: string): Promise<RecordRow | undefined> {
  const rows = await db.select().from(benchRecordsTable).where(eq(benchRecordsTable.clientId, clientId));
  return rows[0];
}

function isUniqueViolation(e: unknown): boolean {
  for (let x = e as { code?: string; cause?: unknown } | undefined; x; x = x.cause as typeof x) if (x.code === '23505') return true;
  return false;
}

/**
 * Stores a record and its photos at once: all of it, or nothing. With an object store, the
 * objects are written first and removed again if the rows cannot be written. A resend (same
 * client_id, same account) returns the stored record with `replayed`.
 */
export async function insertRecord(db: Database, store: PhotoStore, input: NewRecord, photos: PreparedPhoto[]): Promise<{ row: RecordRow; replayed: boolean }> {
  const replay = async (): Promise<{ row: RecordRow; replayed: boolean } | undefined> => {
    if (!input.clientId) return undefined;
    const existing = await recordByClientId(db, input.clientId);
    if (!existing) return undefined;
    if (existing.userId !== input.by.id) throw new ClientIdTaken(`client_id ${input.clientId} belongs to another person's record`);
    return { row: existing, replayed: true };
  };
  const before = await replay();
  if (before) return before;

  const keyed = photos.map((p) => {
    const id = randomUUID();
    return { ...p, key: `records/${input.date}/${id}.jpg`, previewKey: `records/${input.date}/${id}-preview.jpg` };
  });
  const external = store.kind !== 'database';
  const written: string[] = [];
  try {
    if (external) {
      for (const p of keyed) {
        await store.put(db, p.key, p.data, p.contentType);
        written.push(p.key);
        await store.put(db, p.previewKey, p.preview, p.contentType);
        written.push(p.previewKey);
      }
    }
    const row = await db.transaction(async (tx) => {
      const t = input.target;
      const [rec] = await tx
        .insert(benchRecordsTable)
        .values({
          planDate: input.date,
          target: t.target,
          kind: t.kind,
          formulaId: t.formula,
          formulas: t.formulas,
          mixer: t.mixer,
          label: t.label,
          doughTemperature: input.doughTemperature,
          waterTemperature: input.waterTemperature,
          ripe: input.ripe,
          note: input.note,
          initials: input.initials,
          recordedAt: input.recordedAt,
          createdAt: input.createdAt,
          userId: input.by.id,
          byEmail: input.by.email,
          byName: input.by.name,
          clientId: input.clientId,
          corrects: input.corrects,
          sheetInputs: t.inputs,
        })
        .returning();
      for (const [i, p] of keyed.entries()) {
        if (!external) {
          await store.put(tx, p.key, p.data, p.contentType);
          await store.put(tx, p.previewKey, p.preview, p.contentType);
        }
        await tx.insert(recordPhotosTable).values({
          recordId: rec.id,
          n: i + 1,
          contentType: p.contentType,
          width: p.width,
          height: p.height,
          bytes: p.data.length,
          previewBytes: p.preview.length,
          storage: store.kind,
          key: p.key,
          previewKey: p.previewKey,
          createdAt: input.createdAt,
        });
      }
      return rec;
    });
    return { row, replayed: false };
  } catch (e) {
    if (written.length > 0) await store.remove(db, written).catch(() => {});
    // Two sends of one record at the same moment: the second finds the first.
    if (isUniqueViolation(e)) {
      const after = await replay();
      if (after) return after;
    }
    throw e;
  }
}

export async function findRecord(db: Database, id: number): Promise<RecordRow | undefined> {
  const rows = await db.select().from(benchRecordsTable).where(eq(benchRecordsTable.id, id));
  return rows[0];
}

export async function photosOf(db: Database, ids: number[]): Promise<Map<number, PhotoRow[]>> {
  const out = new Map<number, PhotoRow[]>();
  if (ids.length === 0) return out;
  const rows = await db.select().from(recordPhotosTable).where(inArray(recordPhotosTable.recordId, ids)).orderBy(asc(recordPhotosTable.n));
  for (const r of rows) out.set(r.recordId, [...(out.get(r.recordId) ?? []), r]);
  return out;
}

/** For each record id, the newest row that corrects it (hidden corrections not counted). */
export async function correctionsOf(db: Database, ids: number[]): Promise<Map<number, number>> {
  const out = new Map<number, number>();
  if (ids.length === 0) return out;
  const rows = await db
    .select({ id: benchRecordsTable.id, corrects: benchRecordsTable.corrects })
    .from(benchRecordsTable)
    .where(and(inArray(benchRecordsTable.corrects, ids), isNull(benchRecordsTable.hiddenAt)))
    .orderBy(asc(benchRecordsTable.id));
  for (const r of rows) if (r.corrects !== null) out.set(r.corrects, r.id);
  return out;
}

export interface ListFilter {
  date?: string;
  from?: string;
  to?: string;
  formula?: string;
  includeHidden?: boolean;
}

/** Records oldest first (by when measured), with their photos and corrections. */
export async function listRecords(db: Database, f: ListFilter): Promise<{ row: RecordRow; photos: PhotoRow[]; correctedBy: number | null }[]> {
  const where = and(
    f.date ? eq(benchRecordsTable.planDate, f.date) : undefined,
    f.from ? sql`${benchRecordsTable.planDate} >= ${f.from}` : undefined,
    f.to ? sql`${benchRecordsTable.planDate} <= ${f.to}` : undefined,
    f.formula ? sql`${benchRecordsTable.formulas} @> ${JSON.stringify([f.formula])}::jsonb` : undefined,
    f.includeHidden ? undefined : isNull(benchRecordsTable.hiddenAt),
  );
  const rows = await db.select().from(benchRecordsTable).where(where).orderBy(asc(benchRecordsTable.planDate), asc(benchRecordsTable.recordedAt), asc(benchRecordsTable.id));
  const ids = rows.map((r) => r.id);
  const [photos, corrections] = await Promise.all([photosOf(db, ids), correctionsOf(db, ids)]);
  return rows.map((row) => ({ row, photos: photos.get(row.id) ?? [], correctedBy: corrections.get(row.id) ?? null }));
}

export async function hideRecord(db: Database, id: number, by: string, reason: string, at: Date): Promise<RecordRow | undefined> {
  const rows = await db
    .update(benchRecordsTable)
    .set({ hiddenAt: at, hiddenBy: by, hiddenReason: reason })
    .where(and(eq(benchRecordsTable.id, id), isNull(benchRecordsTable.hiddenAt)))
    .returning();
  return rows[0];
}

/** The record as the API sends it. */
export function recordJson(row: RecordRow, photos: PhotoRow[], correctedBy: number | null): BenchRecord {
  const inputs = row.sheetInputs as SheetMixInputs | null;
  const photo = (p: PhotoRow): RecordPhoto => ({
    n: p.n,
    contentType: p.contentType,
    width: p.width,
    height: p.height,
    bytes: p.bytes,
    url: `/api/records/${row.id}/photos/${p.n}`,
    previewUrl: `/api/records/${row.id}/photos/${p.n}?size=preview`,
  });
  return {
    id: row.id,
    date: row.planDate,
    target: row.target,
    kind: row.kind as BenchRecord['kind'],
    label: row.label,
    formula: row.formulaId,
    mixer: row.mixer,
    doughTemperature: row.doughTemperature,
    waterTemperature: row.waterTemperature,
    ripe: row.ripe,
    note: row.note,
    initials: row.initials,
    recordedAt: row.recordedAt.toISOString(),
    createdAt: row.createdAt.toISOString(),
    by: { id: row.userId, name: row.byName, email: row.byEmail },
    clientId: row.clientId,
    corrects: row.corrects,
    correctedBy,
    hidden: row.hiddenAt ? { by: row.hiddenBy ?? '', at: row.hiddenAt.toISOString(), reason: row.hiddenReason ?? '' } : null,
    photos: photos.map(photo),
    friction: row.kind === 'mix' && inputs && row.doughTemperature !== null ? mixFriction(inputs, { doughTemperature: row.doughTemperature, waterTemperature: row.waterTemperature }) : null,
  };
}

/**
 * The mix records the friction table counts: not hidden, not corrected by a later row, with a
 * dough temperature and the sheet's inputs; bake days up to `upTo` when given.
 */
export async function frictionRecords(db: Database, titles: (formula: string) => string, upTo?: string): Promise<FrictionRecord[]> {
  const rows = await db
    .select()
    .from(benchRecordsTable)
    .where(
      and(
        eq(benchRecordsTable.kind, 'mix'),
        isNull(benchRecordsTable.hiddenAt),
        isNotNull(benchRecordsTable.doughTemperature),
        isNotNull(benchRecordsTable.sheetInputs),
        upTo ? lte(benchRecordsTable.planDate, upTo) : undefined,
      ),
    )
    .orderBy(asc(benchRecordsTable.planDate), asc(benchRecordsTable.id));
  const corrected = await correctionsOf(db, rows.map((r) => r.id));
  return rows
    .filter((r) => !corrected.has(r.id) && r.mixer && r.formulaId)
    .map((r) => ({
      recordId: r.id,
      date: r.planDate,
      mixer: r.mixer!,
      formula: r.formulaId!,
      title: titles(r.formulaId!),
      inputs: r.sheetInputs as SheetMixInputs,
      doughTemperature: r.doughTemperature!,
      waterTemperature: r.waterTemperature,
    }));
}
