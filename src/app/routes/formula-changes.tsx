import { useParams, useSearchParams } from 'react-router';
import type { RevisionSummary } from '#shared/api';
import { ButtonLink } from '../../components/button.tsx';
import { PanelBoundary } from '../../components/error-boundary.tsx';
import { PageHeading, Panel } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { useRevisionDiff } from '../../features/changes/api/get-revision-diff.ts';
import { useRevisions } from '../../features/changes/api/get-revisions.ts';
import { CommitNote } from '../../features/changes/components/commit-note.tsx';
import { RevisionDiffView } from '../../features/changes/components/revision-diff.tsx';
import { RevisionList } from '../../features/changes/components/revision-list.tsx';
import { RevisionPicker } from '../../features/changes/components/revision-picker.tsx';
import { useFormula } from '../../features/formulas/api/get-formula.ts';
import { paths } from '../paths.ts';

export default function FormulaChangesRoute() {
  const { id = '' } = useParams();
  const query = useRevisions(id);
  // The title is a nicety: the page works with the id alone while it loads or if it fails.
  const title = useFormula(id).data?.formula.title ?? id;
  return (
    <>
      <PageHeading title={title} kicker="Changes to one formula">
        <ButtonLink to={paths.formula.getHref(id)}>Open the formula</ButtonLink>
        <ButtonLink to={paths.changes.getHref()}>All changes</ButtonLink>
      </PageHeading>
      <QueryState query={query} label="Fetching the revisions…">
        {(data) => <Revisions id={id} revisions={data.revisions} />}
      </QueryState>
    </>
  );
}

function Revisions({ id, revisions }: { id: string; revisions: RevisionSummary[] }) {
  const [params, setParams] = useSearchParams();
  const numbers = revisions.map((r) => r.revision).sort((a, b) => a - b);
  const newest = numbers[numbers.length - 1] ?? 1;
  const pick = (name: string, fallback: number) => {
    const n = Number(params.get(name));
    return numbers.includes(n) ? n : fallback;
  };
  const to = pick('to', newest);
  const from = pick('from', numbers[numbers.indexOf(to) - 1] ?? to);
  const diff = useRevisionDiff(id, from, to);

  if (revisions.length === 0) return <p className="text-muted">No revisions loaded for this formula.</p>;
  return (
    <div className="space-y-4">
      <Panel title="Compare" id="compare">
        {numbers.length < 2 ? (
          <p className="text-muted">Only one revision is loaded: nothing to compare yet.</p>
        ) : (
          <>
            <RevisionPicker revisions={[...revisions].sort((a, b) => b.revision - a.revision)} from={from} to={to} onChange={(r) => setParams({ from: String(r.from), to: String(r.to) }, { replace: true })} />
            <div className="mt-4">
              {from === to ? (
                <p className="text-muted">Pick two different revisions.</p>
              ) : (
                <PanelBoundary title="Comparison" resetKeys={[from, to]}>
                  <QueryState query={diff} label="Comparing…" inline>
                    {(d) => (
                      <>
                        <CommitNote commit={d.commits.to} className="mb-4" />
                        <RevisionDiffView diff={d.diff} from={d.from} to={d.to} />
                      </>
                    )}
                  </QueryState>
                </PanelBoundary>
              )}
            </div>
          </>
        )}
      </Panel>
      <Panel title="Every revision" id="revisions">
        <RevisionList revisions={revisions} from={from} to={to} />
      </Panel>
    </div>
  );
}
