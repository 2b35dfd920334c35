// The database schema: one module, `xxxTable` constants. Migrations are generated from it into
// drizzle/ (`npm run db:generate`) and committed; the migrator applies them at start.
// The YAML files stay the source of truth: these tables are what the viewer reads.
import { sql } from 'drizzle-orm';
import { boolean, customType, doublePrecision, index, integer, json, jsonb, pgTable, serial, text, timestamp, uniqueIndex, type AnyPgColumn } from 'drizzle-orm/pg-core';

/** The current content of each formula, with the figures of its reference batch. */
export const formulasTable = pgTable(
  'formulas',
  {
    id: text('id').primaryKey(),
    title: text('title').notNull(),
    status: text('status').notNull(), // draft | active | retired
    category: text('category').notNull(),
    tags: jsonb('tags').$type<string[]>().notNull().default(sql`'[]'::jsonb`),
    /** The file as parsed (raw YAML data). `json`, not `jsonb`: jsonb reorders keys, and the file's order is the order of the ingredients. */
    content: json('content').notNull(),
    /** The YAML text as loaded. */
    source: text('source').notNull(),
    contentHash: text('content_hash').notNull(),
    /** Figures of the reference batch (hydration, pre-fermented flour, mixed dough ...). */
    figures: jsonb('figures').notNull(),
    revision: integer('revision').notNull(),
    path: text('path').notNull(),
    /** Set when the file disappeared from the folder: kept, shown as retired. */
    removedAt: timestamp('removed_at', { withTimezone: true }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('formulas_status_idx').on(t.status), index('formulas_category_idx').on(t.category)],
);

/** Every loaded version of every formula. */
export const formulaRevisionsTable = pgTable(
  'formula_revisions',
  {
    id: serial('id').primaryKey(),
    formulaId: text('formula_id').notNull(),
    revision: integer('revision').notNull(),
    contentHash: text('content_hash').notNull(),
    /** As in formulas.content: `json` keeps the file's order. */
    content: json('content').notNull(),
    source: text('source').notNull(),
    figures: jsonb('figures').notNull(),
    gitCommit: text('git_commit'),
    gitAuthor: text('git_author'),
    /** The commit's author date and subject line, when the file was committed as loaded. */
    gitDate: timestamp('git_date', { withTimezone: true }),
    gitMessage: text('git_message'),
    loadId: integer('load_id').notNull(),
    loadedAt: timestamp('loaded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('formula_revisions_formula_revision_idx').on(t.formulaId, t.revision)],
);

/** The ingredient catalog, one row per ingredient. */
export const catalogTable = pgTable('catalog', {
  name: text('name').primaryKey(),
  content: jsonb('content').notNull(),
  contentHash: text('content_hash').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** Production plans, one per date. */
export const plansTable = pgTable('plans', {
  date: text('date').primaryKey(), // yyyy-mm-dd
  /** `json` keeps the file's order. */
  content: json('content').notNull(),
  source: text('source').notNull(),
  contentHash: text('content_hash').notNull(),
  path: text('path').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

export const usersTable = pgTable('users', {
  id: serial('id').primaryKey(),
  email: text('email').notNull().unique(),
  name: text('name').notNull().default(''),
  role: text('role').notNull(), // admin | author | reviewer | bench
  /** Units the viewer and its prints show: metric | us (shared/units.ts UnitSystem). */
  unitSystem: text('unit_system').notNull().default('metric'),
  passwordHash: text('password_hash').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  passwordChangedAt: timestamp('password_changed_at', { withTimezone: true }).notNull().defaultNow(),
});

/** Signed-in sessions; the cookie holds a random token, the table its SHA-256. */
export const sessionsTable = pgTable(
  'sessions',
  {
    tokenHash: text('token_hash').primaryKey(),
    userId: integer('user_id')
      .notNull()
      .references(() => usersTable.id, { onDelete: 'cascade' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

/** One-time, expiring password-reset tokens (stored hashed). */
export const passwordResetsTable = pgTable('password_resets', {
  tokenHash: text('token_hash').primaryKey(),
  userId: integer('user_id')
    .notNull()
    .references(() => usersTable.id, { onDelete: 'cascade' }),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true }),
});

/** A log of loads: who, when, from which commit, what changed. */
export const loadsTable = pgTable('loads', {
  id: serial('id').primaryKey(),
  startedAt: timestamp('started_at', { withTimezone: true }).notNull().defaultNow(),
  finishedAt: timestamp('finished_at', { withTimezone: true }),
  by: text('by').notNull().default(''),
  gitCommit: text('git_commit'),
  files: integer('files').notNull().default(0),
  summary: jsonb('summary').notNull().default(sql`'{}'::jsonb`),
});

/**
 * Sign-in failures and reset requests, counted per key (an account, an address, or both) in a
 * sliding window. In the database so every server sharing it counts the same tries.
 */
export const limitHitsTable = pgTable(
  'limit_hits',
  {
    id: serial('id').primaryKey(),
    key: text('key').notNull(),
    at: timestamp('at', { withTimezone: true }).notNull(),
  },
  (t) => [index('limit_hits_key_at_idx').on(t.key, t.at)],
);

/**
 * Outgoing mail, written first and sent after (by whichever server gets to it), retried with a
 * growing wait. The text of a sent message is blanked: it may hold a reset link.
 */
export const mailOutboxTable = pgTable(
  'mail_outbox',
  {
    id: serial('id').primaryKey(),
    to: text('to').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull(),
    attempts: integer('attempts').notNull().default(0),
    nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true }).notNull(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    /** Set when the last try failed and no more will be made. */
    failedAt: timestamp('failed_at', { withTimezone: true }),
    lastError: text('last_error'),
  },
  (t) => [index('mail_outbox_due_idx').on(t.sentAt, t.failedAt, t.nextAttemptAt)],
);

/** Who changed which account, and how (from the viewer or `panform user`). */
export const auditTable = pgTable(
  'audit_log',
  {
    id: serial('id').primaryKey(),
    at: timestamp('at', { withTimezone: true }).notNull(),
    /** Who did it: an account's e-mail, or `panform user (<system user>)`. */
    actor: text('actor').notNull(),
    action: text('action').notNull(), // account.add | account.role | account.remove | account.reset-link | account.password
    /** The account changed (its e-mail at the time). */
    target: text('target').notNull(),
    detail: text('detail').notNull().default(''),
  },
  (t) => [index('audit_log_at_idx').on(t.at)],
);

/** Raw bytes (PostgreSQL `bytea`): node-postgres gives a Buffer, PGlite a Uint8Array; both become a Buffer. */
const bytea = customType<{ data: Buffer; driverData: Buffer | Uint8Array }>({
  dataType: () => 'bytea',
  fromDriver: (v) => (Buffer.isBuffer(v) ? v : Buffer.from(v.buffer, v.byteOffset, v.byteLength)),
});

/**
 * What the bench measured on a bake day: one row per mix or build recorded. Append-only: a
 * correction is a new row whose `corrects` names the row it corrects; an admin hides a wrong row
 * (`hidden_*` set), never deletes it. Who wrote it is copied in (`by_*`): the food-safety file
 * keeps its rows when an account goes.
 */
export const benchRecordsTable = pgTable(
  'bench_records',
  {
    id: serial('id').primaryKey(),
    planDate: text('plan_date').notNull(), // yyyy-mm-dd
    /** `harbour-ciabatta/1` (a mix) or a build's name (`poolish`, `levain/2`). */
    target: text('target').notNull(),
    kind: text('kind').notNull(), // mix | build
    /** The mix's formula; for a build, the first formula that uses it. */
    formulaId: text('formula_id'),
    /** Formulas a build goes into (a mix: its own). */
    formulas: jsonb('formulas').$type<string[]>().notNull().default(sql`'[]'::jsonb`),
    mixer: text('mixer'),
    label: text('label').notNull(),
    /** °C */
    doughTemperature: doublePrecision('dough_temperature'),
    /** °C, the water poured (main water, bassinage apart). */
    waterTemperature: doublePrecision('water_temperature'),
    ripe: boolean('ripe'),
    note: text('note').notNull().default(''),
    initials: text('initials').notNull(),
    /** When it was measured (the tablet's clock). */
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull(),
    /** When the server stored it. */
    createdAt: timestamp('created_at', { withTimezone: true }).notNull(),
    userId: integer('user_id'),
    byEmail: text('by_email').notNull(),
    byName: text('by_name').notNull().default(''),
    /** The client's idempotency key: sent twice, stored once. */
    clientId: text('client_id'),
    corrects: integer('corrects').references((): AnyPgColumn => benchRecordsTable.id),
    /** What the sheet used for this mix (shared/friction.ts SheetMixInputs), kept as it was that day. */
    sheetInputs: json('sheet_inputs'),
    hiddenAt: timestamp('hidden_at', { withTimezone: true }),
    hiddenBy: text('hidden_by'),
    hiddenReason: text('hidden_reason'),
  },
  (t) => [
    index('bench_records_date_idx').on(t.planDate),
    index('bench_records_formula_idx').on(t.formulaId),
    index('bench_records_corrects_idx').on(t.corrects),
    uniqueIndex('bench_records_client_id_idx').on(t.clientId),
  ],
);

/** The photos of a record: where their bytes are (photo_blobs or the object store) and their sizes. */
export const recordPhotosTable = pgTable(
  'record_photos',
  {
    id: serial('id').primaryKey(),
    recordId: integer('record_id')
      .notNull()
      .references(() => benchRecordsTable.id),
    /** 1-based, in the order sent. */
    n: integer('n').notNull(),
    contentType: text('content_type').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    bytes: integer('bytes').notNull(),
    previewBytes: integer('preview_bytes').notNull(),
    /** database | s3 */
    storage: text('storage').notNull(),
    key: text('key').notNull(),
    previewKey: text('preview_key').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull(),
  },
  (t) => [uniqueIndex('record_photos_record_n_idx').on(t.recordId, t.n)],
);

/** Photo bytes when they are kept in the database (the default store). */
export const photoBlobsTable = pgTable('photo_blobs', {
  key: text('key').primaryKey(),
  data: bytea('data').notNull(),
});
