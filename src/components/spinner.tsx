/** A rising loaf instead of a spinner; announced to screen readers as busy. */
export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-3 py-6 text-muted">
      <svg viewBox="0 0 40 24" className="h-7 w-12 animate-pulse text-crust" aria-hidden="true">
        <path d="M4 20 C4 8 12 4 20 4 C28 4 36 8 36 20 Z" fill="currentColor" opacity="0.85" />
        <path d="M13 9 l3 4 M20 8 l2 5 M27 9 l-2 4" stroke="var(--color-card)" strokeWidth="1.6" strokeLinecap="round" />
      </svg>
      <span>{label}</span>
    </div>
  );
}
