// The count of records waiting on this tablet, with why they wait and a way to send them now.
import { Button } from '../../../components/button.tsx';
import { getDeviceOutbox } from '../outbox.ts';
import { useOutbox } from '../use-outbox.ts';

export function OutboxStatus({ date }: { date?: string }) {
  const { items, sending, problem } = useOutbox();
  const waiting = items.filter((p) => p.refused === null);
  const refused = items.filter((p) => p.refused !== null);
  if (items.length === 0) return null;
  const here = date ? items.filter((p) => p.date === date).length : items.length;
  const elsewhere = items.length - here;
  return (
    <div role="status" className="flex flex-wrap items-center gap-3 rounded-xl border-2 border-dashed border-honey bg-honey-soft px-4 py-2 print:hidden" data-testid="outbox-status">
      <p className="text-lg">
        <strong className="figure" data-testid="outbox-count">
          {waiting.length}
        </strong>{' '}
        {waiting.length === 1 ? 'record' : 'records'} waiting to send
        {refused.length > 0 && <>, {refused.length} not taken by the server</>}
        {elsewhere > 0 && date && <> ({elsewhere} for another bake day)</>}
        {sending ? <span className="text-muted"> · sending…</span> : problem ? <span className="text-muted"> · {problem}</span> : null}
      </p>
      {waiting.length > 0 && !sending && (
        <Button tone="plain" className="ml-auto" onClick={() => void getDeviceOutbox().flush()}>
          Send now
        </Button>
      )}
    </div>
  );
}
