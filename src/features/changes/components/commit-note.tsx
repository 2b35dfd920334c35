import type { RevisionCommit } from '#shared/api';
import { shortDateTime } from '../../../lib/format.ts';

/** Why a revision changed: the commit's message, author, date and short hash, when it had one. */
export function CommitNote({ commit, className = '' }: { commit: RevisionCommit; className?: string }) {
  if (!commit.gitCommit) return null;
  return (
    <span className={`block ${className}`} data-commit={commit.gitCommit}>
      {commit.gitMessage && <span className="block font-medium text-ink">“{commit.gitMessage}”</span>}
      <span className="block text-sm text-muted">
        {commit.gitAuthor}
        {commit.gitDate && <> · committed {shortDateTime(commit.gitDate)}</>}
        <span className="figure"> · {commit.gitCommit.slice(0, 8)}</span>
      </span>
    </span>
  );
}
