// Password hashing with scrypt (node:crypto): memory-hard, a random salt per password, the cost
// parameters stored in the hash so they can be raised later without breaking old hashes, and a
// timing-safe comparison.
//
// Stored form: scrypt$<N>$<r>$<p>$<salt base64url>$<key base64url>
import { randomBytes, scrypt as scryptCb, timingSafeEqual, type ScryptOptions } from 'node:crypto';

export interface ScryptParams {
  /** CPU/memory cost, a power of 2. */
  N: number;
  r: number;
  p: number;
}

// N = 2^15, r = 8 needs 32 MiB per hash and takes about a quarter of a second on the small
// two-core machines a bakery office runs; the cost stays stored with each hash.
export const DEFAULT_SCRYPT: ScryptParams = { N: 2 ** 15, r: 8, p: 1 };
const KEY_LENGTH = 64;
const SALT_LENGTH = 16;
export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 256;

function scrypt(password: string, salt: Buffer, params: ScryptParams): Promise<Buffer> {
  const options: ScryptOptions = { N: params.N, r: params.r, p: params.p, maxmem: 256 * params.N * params.r + 1024 * 1024 };
  return new Promise((resolve, reject) => {
    scryptCb(password.normalize('NFC'), salt, KEY_LENGTH, options, (err, key) => (err ? reject(err) : resolve(key)));
  });
}

export async function hashPassword(password: string, params: ScryptParams = DEFAULT_SCRYPT): Promise<string> {
  const salt = randomBytes(SALT_LENGTH);
  const key = await scrypt(password, salt, params);
  return ['scrypt', params.N, params.r, params.p, salt.toString('base64url'), key.toString('base64url')].join('$');
}

function parseHash(stored: string): { params: ScryptParams; salt: Buffer; key: Buffer } | undefined {
  const parts = stored.split('$');
  if (parts.length !== 6 || parts[0] !== 'scrypt') return undefined;
  const [N, r, p] = parts.slice(1, 4).map(Number);
  if (![N, r, p].every((x) => Number.isInteger(x) && x > 0) || (N & (N - 1)) !== 0 || N > 2 ** 20) return undefined;
  return { params: { N, r, p }, salt: Buffer.from(parts[4], 'base64url'), key: Buffer.from(parts[5], 'base64url') };
}

/** Whether `password` matches a stored hash. A malformed stored hash never matches. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parsed = parseHash(stored);
  if (!parsed || parsed.key.length !== KEY_LENGTH) return false;
  const key = await scrypt(password, parsed.salt, parsed.params);
  return timingSafeEqual(key, parsed.key);
}

/** What is wrong with a new password, or undefined when it will do. */
export function checkNewPassword(password: string): string | undefined {
  if (password.length < MIN_PASSWORD_LENGTH) return `a password needs at least ${MIN_PASSWORD_LENGTH} characters`;
  if (password.length > MAX_PASSWORD_LENGTH) return `a password may have at most ${MAX_PASSWORD_LENGTH} characters`;
  if (password.trim() === '') return 'a password cannot be only spaces';
  return undefined;
}

/** A random password for demo accounts: 16 characters from an alphabet without look-alikes. */
export function randomPassword(length = 16): string {
  const alphabet = 'abcdefghjkmnpqrstuvwxyzABCDEFGHJKMNPQRSTUVWXYZ23456789';
  const out: string[] = [];
  // Rejection sampling keeps every character equally likely.
  while (out.length < length) {
    for (const b of randomBytes(length * 2)) {
      if (b < 256 - (256 % alphabet.length) && out.length < length) out.push(alphabet[b % alphabet.length]);
    }
  }
  return out.join('');
}
