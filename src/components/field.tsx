import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

const control =
  'min-h-12 w-full rounded-xl border-2 border-line bg-card px-3 text-lg text-ink placeholder:text-muted/70 hover:border-muted focus:border-crust';

export function TextField({
  label,
  hint,
  suffix,
  error,
  className = '',
  ...props
}: InputHTMLAttributes<HTMLInputElement> & { label: ReactNode; hint?: ReactNode; suffix?: ReactNode; error?: ReactNode }) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block font-semibold">
        {label}
      </label>
      <div className="flex items-center gap-2">
        <input
          id={id}
          aria-invalid={error ? true : undefined}
          aria-describedby={hint || error ? `${id}-help` : undefined}
          className={`${control} ${props.inputMode === 'decimal' || props.inputMode === 'numeric' ? 'font-mono' : ''}`}
          {...props}
        />
        {suffix && <span className="shrink-0 font-mono text-muted">{suffix}</span>}
      </div>
      {(hint || error) && (
        <p id={`${id}-help`} className={`mt-1 text-sm ${error ? 'font-semibold text-ember' : 'text-muted'}`}>
          {error ?? hint}
        </p>
      )}
    </div>
  );
}

export function SelectField({
  label,
  children,
  className = '',
  ...props
}: SelectHTMLAttributes<HTMLSelectElement> & { label: ReactNode; children: ReactNode }) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block font-semibold">
        {label}
      </label>
      <select id={id} className={`${control} cursor-pointer`} {...props}>
        {children}
      </select>
    </div>
  );
}

/** A number typed by a baker: "1,5" and "1.5" both read as 1.5; empty or junk reads as null. */
export function readNumber(text: string): number | null {
  const cleaned = text.trim().replace(',', '.');
  if (!/^-?[0-9]*\.?[0-9]+$|^-?[0-9]+\.?$/.test(cleaned)) return null;
  const n = Number(cleaned);
  return Number.isFinite(n) ? n : null;
}
