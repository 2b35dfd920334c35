import type { RevisionSummary } from '#shared/api';
import { SelectField } from '../../../components/field.tsx';
import { shortDateTime } from '../../../lib/format.ts';

/** Two revisions to compare: older on the left, newer on the right. */
export function RevisionPicker({
  revisions,
  from,
  to,
  onChange,
}: {
  revisions: RevisionSummary[];
  from: number;
  to: number;
  onChange: (range: { from: number; to: number }) => void;
}) {
  const option = (r: RevisionSummary) => (
    <option key={r.revision} value={r.revision}>
      r{r.revision} · {shortDateTime(r.loadedAt)}
      {r.gitAuthor ? ` · ${r.gitAuthor}` : ''}
    </option>
  );
  return (
    <div className="grid gap-3 sm:grid-cols-2 print:hidden">
      <SelectField label="Before" value={from} onChange={(e) => onChange({ from: Number(e.target.value), to })}>
        {revisions.map(option)}
      </SelectField>
      <SelectField label="After" value={to} onChange={(e) => onChange({ from, to: Number(e.target.value) })}>
        {revisions.map(option)}
      </SelectField>
    </div>
  );
}
