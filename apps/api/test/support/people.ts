// Helpers for the people and sign-in tests: throwaway accounts and the links caught by the SMTP catcher.
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import pg from 'pg';
import { users } from '../../src/db/schema/index.js';
import { hashLinkToken } from '../../src/people/link-token.js';
import { DEMO_PASSWORD } from '../../src/seed/demo-scenario.js';
import { until } from './recalls.js';
import { ACCOUNTS, type TestContext } from './test-app.js';

const CATCHER = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;

interface CaughtMail {
  subject: string;
  envelopeTo: string[];
  text: string;
  headers: Record<string, string>;
}

/** A fresh address no test has used (the catcher is shared by every test file and run). */
export const freshEmail = (who: string, domain = 'larkspur.example') => `${who}.${randomUUID().slice(0, 8)}@${domain}`;

/** An account like `like`'s (practice, role, the demo password) under a new address; returns its id and e-mail. */
export async function throwawayAccount(
  ctx: TestContext,
  like: keyof typeof ACCOUNTS,
  over: { role?: 'practice_admin' | 'dentist' | 'hygienist' | 'surgeon' } = {},
): Promise<{ id: string; email: string }> {
  const [u] = await ctx.db.select().from(users).where(eq(users.email, ACCOUNTS[like]));
  const email = freshEmail('throwaway', u.email.split('@')[1]);
  const [row] = await ctx.db
    .insert(users)
    .values({
      practiceId: u.practiceId,
      email,
      displayName: `Throwaway ${email.slice(10, 18)}`,
      role: over.role ?? u.role,
      passwordHash: u.passwordHash,
    })
    .returning({ id: users.id });
  return { id: row.id, email };
}

export async function signInAs(ctx: TestContext, email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await ctx.http.post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return sessionCookie(res.headers['set-cookie']);
}

export function sessionCookie(header: string | string[] | undefined): string {
  const cookie = ([] as string[]).concat(header ?? []).find((c) => c.startsWith('tt_session='));
  if (!cookie) throw new Error('no session cookie set');
  return cookie.split(';')[0];
}

/** The mails the catcher holds for an address, oldest first. */
export async function mailsTo(email: string): Promise<CaughtMail[]> {
  const all = (await (await fetch(CATCHER)).json()) as CaughtMail[];
  return all.filter((m) => m.envelopeTo.includes(email));
}

/** Waits for the `n`-th mail to `email` and returns it with the link it carries. */
export async function linkMailedTo(email: string, n = 1, ms = 30_000) {
  const mail = await until(async () => (await mailsTo(email))[n - 1], ms);
  const match = /(https?:\/\/\S+?)\/(welcome|reset-password)#token=([A-Za-z0-9_-]+)/.exec(mail.text);
  if (!match) throw new Error(`no link in the mail to ${email}: ${mail.text}`);
  await linkStored(match[3]);
  return { mail, origin: match[1], page: match[2], token: match[3] };
}

let pool: pg.Pool | undefined;

/**
 * Waits (up to 5 s) until the link's token hash is stored. The API stores it just after SMTP
 * accepts the mail, in the same transaction (account-mail.service.ts), so a test that reads the mail
 * can be a few milliseconds ahead of the commit: on a loaded machine the invitation row still had no
 * hash (CI, stop 24). A link that is never stored (a test of a failed commit) is returned all the same.
 */
async function linkStored(token: string, ms = 5_000): Promise<void> {
  pool ??= new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1, allowExitOnIdle: true });
  const hash = hashLinkToken(token);
  const end = Date.now() + ms;
  while (Date.now() < end) {
    const found = await pool.query(
      'select 1 from invitations where token_hash = $1 union all select 1 from password_resets where token_hash = $1',
      [hash],
    );
    if ((found.rowCount ?? 0) > 0) return;
    await new Promise((r) => setTimeout(r, 50));
  }
}
