// Under each mix and build on the bake-day page: what the bench recorded for it, what still waits
// on this tablet to be sent, and the big button to record it.
import { useEffect, useMemo, useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { Badge } from '../../../components/panel.tsx';
import { getErrorMessage } from '../../../lib/errors.ts';
import { useUnits } from '../../../lib/units.ts';
import { useHideRecord } from '../api/hide-record.ts';
import type { BenchRecord, RecordTarget } from '../api/types.ts';
import { getDeviceOutbox, timeOfDay, type PendingRecord } from '../outbox.ts';
import { RecordDialog } from './record-dialog.tsx';

export interface CardRecordsProps {
  date: string;
  target: RecordTarget;
  /** The day's records (all targets: a correction is found by its id). */
  records: readonly BenchRecord[];
  /** What waits on this device for this target. */
  pending: readonly PendingRecord[];
  canWrite: boolean;
  canHide: boolean;
}

const clock = (iso: string) => timeOfDay(new Date(iso));

export function CardRecords({ date, target, records, pending, canWrite, canHide }: CardRecordsProps) {
  const [open, setOpen] = useState<{ correcting?: BenchRecord } | null>(null);
  const byId = useMemo(() => new Map(records.map((r) => [r.id, r])), [records]);
  const mine = records.filter((r) => r.target === target.target);
  const isMix = target.kind === 'mix';
  const count = mine.filter((r) => r.correctedBy === null && r.hidden === null).length + pending.length;
  return (
    <section className="mt-3 border-t-2 border-dashed border-line pt-2 print:hidden" aria-label={`Records: ${target.label}`} data-testid="card-records" data-target={target.target}>
      {(mine.length > 0 || pending.length > 0) && (
        <ol className="mb-2 space-y-2">
          {mine.map((r) => (
            <StoredEntry key={r.id} record={r} byId={byId} canWrite={canWrite} canHide={canHide} date={date} onCorrect={() => setOpen({ correcting: r })} />
          ))}
          {pending.map((p) => (
            <PendingEntry key={p.clientId} pending={p} />
          ))}
        </ol>
      )}
      {canWrite && (
        <Button tone={count === 0 ? 'primary' : 'plain'} className="w-full text-lg" onClick={() => setOpen({})} data-testid="record-button">
          {count === 0 ? (isMix ? 'Record this mix' : 'Record this build') : 'Record again'}
        </Button>
      )}
      {open && <RecordDialog date={date} target={target} correcting={open.correcting} onClose={() => setOpen(null)} />}
    </section>
  );
}

function Figures({ kind, dough, water, ripe }: { kind: 'mix' | 'build'; dough: number | null; water: number | null; ripe: boolean | null }) {
  const { temperature } = useUnits();
  const parts: string[] = [];
  if (dough !== null) parts.push(`${kind === 'mix' ? 'dough' : 'build'} ${temperature(dough)}`);
  if (water !== null) parts.push(`water ${temperature(water)}`);
  if (ripe !== null) parts.push(ripe ? 'ripe' : 'not ripe');
  return <span className="figure font-bold">{parts.join(' · ') || 'no temperature'}</span>;
}

function StoredEntry({ record: r, byId, canWrite, canHide, date, onCorrect }: { record: BenchRecord; byId: Map<number, BenchRecord>; canWrite: boolean; canHide: boolean; date: string; onCorrect: () => void }) {
  const correction = r.correctedBy !== null ? byId.get(r.correctedBy) : undefined;
  const corrected = r.correctedBy !== null;
  const hidden = r.hidden !== null;
  const faded = corrected || hidden;
  return (
    <li
      className={`rounded-xl border-2 px-3 py-2 ${hidden ? 'border-dashed border-line bg-sunk' : 'border-line bg-card'}`}
      data-testid="record-entry"
      data-record={r.id}
      data-state={hidden ? 'hidden' : corrected ? 'corrected' : 'stored'}
    >
      <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <span className="figure text-lg font-bold">{clock(r.recordedAt)}</span>
        <span className={faded ? 'text-muted line-through decoration-2' : ''}>
          <Figures kind={r.kind} dough={r.doughTemperature} water={r.waterTemperature} ripe={r.ripe} />
        </span>
        <Initials initials={r.initials} name={r.by.name} />
        {r.corrects !== null && <Badge tone="plain">correction of {byId.has(r.corrects) ? clock(byId.get(r.corrects)!.recordedAt) : `#${r.corrects}`}</Badge>}
      </div>
      {r.note && <p className={`mt-0.5 ${faded ? 'text-muted' : ''}`}>{r.note}</p>}
      {corrected && (
        <p className="mt-0.5 text-sm font-semibold text-honey" data-testid="corrected-by">
          corrected by {correction ? `${correction.initials} at ${clock(correction.createdAt)}` : 'a later entry'}
        </p>
      )}
      {r.hidden && (
        <p className="mt-0.5 text-sm font-semibold text-ember" data-testid="hidden-mark">
          hidden by {r.hidden.by} at {clock(r.hidden.at)}
          {r.hidden.reason ? `: ${r.hidden.reason}` : ''} (kept, left out of the friction and the CSV)
        </p>
      )}
      {r.photos.length > 0 && (
        <div className="mt-2 flex flex-wrap gap-2">
          {r.photos.map((p) => (
            <a key={p.n} href={p.url} target="_blank" rel="noreferrer" className="block rounded-xl focus-visible:outline-3">
              <img src={p.previewUrl} alt={`Photo ${p.n} of the ${r.kind} at ${clock(r.recordedAt)}`} loading="lazy" className="h-24 w-24 rounded-xl border-2 border-line object-cover" data-testid="record-photo-preview" />
            </a>
          ))}
        </div>
      )}
      {!faded && (canWrite || canHide) && (
        <div className="mt-2 flex flex-wrap gap-2">
          {canWrite && (
            <Button tone="plain" onClick={onCorrect}>
              Correct
            </Button>
          )}
          {canHide && <HideControl record={r} date={date} />}
        </div>
      )}
    </li>
  );
}

function HideControl({ record, date }: { record: BenchRecord; date: string }) {
  const [asking, setAsking] = useState(false);
  const [reason, setReason] = useState('');
  const hide = useHideRecord(date);
  if (!asking)
    return (
      <Button tone="plain" onClick={() => setAsking(true)}>
        Hide…
      </Button>
    );
  return (
    <form
      className="flex flex-wrap items-center gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        hide.mutate({ id: record.id, reason: reason.trim() });
      }}
    >
      <label className="sr-only" htmlFor={`hide-${record.id}`}>
        Why hide it
      </label>
      <input
        id={`hide-${record.id}`}
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        placeholder="why (wrong dough…)"
        className="min-h-12 rounded-xl border-2 border-line bg-card px-3 text-lg"
      />
      <button type="submit" className="min-h-12 rounded-xl bg-ember px-4 font-semibold text-on-crust" disabled={hide.isPending}>
        Hide this record
      </button>
      <Button tone="quiet" onClick={() => setAsking(false)}>
        Keep it
      </Button>
      {hide.isError && <span className="font-semibold text-ember">{getErrorMessage(hide.error)}</span>}
    </form>
  );
}

function PendingEntry({ pending: p }: { pending: PendingRecord }) {
  const [urls, setUrls] = useState<string[]>([]);
  useEffect(() => {
    const made = p.photos.map((ph) => URL.createObjectURL(ph.blob));
    setUrls(made);
    return () => made.forEach((u) => URL.revokeObjectURL(u));
  }, [p.photos]);
  const refused = p.refused !== null;
  return (
    <li
      className={`rounded-xl border-2 border-dashed px-3 py-2 ${refused ? 'border-ember bg-ember-soft' : 'border-honey bg-honey-soft'}`}
      data-testid="record-entry"
      data-state={refused ? 'refused' : 'waiting'}
      data-client-id={p.clientId}
    >
      <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <span className="figure text-lg font-bold">{clock(p.fields.recordedAt)}</span>
        <Figures kind={p.fields.kind} dough={p.fields.doughTemperature} water={p.fields.waterTemperature} ripe={p.fields.ripe} />
        <Initials initials={p.fields.initials} />
        <span className={`ml-auto rounded-full px-3 py-0.5 text-sm font-bold ${refused ? 'bg-ember text-on-crust' : 'bg-honey text-on-crust'}`} data-testid="waiting-badge">
          {refused ? 'Not sent' : 'Waiting to send'}
        </span>
      </div>
      {p.fields.note && <p className="mt-0.5">{p.fields.note}</p>}
      {urls.length > 0 && (
        <div className="mt-2 flex flex-wrap gap-2">
          {urls.map((u, i) => (
            <img key={u} src={u} alt={`Photo ${i + 1}, waiting to send`} className="h-24 w-24 rounded-xl border-2 border-line object-cover" />
          ))}
        </div>
      )}
      {refused ? (
        <div className="mt-2 space-y-2">
          <p className="font-semibold text-ember">The server would not take it: {p.refused}</p>
          <Button tone="plain" onClick={() => void getDeviceOutbox().discard(p.clientId)}>
            Discard it
          </Button>
        </div>
      ) : (
        <p className="mt-0.5 text-sm text-muted">Kept on this tablet; it is sent when the connection is back.</p>
      )}
    </li>
  );
}

function Initials({ initials, name }: { initials: string; name?: string }) {
  return (
    <span className="rounded-full bg-sunk px-2 text-base font-bold" title={name ? `${name} (${initials})` : initials} aria-label={`by ${initials}`}>
      {initials}
    </span>
  );
}
