import { PageHeading } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { useChanges } from '../../features/changes/api/get-changes.ts';
import { ChangeList } from '../../features/changes/components/change-list.tsx';
import { paths } from '../paths.ts';

export default function ChangesRoute() {
  const query = useChanges();
  return (
    <>
      <PageHeading title="Changes" kicker="What was loaded, newest first" />
      <QueryState query={query} label="Fetching the changes…">
        {(data) => (
          <ChangeList
            changes={data.changes}
            hrefOf={(c) => paths.formulaChanges.getHref(c.formula, c.revision > 1 ? { from: c.revision - 1, to: c.revision } : undefined)}
          />
        )}
      </QueryState>
    </>
  );
}
