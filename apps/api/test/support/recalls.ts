// Helpers for the recall tests: the SMTP catcher's JSON list and polling.
const CATCHER = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;

export interface CaughtMail {
  subject: string;
  envelopeTo: string[];
  text: string;
  headers: Record<string, string>;
}

/** Messages the catcher holds for one reminder_log row (the catcher is shared: filter by our id). */
export async function caughtFor(reminderId: string): Promise<CaughtMail[]> {
  const res = await fetch(CATCHER);
  const all = (await res.json()) as CaughtMail[];
  return all.filter((m) => m.headers['x-torquetrail-reminder-id'] === reminderId);
}

/** Polls until `probe` returns a value (not undefined/null/false), or fails after `ms`. */
export async function until<T>(
  probe: () => Promise<T | undefined | null | false>,
  ms: number,
  every = 250,
): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > end) throw new Error(`condition not met within ${ms} ms`);
    await new Promise((r) => setTimeout(r, every));
  }
}
