import { useRef, type KeyboardEvent } from 'react';

export interface SegmentedProps<T extends string> {
  /** The group's accessible name. */
  label: string;
  options: readonly (readonly [T, string])[];
  value: T;
  onChange: (value: T) => void;
  className?: string;
  /** Extra classes for each option. */
  optionClassName?: string;
}

/**
 * A row of mutually exclusive options, announced as radio buttons and keyed as they are: one tab
 * stop (the chosen option), arrow keys move the choice and the focus, Home and End jump to the ends.
 */
export function Segmented<T extends string>({ label, options, value, onChange, className = '', optionClassName = '' }: SegmentedProps<T>) {
  const refs = useRef<(HTMLButtonElement | null)[]>([]);
  const move = (e: KeyboardEvent, index: number) => {
    const last = options.length - 1;
    const next =
      e.key === 'ArrowRight' || e.key === 'ArrowDown' ? (index === last ? 0 : index + 1)
      : e.key === 'ArrowLeft' || e.key === 'ArrowUp' ? (index === 0 ? last : index - 1)
      : e.key === 'Home' ? 0
      : e.key === 'End' ? last
      : null;
    if (next === null) return;
    e.preventDefault();
    onChange(options[next][0]);
    refs.current[next]?.focus();
  };
  return (
    <div role="radiogroup" aria-label={label} className={`flex gap-1 rounded-xl border-2 border-line bg-sunk p-1 ${className}`}>
      {options.map(([v, word], i) => (
        <button
          key={v}
          ref={(el) => {
            refs.current[i] = el;
          }}
          type="button"
          role="radio"
          aria-checked={value === v}
          tabIndex={value === v ? 0 : -1}
          onClick={() => onChange(v)}
          onKeyDown={(e) => move(e, i)}
          className={`min-h-12 rounded-lg px-3 font-semibold ${value === v ? 'bg-crust text-on-crust shadow-sm' : 'text-ink hover:bg-card'} ${optionClassName}`}
        >
          {word}
        </button>
      ))}
    </div>
  );
}
