// Content stored before migration 0001_content-in-file-order was `jsonb`, which reorders keys
// (shortest first), so a formula's ingredients lost the order the baker wrote them in. Every row
// keeps its file's text, so that order comes back from it, once, right after the migration.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq, sql } from 'drizzle-orm';
import { parseYamlText } from '#shared/parse';
import type { Database } from './client.ts';
import { formulaRevisionsTable, formulasTable, plansTable } from './schema.ts';

const TAG = '0001_content-in-file-order';

/** When the file-order migration was made (its `when` in the journal), or null if the folder lacks it. */
export function fileOrderMigrationTime(folder: string): number | null {
  const journal = JSON.parse(readFileSync(join(folder, 'meta', '_journal.json'), 'utf8')) as { entries: { tag: string; when: number }[] };
  return journal.entries.find((e) => e.tag === TAG)?.when ?? null;
}

/** The time of the last migration applied to this database (0 for a new one). */
export async function lastMigrationTime(db: Database): Promise<number> {
  // Both drivers answer `execute` with `{ rows }`.
  const rows = async <T>(query: ReturnType<typeof sql>) => ((await db.execute(query)) as unknown as { rows: T[] }).rows;
  const [found] = await rows<{ t: string | null }>(sql`select to_regclass('drizzle.__drizzle_migrations')::text as t`);
  if (!found?.t) return 0;
  const [last] = await rows<{ at: string | null }>(sql`select max(created_at)::text as at from drizzle.__drizzle_migrations`);
  return Number(last?.at ?? 0);
}

/** Re-reads each stored row's content from its own text, keeping the file's order. */
export async function restoreFileOrder(db: Database): Promise<void> {
  const reread = (text: string): unknown => {
    const y = parseYamlText(text, 'stored text');
    return y.ok ? y.data : undefined;
  };
  await db.transaction(async (tx) => {
    for (const r of await tx.select({ id: formulaRevisionsTable.id, source: formulaRevisionsTable.source }).from(formulaRevisionsTable)) {
      const content = reread(r.source);
      if (content !== undefined) await tx.update(formulaRevisionsTable).set({ content }).where(eq(formulaRevisionsTable.id, r.id));
    }
    for (const r of await tx.select({ id: formulasTable.id, source: formulasTable.source }).from(formulasTable)) {
      const content = reread(r.source);
      if (content !== undefined) await tx.update(formulasTable).set({ content }).where(eq(formulasTable.id, r.id));
    }
    for (const r of await tx.select({ date: plansTable.date, source: plansTable.source }).from(plansTable)) {
      const content = reread(r.source);
      if (content !== undefined) await tx.update(plansTable).set({ content }).where(eq(plansTable.date, r.date));
    }
  });
}
