/** Panform's mark: a scored loaf sitting on a baker's ledger line. */
export function Logo({ className = 'h-9 w-9' }: { className?: string }) {
  return (
    <svg viewBox="0 0 48 48" className={className} aria-hidden="true">
      <rect x="2" y="2" width="44" height="44" rx="12" fill="var(--color-crust)" />
      <path d="M9 33 C9 19 17 13 24 13 C31 13 39 19 39 33 Z" fill="var(--color-crumb)" />
      <path d="M17 21 l5 6 M23 18 l5 7 M29 20 l4 5" stroke="var(--color-crust)" strokeWidth="2.4" strokeLinecap="round" />
      <path d="M7 37 H41" stroke="var(--color-crumb)" strokeWidth="2.4" strokeLinecap="round" />
    </svg>
  );
}
