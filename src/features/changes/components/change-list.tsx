import { Link } from 'react-router';
import type { ChangeListResponse } from '#shared/api';
import { percent, shortDateTime } from '../../../lib/format.ts';
import { CommitNote } from './commit-note.tsx';

type Change = ChangeListResponse['changes'][number];

/** The newest revisions, newest first, one row each. */
export function ChangeList({ changes, hrefOf }: { changes: Change[]; hrefOf: (c: Change) => string }) {
  if (changes.length === 0) {
    return <p className="rounded-2xl border-2 border-dashed border-line p-6 text-center text-lg text-muted">No changes loaded yet.</p>;
  }
  return (
    <ol aria-label="Latest changes" className="divide-y divide-dashed divide-line rounded-2xl border border-line bg-card">
      {changes.map((c) => (
        <li key={`${c.formula}-${c.revision}`}>
          <Link to={hrefOf(c)} data-change={`${c.formula}@${c.revision}`} className="flex flex-wrap items-center gap-x-4 gap-y-1 px-4 py-3 hover:bg-sunk">
            <span className="figure grid h-12 min-w-12 place-items-center rounded-xl bg-crumb px-2 font-bold text-crust">r{c.revision}</span>
            <span className="min-w-0 flex-1">
              <span className="block text-xl font-semibold">{c.title}</span>
              <span className="block text-muted">
                {c.revision === 1 ? 'first version' : `changed since r${c.revision - 1}`} · loaded {shortDateTime(c.loadedAt)}
              </span>
              <CommitNote commit={c} />
            </span>
            <span className="figure text-right text-muted">
              {percent(c.figures.hydration)} water · {percent(c.figures.prefermentedFlour)} pre-fermented
            </span>
          </Link>
        </li>
      ))}
    </ol>
  );
}
