// The bake-day page's proposals: the friction the bench's records give each mixer with each dough
// of the night, beside the plan file's (which stays until the file is changed).
import { useUnits } from '../../../lib/units.ts';
import type { FrictionProposal } from '../api/types.ts';

export function FrictionProposals({ proposals }: { proposals: readonly FrictionProposal[] }) {
  const { degrees } = useUnits();
  const shown = proposals.flatMap((p) => (p.status !== 'too few' && p.rise !== null && p.friction !== null ? [{ ...p, rise: p.rise, friction: p.friction }] : []));
  if (shown.length === 0) return null;
  return (
    <div className="mt-3 rounded-xl border-2 border-sage bg-sage-soft p-3 print:border print:p-1" data-testid="sheet-friction">
      <p className="font-semibold">Friction learned from the bench's records</p>
      <ul className="mt-1 space-y-1">
        {shown.map((p) => (
          <li key={`${p.mixer}-${p.formula}`} data-mixer={p.mixer} data-formula={p.formula}>
            <span className="font-semibold">{p.title}</span> on {p.mixer}: rise <strong className="figure">{degrees(p.rise)}</strong> (friction {degrees(p.friction)}), {p.basis}
            {p.current && <span className="text-muted"> · the file says {degrees(p.current.rise)}</span>}
            {p.status === 'agrees' ? <span className="text-muted"> · agrees</span> : p.change ? <span className="block text-sm text-muted">to take it: {p.change}</span> : null}
          </li>
        ))}
      </ul>
      <p className="mt-1 text-sm text-muted">Proposals only: tonight's water is worked out with the file's figures; the water helper can use the bench's.</p>
    </div>
  );
}
