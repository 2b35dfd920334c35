import type { ButtonHTMLAttributes, ReactNode } from 'react';
import { Link, type LinkProps } from 'react-router';

type Tone = 'primary' | 'plain' | 'quiet';

// 48 px tall: a floury thumb still hits it. Disabled: muted text on the sunk colour (5.5:1 light,
// 6.9:1 dark; WCAG 2.1 SC 1.4.3 asks 4.5:1), not a faded button whose text falls below that.
const base =
  'inline-flex min-h-12 items-center justify-center gap-2 rounded-xl px-5 text-base font-semibold transition-colors disabled:cursor-not-allowed disabled:border-line disabled:bg-sunk disabled:text-muted disabled:shadow-none print:hidden';
const tones: Record<Tone, string> = {
  primary: 'bg-crust text-on-crust hover:bg-crust-deep shadow-sm',
  plain: 'border-2 border-line bg-card text-ink hover:border-crust hover:text-crust',
  quiet: 'text-crust underline-offset-4 hover:underline',
};

export function buttonClass(tone: Tone = 'plain', extra = ''): string {
  return `${base} ${tones[tone]} ${extra}`;
}

export function Button({ tone = 'plain', className = '', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: Tone }) {
  return <button type="button" className={buttonClass(tone, className)} {...props} />;
}

export function ButtonLink({ tone = 'plain', className = '', ...props }: LinkProps & { tone?: Tone; children: ReactNode }) {
  return <Link className={buttonClass(tone, className)} {...props} />;
}
