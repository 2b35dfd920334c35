// Records saved on this tablet wait on the device until the server has them, so a bakehouse corner
// without Wi-Fi loses nothing. Every record goes through here, online or not: it is written to
// IndexedDB first (idb-keyval; photos as the Blobs the camera gave), under its idempotency key
// (crypto.randomUUID), and then sent: at once, when the page loads, when the browser says the
// connection is back, and every half minute while any wait. The server stores a key once, so a
// record sent twice (an answer lost on the way) is stored once.
import { createStore, del, set, values } from 'idb-keyval';
import type { BenchRecord } from './api/types.ts';
import { SingleFlight } from '#shared/single-flight';

/**
 * What the baker wrote, checked by the form: the record's own fields (temperatures in °C;
 * `recordedAt` ISO 8601 in UTC, the tablet's clock or the time typed; `corrects` the id of the
 * record this one corrects).
 */
export type RecordFields = Pick<BenchRecord, 'kind' | 'doughTemperature' | 'waterTemperature' | 'ripe' | 'note' | 'initials' | 'recordedAt' | 'corrects'>;

export interface PendingRecord {
  /** The idempotency key, sent as `client_id`. */
  clientId: string;
  date: string;
  target: string;
  /** The card's name for it, for the count ("Harbour ciabatta 1/2"). */
  label: string;
  fields: RecordFields;
  photos: { name: string; blob: Blob }[];
  /** When it was saved on this device, ISO. */
  savedAt: string;
  /** Why the server will not take it as it is (it stays here until the baker discards it); null while it only waits. */
  refused: string | null;
}

/** How one try went: stored (or already stored), wait and try later, or refused for good. */
export type SendOutcome = { kind: 'stored'; record: BenchRecord | null } | { kind: 'wait'; reason: string } | { kind: 'refused'; reason: string };

/** Where the waiting records are kept: IndexedDB in the browser, a Map in tests. */
export interface OutboxStore {
  put(record: PendingRecord): Promise<void>;
  remove(clientId: string): Promise<void>;
  all(): Promise<PendingRecord[]>;
}

export interface OutboxState {
  /** Oldest first. */
  items: readonly PendingRecord[];
  sending: boolean;
  /** Why the last try stopped (no connection, signed out, server busy); null after a clean run. */
  problem: string | null;
}

/** The multipart body of `POST /api/plans/:date/records`, field names as the API gives them. */
export function recordFormData(p: PendingRecord): FormData {
  const form = new FormData();
  const f = p.fields;
  form.set('target', p.target);
  form.set('kind', f.kind);
  form.set('client_id', p.clientId);
  form.set('initials', f.initials);
  form.set('recorded_at', f.recordedAt);
  if (f.doughTemperature !== null) form.set('dough_temperature', String(f.doughTemperature));
  if (f.waterTemperature !== null) form.set('water_temperature', String(f.waterTemperature));
  if (f.kind === 'build' && f.ripe !== null) form.set('ripe', f.ripe ? 'true' : 'false');
  if (f.note.trim()) form.set('note', f.note.trim());
  if (f.corrects !== null) form.set('corrects', String(f.corrects));
  for (const photo of p.photos) form.append('photo', photo.blob, photo.name);
  return form;
}

/**
 * What an answer means for a waiting record. Stored: 201, or 200 for a key already stored. Wait:
 * no answer, signed out (sign in again and it goes), too many at once, a server in trouble.
 * Refused: the server says the record itself is wrong (it will say so again).
 */
export function outcomeOf(status: number, body: unknown): SendOutcome {
  const message = messageOf(body);
  if (status === 200 || status === 201) return { kind: 'stored', record: recordOf(body) };
  if (status === 401) return { kind: 'wait', reason: 'signed out: sign in again and it is sent' };
  if (status === 408 || status === 429 || status >= 500) return { kind: 'wait', reason: message ?? `the server is busy (${status})` };
  return { kind: 'refused', reason: message ?? `the server refused it (${status})` };
}

function messageOf(body: unknown): string | null {
  if (typeof body !== 'object' || body === null) return null;
  const b = body as { message?: unknown; issues?: { path?: unknown; message?: unknown }[] };
  const issues = Array.isArray(b.issues) ? b.issues.map((i) => String(i.message ?? '')).filter(Boolean) : [];
  const message = typeof b.message === 'string' ? b.message : null;
  if (issues.length === 0) return message;
  return [message, ...issues.filter((i) => i !== message)].filter(Boolean).join('; ');
}

function recordOf(body: unknown): BenchRecord | null {
  const r = typeof body === 'object' && body !== null ? (body as { record?: BenchRecord }).record : undefined;
  return r ?? null;
}

/** Sends one waiting record to the server. */
export async function sendRecord(p: PendingRecord): Promise<SendOutcome> {
  if (typeof navigator !== 'undefined' && navigator.onLine === false) return { kind: 'wait', reason: 'no connection' };
  let response: Response;
  try {
    response = await fetch(`/api/plans/${encodeURIComponent(p.date)}/records`, {
      method: 'POST',
      body: recordFormData(p),
      headers: { Accept: 'application/json' },
      credentials: 'same-origin',
    });
  } catch {
    return { kind: 'wait', reason: 'no connection' };
  }
  let body: unknown = null;
  try {
    body = JSON.parse(await response.text());
  } catch {
    body = null;
  }
  return outcomeOf(response.status, body);
}

export class Outbox {
  private state: OutboxState = { items: [], sending: false, problem: null };
  private listeners = new Set<() => void>();
  private readonly sending = new SingleFlight(
    () => this.sendAll(),
    () => this.setState({ sending: false }),
  );

  constructor(
    private readonly store: OutboxStore,
    private readonly send: (p: PendingRecord) => Promise<SendOutcome>,
    /** Told of each record the server has, to refresh what shows it. */
    readonly onStored: Set<(p: PendingRecord, record: BenchRecord | null) => void> = new Set(),
  ) {}

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  getState = (): OutboxState => this.state;

  private setState(next: Partial<OutboxState>): void {
    this.state = { ...this.state, ...next };
    for (const l of this.listeners) l();
  }

  /** Reads what waits on the device (after a reload: what an earlier page left). */
  async load(): Promise<void> {
    const items = (await this.store.all()).sort((a, b) => a.savedAt.localeCompare(b.savedAt) || a.clientId.localeCompare(b.clientId));
    this.setState({ items });
  }

  /** Keeps a record on the device, then tries to send it. Resolves once it is kept (not sent). */
  async save(p: PendingRecord): Promise<void> {
    await this.store.put(p);
    await this.load();
    void this.flush();
  }

  /** Forgets a record the baker chose to drop (one the server refused). */
  async discard(clientId: string): Promise<void> {
    await this.store.remove(clientId);
    await this.load();
  }

  /** Sends what waits, oldest first, one at a time; stops at the first that has to wait. */
  flush(): Promise<void> {
    return this.sending.run();
  }

  private async sendAll(): Promise<void> {
    await this.load();
    const waiting = this.state.items.filter((p) => p.refused === null);
    if (waiting.length === 0) {
      this.setState({ problem: null });
      return;
    }
    this.setState({ sending: true });
    let problem: string | null = null;
    for (const p of waiting) {
      const outcome = await this.send(p).catch((error: unknown): SendOutcome => ({ kind: 'wait', reason: error instanceof Error ? error.message : 'could not send' }));
      if (outcome.kind === 'stored') {
        await this.store.remove(p.clientId);
        for (const l of this.onStored) l(p, outcome.record);
      } else if (outcome.kind === 'refused') {
        await this.store.put({ ...p, refused: outcome.reason });
      } else {
        problem = outcome.reason;
        break;
      }
    }
    await this.load();
    this.setState({ problem });
  }
}

/** The browser's store: one IndexedDB database of Panform's, one object store of waiting records. */
export function indexedDbStore(): OutboxStore {
  const store = createStore('panform', 'record-outbox');
  return {
    put: (r) => set(r.clientId, r, store),
    remove: (clientId) => del(clientId, store),
    all: () => values<PendingRecord>(store),
  };
}

let deviceOutbox: Outbox | null = null;

/** This device's outbox, sending through the API; started once (load, online, every 30 s). */
export function getDeviceOutbox(): Outbox {
  if (deviceOutbox) return deviceOutbox;
  const outbox = new Outbox(indexedDbStore(), sendRecord);
  deviceOutbox = outbox;
  if (typeof window !== 'undefined') {
    window.addEventListener('online', () => void outbox.flush());
    window.setInterval(() => {
      const s = outbox.getState();
      if (!s.sending && s.items.some((p) => p.refused === null)) void outbox.flush();
    }, 30_000);
    void outbox.flush();
  }
  return outbox;
}

/**
 * When a record was measured: the time typed ("HH:MM") on the day that makes it the latest such
 * moment not after `now` (a record typed at 00:10 for 23:50 is yesterday's). A few minutes ahead
 * still counts as today: clocks on the wall and on the tablet differ.
 */
export function recordedAtFromTime(time: string, now: Date): Date | null {
  // "02:15", "2:15", or the digits alone ("0215", "215") from a keypad without a colon.
  const m = /^(\d{1,2}):?(\d{2})$/.exec(time.trim());
  if (!m) return null;
  const h = Number(m[1]);
  const min = Number(m[2]);
  if (h > 23 || min > 59) return null;
  const at = new Date(now);
  at.setHours(h, min, 0, 0);
  if (at.getTime() - now.getTime() > 5 * 60_000) at.setDate(at.getDate() - 1);
  return at;
}

/** A Date as the time field shows it: "02:14" on this device's clock. */
export function timeOfDay(d: Date): string {
  return `${String(d.getHours()).padStart(2, '0')}:${String(d.getMinutes()).padStart(2, '0')}`;
}
