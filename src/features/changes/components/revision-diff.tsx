import type { RevisionDiffResponse } from '#shared/api';

export function RevisionDiffView({ diff, from, to }: { diff: RevisionDiffResponse['diff']; from: number; to: number }) {
  return <pre data-testid="revision-diff" className="overflow-x-auto text-sm">{JSON.stringify({ from, to, diff }, null, 2)}</pre>;
}
