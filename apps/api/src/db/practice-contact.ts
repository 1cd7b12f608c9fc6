import { eq } from 'drizzle-orm';
import type { DateFormat } from '@torquetrail/contracts';
import type { Db } from './database.js';
import { practices } from './schema/index.js';

/** How the practice is reached, as every document that prints it selects it (passport, cards, lab sheets). */
export interface PracticeContactRow {
  name: string;
  address: string | null;
  phone: string | null;
  email: string | null;
}

export async function findPracticeContact(db: Db, practiceId: string): Promise<PracticeContactRow> {
  const [row] = await db
    .select({ name: practices.name, address: practices.address, phone: practices.phone, email: practices.email })
    .from(practices)
    .where(eq(practices.id, practiceId));
  if (!row) throw new Error(`practice ${practiceId} not found`);
  return row;
}

export async function setPracticeContact(
  db: Db,
  practiceId: string,
  contact: Omit<PracticeContactRow, 'name'>,
): Promise<void> {
  await db.update(practices).set(contact).where(eq(practices.id, practiceId));
}

/** The practice as its documents print it: its contact and the order it writes dates in. */
export async function findPrintingPractice(
  db: Db,
  practiceId: string,
): Promise<PracticeContactRow & { dateFormat: DateFormat }> {
  const [[format], contact] = await Promise.all([
    db.select({ dateFormat: practices.dateFormat }).from(practices).where(eq(practices.id, practiceId)),
    findPracticeContact(db, practiceId),
  ]);
  return { ...contact, dateFormat: format.dateFormat };
}
