import type { ReactNode } from 'react';
import { Logo } from './logo.tsx';

/** The frame of the pages before sign-in: the mark, a card, and a word about the place. */
export function AuthFrame({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main id="main" className="grid min-h-dvh place-items-center px-4 py-8">
      <title>{`${title} · Panform`}</title>
      <div className="w-full max-w-md">
        <div className="mb-6 flex items-center justify-center gap-3">
          <Logo className="h-12 w-12" />
          <span className="font-display text-4xl font-bold tracking-tight">Panform</span>
        </div>
        <div className="rounded-2xl border border-line bg-card p-6 shadow-[0_2px_0_var(--color-line)]">
          <h1 className="mb-4 text-2xl font-bold">{title}</h1>
          {children}
        </div>
        <p className="mt-4 text-center text-muted">The bakehouse's dough book: formulas, batches and bake days.</p>
      </div>
    </main>
  );
}
