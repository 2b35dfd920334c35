// What every route needs, built once by createApp and passed to each router.
import type { Database } from './db/client.ts';
import type { Env } from './env.ts';
import type { ScryptParams } from './auth/password.ts';
import type { Clock, Limiters } from './auth/rate-limit.ts';
import type { SessionStore } from './auth/sessions.ts';
import type { DataCache } from './routes/data.ts';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

export interface ServerContext {
  db: Database;
  env: Env;
  now: Clock;
  sessions: SessionStore;
  limiters: Limiters;
  scrypt: ScryptParams;
  /** Verified against when an e-mail address has no account, so both cases take as long. */
  dummyHash: Promise<string>;
  sendMail(message: OutgoingMail): Promise<void>;
  data: DataCache;
  /** Runs work after the response (e.g. a reset e-mail); errors are logged. */
  background(task: () => Promise<unknown>): void;
  log(message: string): void;
}
