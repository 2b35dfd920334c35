// Links to set a password, sent by e-mail: after "forgot password", when an admin sends one, and
// to a person whose account was just made. The token is random; the database keeps its SHA-256.
import { createHash, randomBytes } from 'node:crypto';
import { lt } from 'drizzle-orm';
import type { ServerContext } from '../context.ts';
import { passwordResetsTable } from '../db/schema.ts';
import type { UserRecord } from './users.ts';

/** How long a reset link works. */
export const RESET_TTL_MS = 60 * 60 * 1000;
/** How long the link sent with a new account works: the person may not read mail every day. */
export const WELCOME_TTL_MS = 7 * 24 * 60 * 60 * 1000;
/** The viewer's page that takes the token from the e-mail's link. */
export const RESET_PAGE = '/reset-password';

export const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

export async function sendPasswordLink(ctx: ServerContext, user: UserRecord, purpose: 'reset' | 'welcome'): Promise<void> {
  const ttl = purpose === 'welcome' ? WELCOME_TTL_MS : RESET_TTL_MS;
  const token = randomBytes(32).toString('base64url');
  // Links that can no longer work are of no use to keep.
  await ctx.db.delete(passwordResetsTable).where(lt(passwordResetsTable.expiresAt, new Date(ctx.now() - WELCOME_TTL_MS)));
  await ctx.db.insert(passwordResetsTable).values({ tokenHash: sha256(token), userId: user.id, expiresAt: new Date(ctx.now() + ttl) });
  const link = `${ctx.env.publicUrl}${RESET_PAGE}?token=${encodeURIComponent(token)}`;
  const hello = `Hello${user.name ? ` ${user.name}` : ''},`;
  const text =
    purpose === 'welcome'
      ? [
          hello,
          '',
          `An account on the bakery's Panform has been made for you (${user.email}, role ${user.role}).`,
          `Open this link within ${ttl / 86_400_000} days to choose your password; it works once:`,
          '',
          link,
          '',
          'If you did not expect this, ignore this message and tell the person who runs Panform.',
        ]
      : [
          hello,
          '',
          'Someone (we hope you) asked to set a new password for your Panform account.',
          `Open this link within ${ttl / 60_000} minutes to choose one; it works once:`,
          '',
          link,
          '',
          'If you did not ask for this, ignore this message: your password stays as it is.',
        ];
  await ctx.sendMail({ to: user.email, subject: purpose === 'welcome' ? 'Panform: your new account' : 'Panform: set a new password', text: text.join('\n') });
}
