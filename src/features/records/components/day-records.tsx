// The bake-day page's records: fetched once for the day, handed to each mix and build card.
import type { ReactNode } from 'react';
import type { SheetBuild, SheetMix } from '#shared/sheet/types';
import { useMe } from '../../auth/api/get-me.ts';
import { useRecords } from '../api/get-records.ts';
import { targetForBuild, targetForMix } from '../targets.ts';
import type { RecordTarget } from '../api/types.ts';
import { useOutbox } from '../use-outbox.ts';
import { CardRecords } from './card-records.tsx';
import { getErrorMessage } from '../../../lib/errors.ts';

export interface DayRecords {
  forMix: (mix: SheetMix) => ReactNode;
  forBuild: (build: SheetBuild) => ReactNode;
  /** Why the records could not be fetched, or null. */
  problem: string | null;
}

export function useDayRecords(date: string): DayRecords {
  const me = useMe().data;
  const permissions = me?.permissions ?? [];
  const canRead = permissions.includes('read:record');
  const canWrite = permissions.includes('write:record');
  const canHide = permissions.includes('manage:records');
  const query = useRecords(date, { hidden: canHide, enabled: canRead });
  const { items } = useOutbox();
  const data = query.data;
  const slot = (target: RecordTarget | undefined): ReactNode => {
    if (!target || !data) return null;
    // One the server already has (its answer was lost, the tablet sends it again to be sure) shows once, as stored.
    const stored = new Set(data.records.map((r) => r.clientId));
    const pending = items.filter((p) => p.date === date && p.target === target.target && !stored.has(p.clientId));
    return <CardRecords date={date} target={target} records={data.records} pending={pending} canWrite={canWrite} canHide={canHide} />;
  };
  return {
    forMix: (mix) => slot(data && targetForMix(data.targets, mix)),
    forBuild: (build) => slot(data && targetForBuild(data.targets, build)),
    problem: canRead && query.isError ? getErrorMessage(query.error) : null,
  };
}
