import { useEffect, useRef, useState } from 'react';
import { SelectField, TextField } from '../../../components/field.tsx';
import type { FormulaFilters as Filters } from '../api/get-formulas.ts';

/** Search as you type (the list follows after a short pause) and three filters. */
export function FormulaFilters({
  value,
  onChange,
  categories,
  tags,
  showStatus,
}: {
  value: Filters;
  onChange: (next: Filters) => void;
  categories: string[];
  tags: string[];
  showStatus: boolean;
}) {
  const [text, setText] = useState(value.q ?? '');
  const latest = useRef(value);
  latest.current = value;
  // The last search this box put into the URL. When it comes back, the baker may have typed on
  // meanwhile (a slow tablet), so it must not overwrite the box.
  const sent = useRef<string | null>(null);

  // The URL may change under us (back button): follow it.
  useEffect(() => {
    const q = value.q ?? '';
    if (q !== sent.current) setText(q);
  }, [value.q]);

  useEffect(() => {
    if ((latest.current.q ?? '') === text) return;
    const timer = setTimeout(() => {
      sent.current = text;
      onChange({ ...latest.current, q: text });
    }, 180);
    return () => clearTimeout(timer);
  }, [text, onChange]);

  return (
    <form role="search" onSubmit={(e) => e.preventDefault()} className="grid gap-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr] print:hidden">
      <TextField
        label="Find a formula"
        type="search"
        name="q"
        placeholder="name, flour, tag…"
        value={text}
        autoComplete="off"
        onChange={(e) => setText(e.target.value)}
        className="sm:col-span-2 lg:col-span-1"
      />
      <SelectField label="Kind of dough" name="category" value={value.category ?? ''} onChange={(e) => onChange({ ...value, category: e.target.value })}>
        <option value="">All kinds</option>
        {categories.map((c) => (
          <option key={c} value={c}>
            {c}
          </option>
        ))}
      </SelectField>
      <SelectField label="Tag" name="tag" value={value.tag ?? ''} onChange={(e) => onChange({ ...value, tag: e.target.value })}>
        <option value="">Any tag</option>
        {tags.map((t) => (
          <option key={t} value={t}>
            {t}
          </option>
        ))}
      </SelectField>
      {showStatus && (
        <SelectField label="Status" name="status" value={value.status ?? ''} onChange={(e) => onChange({ ...value, status: e.target.value })}>
          <option value="">Any status</option>
          <option value="active">In use</option>
          <option value="draft">Draft</option>
          <option value="retired">Retired</option>
        </SelectField>
      )}
    </form>
  );
}
