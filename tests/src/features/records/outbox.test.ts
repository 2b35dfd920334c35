// The tablet's outbox: a record is kept first and sent after, once per key, oldest first; a dead
// connection keeps it waiting, a refusal keeps it with the server's words, nothing is dropped
// unless the baker discards it. The store here is a Map; in the browser it is IndexedDB
// (the end-to-end test reloads the page offline and finds the record still waiting).
import { describe, expect, it } from 'vitest';
import { Outbox, outcomeOf, recordFormData, recordedAtFromTime, type OutboxStore, type PendingRecord, type SendOutcome } from '../../../../src/features/records/outbox.ts';

function memoryStore(): OutboxStore & { map: Map<string, PendingRecord> } {
  const map = new Map<string, PendingRecord>();
  return {
    map,
    put: async (r) => void map.set(r.clientId, structuredClone(r)),
    remove: async (k) => void map.delete(k),
    all: async () => [...map.values()].map((r) => structuredClone(r)),
  };
}

function pending(clientId: string, over: Partial<PendingRecord['fields']> = {}, savedAt = `2026-12-03T02:1${clientId.length % 10}:00.000Z`): PendingRecord {
  return {
    clientId,
    date: '2026-12-03',
    target: 'harbour-ciabatta/1',
    label: 'Harbour ciabatta 1/2',
    fields: { kind: 'mix', doughTemperature: 25.5, waterTemperature: 11, ripe: null, note: 'slack, added 1 % water', initials: 'MK', recordedAt: '2026-12-03T02:14:00.000Z', corrects: null, ...over },
    photos: [],
    savedAt,
    refused: null,
  };
}

describe('the record outbox', () => {
  it('keeps a record while the connection is down and sends it once it is back', async () => {
    const store = memoryStore();
    let online = false;
    const sent: string[] = [];
    const outbox = new Outbox(store, async (p): Promise<SendOutcome> => {
      if (!online) return { kind: 'wait', reason: 'no connection' };
      sent.push(p.clientId);
      return { kind: 'stored', record: null };
    });
    await outbox.save(pending('a-1111-key'));
    await outbox.flush();
    expect(outbox.getState().items.map((p) => p.clientId)).toEqual(['a-1111-key']);
    expect(outbox.getState().problem).toBe('no connection');
    expect(store.map.size).toBe(1);

    // A reload: a new outbox over the same store finds it.
    const again = new Outbox(store, async (p) => (sent.push(p.clientId), { kind: 'stored', record: null }));
    await again.load();
    expect(again.getState().items).toHaveLength(1);
    online = true;
    await again.flush();
    expect(sent).toEqual(['a-1111-key']);
    expect(again.getState().items).toEqual([]);
    expect(again.getState().problem).toBeNull();
    expect(store.map.size).toBe(0);
  });

  it('sends the oldest first and stops at the first that has to wait', async () => {
    const store = memoryStore();
    const tried: string[] = [];
    const outbox = new Outbox(store, async (p) => {
      tried.push(p.clientId);
      return p.clientId === 'second-key' ? { kind: 'wait', reason: 'the server is busy (503)' } : { kind: 'stored', record: null };
    });
    await store.put(pending('third-key', {}, '2026-12-03T02:30:00.000Z'));
    await store.put(pending('first-key', {}, '2026-12-03T02:10:00.000Z'));
    await store.put(pending('second-key', {}, '2026-12-03T02:20:00.000Z'));
    await outbox.flush();
    expect(tried).toEqual(['first-key', 'second-key']);
    expect(outbox.getState().items.map((p) => p.clientId)).toEqual(['second-key', 'third-key']);
  });

  it('keeps a refused record with the reason, sends no more of it, and forgets it only when discarded', async () => {
    const store = memoryStore();
    let tries = 0;
    const outbox = new Outbox(store, async () => {
      tries++;
      return { kind: 'refused', reason: 'dough_temperature: from 0 to 60 °C' };
    });
    await outbox.save(pending('bad-record-key'));
    await outbox.flush();
    await outbox.flush();
    expect(tries).toBe(1);
    expect(outbox.getState().items[0].refused).toBe('dough_temperature: from 0 to 60 °C');
    await outbox.discard('bad-record-key');
    expect(outbox.getState().items).toEqual([]);
  });

  it('tells who listens of each record stored, with its bake day', async () => {
    const store = memoryStore();
    const heard: string[] = [];
    const outbox = new Outbox(store, async () => ({ kind: 'stored', record: null }));
    outbox.onStored.add((p) => heard.push(`${p.date} ${p.target}`));
    await outbox.save(pending('heard-key-1'));
    await outbox.flush();
    expect(heard).toEqual(['2026-12-03 harbour-ciabatta/1']);
  });

  it('runs one send at a time: a second flush while one runs sends nothing twice', async () => {
    const store = memoryStore();
    const sent: string[] = [];
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const outbox = new Outbox(store, async (p) => {
      await gate;
      sent.push(p.clientId);
      return { kind: 'stored', record: null };
    });
    await store.put(pending('only-once-key'));
    const a = outbox.flush();
    const b = outbox.flush();
    release();
    await Promise.all([a, b]);
    expect(sent).toEqual(['only-once-key']);
  });
});

describe('what an answer means for a waiting record', () => {
  it.each([
    [201, 'stored'],
    [200, 'stored'], // the key was already stored: the server says so and stores nothing
    [401, 'wait'],
    [429, 'wait'],
    [503, 'wait'],
    [422, 'refused'],
    [413, 'refused'],
    [409, 'refused'],
    [404, 'refused'],
  ] as const)('%i → %s', (status, kind) => {
    expect(outcomeOf(status, { error: 'x', message: 'm' }).kind).toBe(kind);
  });

  it("gives the server's message and its issues", () => {
    const o = outcomeOf(422, { error: 'invalid', message: 'The record was not stored.', issues: [{ path: 'dough_temperature', message: 'dough_temperature: 72 is above 60 °C' }] });
    expect(o).toEqual({ kind: 'refused', reason: 'The record was not stored.; dough_temperature: 72 is above 60 °C' });
  });
});

describe('the multipart body', () => {
  it('carries the fields the API names, the key, and each photo', async () => {
    const p = pending('form-key-123', { waterTemperature: null });
    p.photos = [{ name: 'crumb.jpg', blob: new Blob([new Uint8Array([0xff, 0xd8, 0xff])], { type: 'image/jpeg' }) }];
    const form = recordFormData(p);
    expect(form.get('target')).toBe('harbour-ciabatta/1');
    expect(form.get('client_id')).toBe('form-key-123');
    expect(form.get('dough_temperature')).toBe('25.5');
    expect(form.has('water_temperature')).toBe(false);
    expect(form.has('ripe')).toBe(false);
    expect(form.get('initials')).toBe('MK');
    expect(form.get('recorded_at')).toBe('2026-12-03T02:14:00.000Z');
    const photos = form.getAll('photo') as File[];
    expect(photos).toHaveLength(1);
    expect(photos[0].name).toBe('crumb.jpg');
    expect(photos[0].size).toBe(3);
  });

  it('sends ripe for a build only when the baker said', () => {
    const build = { ...pending('build-key-1', { kind: 'build', ripe: false, doughTemperature: null }), target: 'poolish' };
    const form = recordFormData(build);
    expect(form.get('ripe')).toBe('false');
    expect(form.has('dough_temperature')).toBe(false);
  });
});

describe('the time a record was taken', () => {
  const now = new Date(2026, 11, 3, 0, 10); // 00:10 on 3 December, this machine's local time
  it('is today for a time before now', () => {
    expect(recordedAtFromTime('00:05', now)?.getTime()).toBe(new Date(2026, 11, 3, 0, 5).getTime());
  });
  it('is yesterday for a time later in the day (typed after midnight)', () => {
    expect(recordedAtFromTime('23:50', now)?.getTime()).toBe(new Date(2026, 11, 2, 23, 50).getTime());
  });
  it('allows a clock a few minutes ahead', () => {
    expect(recordedAtFromTime('00:14', now)?.getTime()).toBe(new Date(2026, 11, 3, 0, 14).getTime());
  });
  it('takes the digits alone from a keypad without a colon', () => {
    expect(recordedAtFromTime('0005', now)?.getTime()).toBe(new Date(2026, 11, 3, 0, 5).getTime());
    expect(recordedAtFromTime('2350', now)?.getTime()).toBe(new Date(2026, 11, 2, 23, 50).getTime());
  });
  it.each(['', '7', '24:00', '12:60', '2460', 'noon', '2:5'])('refuses %j', (t) => {
    expect(recordedAtFromTime(t, now)).toBeNull();
  });
});
