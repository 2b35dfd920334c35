// The database schema: one module, `xxxTable` constants. Migrations are generated from it into
// drizzle/ (`npm run db:generate`) and committed; the migrator applies them at start.
// The YAML files stay the source of truth: these tables are what the viewer reads.
import { sql } from 'drizzle-orm';
import { index, integer, json, jsonb, pgTable, serial, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';

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
