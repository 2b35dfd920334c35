import type { RevisionSummary } from '#shared/api';
import { CommitNote } from './commit-note.tsx';
import { percent, shortDateTime } from '../../../lib/format.ts';
import { useUnits } from '../../../lib/units.ts';

/** Every loaded revision of one formula with its key figures, newest first. */
export function RevisionList({ revisions, from, to }: { revisions: RevisionSummary[]; from: number; to: number }) {
  const { weight } = useUnits();
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-lg">
        <thead>
          <tr className="border-b-2 border-ink/70 text-left text-sm uppercase tracking-wider text-muted">
            <th scope="col" className="py-1 pr-3">Revision</th>
            <th scope="col" className="py-1 pr-3">Loaded</th>
            <th scope="col" className="figure py-1 pr-3 text-right">Hydration</th>
            <th scope="col" className="figure py-1 pr-3 text-right">Pre-fermented</th>
            <th scope="col" className="figure py-1 pr-3 text-right">Written batch</th>
          </tr>
        </thead>
        <tbody>
          {[...revisions]
            .sort((a, b) => b.revision - a.revision)
            .map((r) => (
              <tr key={r.revision} className={`border-b border-dashed border-line ${r.revision === from || r.revision === to ? 'bg-crumb' : ''}`}>
                <th scope="row" className="figure py-1.5 pr-3 text-left font-bold">
                  r{r.revision}
                  {r.revision === from && <span className="ml-2 font-sans text-sm font-normal text-muted">before</span>}
                  {r.revision === to && <span className="ml-2 font-sans text-sm font-normal text-muted">after</span>}
                </th>
                <td className="py-1.5 pr-3">
                  {shortDateTime(r.loadedAt)}
                  <CommitNote commit={r} />
                </td>
                <td className="figure py-1.5 pr-3 text-right">{percent(r.figures.hydration)}</td>
                <td className="figure py-1.5 pr-3 text-right">{percent(r.figures.prefermentedFlour)}</td>
                <td className="figure py-1.5 pr-3 text-right">{weight(r.figures.mixedDough)}</td>
              </tr>
            ))}
        </tbody>
      </table>
    </div>
  );
}
