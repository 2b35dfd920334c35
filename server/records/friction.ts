// The friction table from the stored records and the loaded plans: what GET /api/friction, the
// local channel and `panform friction` answer, the same way (shared/friction.ts does the sums).
import type { FrictionResponse } from '#shared/api';
import { FRICTION_MINIMUM, frictionTable, OUTLIER_MADS, type CurrentRise } from '#shared/friction';
import { canSeeFormulaStatus, type Role } from '#shared/permissions';
import type { Database } from '../db/client.ts';
import type { Snapshot } from '../routes/data.ts';
import { planVisible } from '../routes/plans.ts';
import { frictionRecords } from './store.ts';

/** The rule the friction table follows, in words. */
export const FRICTION_RULE = `median of each mix's rise once ${FRICTION_MINIMUM} mixes are kept; a mix more than ${OUTLIER_MADS} scaled MADs from the median is left out and shown`;

export interface FrictionQuery {
  mixer?: string;
  formula?: string;
  /** The plan whose mixers give the current values; default the newest plan with that mixer. */
  date?: string;
}

/** Where the plan files give a mixer's rise: the given day's plan, else the newest plan with that mixer (that the role may see). */
export function currentRiseOf(snapshot: Snapshot, role: Role, date?: string) {
  return (mixer: string): CurrentRise | null => {
    for (const entry of snapshot.plans) {
      if (date && entry.date !== date) continue;
      if (!entry.plan || !planVisible(snapshot, entry, role)) continue;
      const m = entry.plan.mixers.find((x) => x.name === mixer);
      if (m && Number.isFinite(m.rise)) return { rise: m.rise, riseFrom: m.riseFrom, plan: entry.date, path: entry.path };
    }
    return null;
  };
}

/** The friction table as a role may see it: formulas it may open, plans it may see. */
export async function frictionResponse(db: Database, snapshot: Snapshot, role: Role, q: FrictionQuery = {}): Promise<FrictionResponse> {
  const titles = (id: string) => snapshot.formulas.get(id)?.title ?? id;
  const records = (await frictionRecords(db, titles)).filter((rec) => {
    const f = snapshot.formulas.get(rec.formula);
    return (!f || canSeeFormulaStatus(role, f.status)) && (!q.mixer || rec.mixer === q.mixer) && (!q.formula || rec.formula === q.formula);
  });
  return { minimum: FRICTION_MINIMUM, rule: FRICTION_RULE, proposals: frictionTable(records, currentRiseOf(snapshot, role, q.date)) };
}
