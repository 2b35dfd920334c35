// The record form, as a full dialog over the sheet: big fields, a numeric keypad for temperatures,
// the time already filled in, the camera one tap away. Saving keeps the record on this device
// first (outbox.ts) and sends it from there, so it is never lost to a dead connection.
import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { readNumber, TextField } from '../../../components/field.tsx';
import { Segmented } from '../../../components/segmented.tsx';
import { temperatureUnitOf } from '#shared/units';
import { temperatureInput, useUnits } from '../../../lib/units.ts';
import type { BenchRecord, RecordTarget } from '../api/types.ts';
import { getDeviceOutbox, recordedAtFromTime, timeOfDay, type PendingRecord } from '../outbox.ts';

export const INITIALS_KEY = 'panform:initials';
export const MAX_PHOTOS = 6;
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024;

type Ripe = 'yes' | 'no' | 'unsaid';

export interface RecordDialogProps {
  date: string;
  target: RecordTarget;
  /** A record this one corrects: its values fill the form. */
  correcting?: BenchRecord;
  onClose: () => void;
}

function rememberedInitials(): string {
  try {
    return localStorage.getItem(INITIALS_KEY) ?? '';
  } catch {
    return '';
  }
}

function rememberInitials(initials: string): void {
  try {
    localStorage.setItem(INITIALS_KEY, initials);
  } catch {
    // Not kept: typed again next time.
  }
}

const numberText = (n: number | null | undefined) => (n === null || n === undefined ? '' : String(n));

export function RecordDialog({ date, target, correcting, onClose }: RecordDialogProps) {
  const { temperature, system } = useUnits();
  // Temperatures are typed in the person's units (°F in US customary) and kept in °C.
  const { unit, fromTyped, toTyped, range } = temperatureInput(temperatureUnitOf(system));
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const isMix = target.kind === 'mix';
  const [dough, setDough] = useState(() => numberText(toTyped(correcting?.doughTemperature)));
  const [water, setWater] = useState(() => numberText(toTyped(correcting?.waterTemperature)));
  const [time, setTime] = useState(() => timeOfDay(correcting ? new Date(correcting.recordedAt) : new Date()));
  const [initials, setInitials] = useState(rememberedInitials);
  const [note, setNote] = useState(correcting?.note ?? '');
  const [ripe, setRipe] = useState<Ripe>(correcting?.ripe === true ? 'yes' : correcting?.ripe === false ? 'no' : 'unsaid');
  const [photos, setPhotos] = useState<{ file: File; url: string }[]>([]);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saving, setSaving] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);

  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
  }, []);
  // Object URLs of the chosen photos are let go with the form.
  const urls = useRef<string[]>([]);
  urls.current = photos.map((p) => p.url);
  useEffect(() => () => urls.current.forEach((u) => URL.revokeObjectURL(u)), []);

  const addPhotos = (files: FileList | null) => {
    if (!files) return;
    const next = [...photos];
    const problems: string[] = [];
    for (const file of Array.from(files)) {
      if (!file.type.startsWith('image/')) problems.push(`${file.name} is not a photo`);
      else if (file.size > MAX_PHOTO_BYTES) problems.push(`${file.name} is over 10 MB`);
      else if (next.length >= MAX_PHOTOS) problems.push(`at most ${MAX_PHOTOS} photos a record`);
      else next.push({ file, url: URL.createObjectURL(file) });
    }
    setPhotos(next);
    setErrors((e) => ({ ...e, photo: problems.join('; ') }));
  };

  const removePhoto = (i: number) => {
    URL.revokeObjectURL(photos[i].url);
    setPhotos(photos.filter((_, j) => j !== i));
  };

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const found: Record<string, string> = {};
    const typed = (text: string) => {
      const n = text.trim() === '' ? null : readNumber(text);
      return n === null ? null : fromTyped(n);
    };
    const doughValue = typed(dough);
    const waterValue = typed(water);
    if (isMix && dough.trim() === '') found.dough = 'Write the dough temperature off the mixer.';
    else if (dough.trim() !== '' && (doughValue === null || doughValue < 0 || doughValue > 60)) found.dough = `A temperature from ${range(0, 60)}.`;
    if (water.trim() !== '' && (waterValue === null || waterValue < 0 || waterValue > 100)) found.water = `A temperature from ${range(0, 100)}.`;
    const at = recordedAtFromTime(time, new Date());
    if (!at) found.time = 'A time on the 24-hour clock, such as 02:15.';
    const ini = initials.trim();
    if (ini.length < 1 || ini.length > 8) found.initials = 'Your initials, up to 8 letters.';
    if (note.length > 2000) found.note = 'At most 2000 characters.';
    setErrors(found);
    if (Object.keys(found).length > 0) return;
    setSaving(true);
    setFailure(null);
    const pending: PendingRecord = {
      clientId: crypto.randomUUID(),
      date,
      target: target.target,
      label: target.label,
      fields: {
        kind: target.kind,
        doughTemperature: doughValue,
        waterTemperature: waterValue,
        ripe: isMix || ripe === 'unsaid' ? null : ripe === 'yes',
        note,
        initials: ini,
        recordedAt: at!.toISOString(),
        corrects: correcting?.id ?? null,
      },
      photos: photos.map((p) => ({ name: p.file.name || 'photo.jpg', blob: p.file })),
      savedAt: new Date().toISOString(),
      refused: null,
    };
    try {
      await getDeviceOutbox().save(pending);
      rememberInitials(ini);
      onClose();
    } catch (error) {
      setSaving(false);
      setFailure(`Could not keep it on this tablet: ${error instanceof Error ? error.message : String(error)}. Write it on the sheet.`);
    }
  };

  const aim =
    target.doughTemperature !== null || target.waterTemperature !== null
      ? [
          target.doughTemperature !== null ? `${isMix ? 'dough' : 'build'} ${temperature(target.doughTemperature)}` : null,
          target.waterTemperature !== null ? `water ${temperature(target.waterTemperature)}` : null,
        ]
          .filter(Boolean)
          .join(' · ')
      : null;

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className="m-auto max-h-[calc(100dvh-2rem)] w-[min(52rem,calc(100vw-2rem))] overflow-y-auto rounded-2xl border-2 border-line bg-card p-0 text-ink shadow-2xl backdrop:bg-ink/60"
      data-testid="record-dialog"
    >
      <form onSubmit={submit} noValidate className="space-y-4 p-5" aria-labelledby={titleId}>
        <header>
          <p className="text-sm font-semibold uppercase tracking-[0.14em] text-muted">{correcting ? `Correct the record of ${timeOfDay(new Date(correcting.recordedAt))} (${correcting.initials})` : isMix ? 'Record the mix' : 'Record the build'}</p>
          <h2 id={titleId} className="text-2xl font-bold">
            {target.label}
            {target.mixer && <span className="font-sans text-lg font-normal text-muted"> · {target.mixer}</span>}
          </h2>
          {aim && <p className="figure text-muted">The sheet: {aim}</p>}
        </header>

        <div className="grid gap-4 sm:grid-cols-2">
          <TextField
            label={isMix ? 'Dough off the mixer' : 'Build temperature'}
            inputMode="decimal"
            autoComplete="off"
            suffix={`°${unit}`}
            value={dough}
            onChange={(e) => setDough(e.target.value)}
            error={errors.dough}
            hint={isMix ? 'probe in the middle of the dough' : 'empty: not taken'}
            required={isMix}
          />
          <TextField
            label="Water used"
            inputMode="decimal"
            autoComplete="off"
            suffix={`°${unit}`}
            value={water}
            onChange={(e) => setWater(e.target.value)}
            error={errors.water}
            hint={target.waterTemperature !== null ? `empty: the sheet's ${temperature(target.waterTemperature)}` : 'empty: not taken'}
          />
          <div>
            {/* A text field on the 24-hour clock, as the sheet writes times: a time input would follow the browser's locale (AM/PM). */}
            <TextField label="Time" inputMode="numeric" autoComplete="off" maxLength={5} value={time} onChange={(e) => setTime(e.target.value)} error={errors.time} hint="when you took it, 24-hour clock" />
          </div>
          <TextField
            label="Your initials"
            autoComplete="off"
            autoCapitalize="characters"
            maxLength={8}
            value={initials}
            onChange={(e) => setInitials(e.target.value.toUpperCase())}
            error={errors.initials}
            hint="kept on this tablet for next time"
          />
          {!isMix && (
            <div className="sm:col-span-2">
              <p className="mb-1 font-semibold" id={`${titleId}-ripe`}>
                Ripe?
              </p>
              <Segmented
                label="Ripe?"
                value={ripe}
                onChange={setRipe}
                options={[
                  ['yes', 'Ripe'],
                  ['no', 'Not ripe'],
                  ['unsaid', 'Not judged'],
                ]}
                className="w-full"
                optionClassName="flex-1 text-lg"
              />
            </div>
          )}
          <div className="sm:col-span-2 lg:col-span-1">
            <NoteField value={note} onChange={setNote} error={errors.note} placeholder={isMix ? 'slack, added 1 % water' : 'domed, bubbly, just starting to sink'} />
          </div>
          <div className="sm:col-span-2 lg:col-span-1">
            <p className="mb-1 font-semibold">Photos</p>
            <div className="flex flex-wrap items-start gap-3">
              {photos.map((p, i) => (
                <figure key={p.url} className="relative">
                  <img src={p.url} alt={`Photo ${i + 1} to send`} className="h-28 w-28 rounded-xl border-2 border-line object-cover" />
                  <button
                    type="button"
                    onClick={() => removePhoto(i)}
                    className="absolute -right-2 -top-2 grid h-12 w-12 place-items-center rounded-full border-2 border-line bg-card text-xl font-bold text-ember shadow"
                    aria-label={`Take photo ${i + 1} out`}
                  >
                    ×
                  </button>
                </figure>
              ))}
              {photos.length < MAX_PHOTOS && (
                <label className="inline-flex min-h-28 min-w-40 cursor-pointer flex-col items-center justify-center gap-1 rounded-xl border-2 border-dashed border-crust bg-crumb px-4 text-lg font-semibold text-crust hover:bg-sunk focus-within:outline focus-within:outline-3 focus-within:outline-focus">
                  <span aria-hidden="true" className="text-3xl leading-none">
                    ◉
                  </span>
                  {photos.length === 0 ? 'Take a photo' : 'Another photo'}
                  <input
                    type="file"
                    accept="image/*"
                    capture="environment"
                    multiple
                    className="sr-only"
                    data-testid="record-photo"
                    onChange={(e) => {
                      addPhotos(e.target.files);
                      e.target.value = '';
                    }}
                  />
                </label>
              )}
            </div>
            <p className={`mt-1 text-sm ${errors.photo ? 'font-semibold text-ember' : 'text-muted'}`}>
              {errors.photo || `crumb, bake colour; up to ${MAX_PHOTOS}, location and camera data are removed when stored`}
            </p>
          </div>
        </div>

        {failure && (
          <p role="alert" className="rounded-xl border-l-4 border-ember bg-ember-soft px-4 py-3 font-semibold">
            {failure}
          </p>
        )}
        {/* Kept in sight at the foot of the dialog: Save is never below the fold. */}
        <footer className="sticky bottom-0 -mx-5 -mb-5 flex flex-wrap justify-end gap-3 border-t-2 border-line bg-card px-5 py-4">
          <Button tone="plain" onClick={onClose} className="min-w-32 text-lg">
            Cancel
          </Button>
          <button type="submit" disabled={saving} className="inline-flex min-h-14 min-w-48 items-center justify-center rounded-xl bg-crust px-6 text-xl font-bold text-on-crust shadow-sm hover:bg-crust-deep disabled:bg-sunk disabled:text-muted">
            {saving ? 'Saving…' : correcting ? 'Save the correction' : 'Save the record'}
          </button>
        </footer>
      </form>
    </dialog>
  );
}

function NoteField({ value, onChange, error, placeholder }: { value: string; onChange: (v: string) => void; error?: string; placeholder: string }) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="mb-1 block font-semibold">
        Note
      </label>
      <textarea
        id={id}
        rows={3}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        placeholder={placeholder}
        aria-invalid={error ? true : undefined}
        className="min-h-28 w-full rounded-xl border-2 border-line bg-card px-3 py-2 text-lg text-ink placeholder:text-muted/70 hover:border-muted focus:border-crust"
      />
      {error && <p className="mt-1 text-sm font-semibold text-ember">{error}</p>}
    </div>
  );
}
