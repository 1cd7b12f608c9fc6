// People of the demo beyond the scenario's accounts: one pending invitation at Larkspur Lane, sent
// yesterday by the practice administrator. Its link's token was thrown away (only a hash is ever
// stored), so the demo shows it as pending; "Send again" mails a working link to the catcher.
import { createHash, randomBytes } from 'node:crypto';
import type { Tx } from '../db/database.js';
import { invitations } from '../db/schema/index.js';
import type { DemoRefs } from './demo-scenario.js';

const DEMO_PENDING_INVITATION = { email: 'bea.lindqvist@larkspur.example', role: 'hygienist' } as const;

export async function seedDemoPeople(tx: Tx, refs: DemoRefs): Promise<void> {
  const sentAt = new Date(Date.now() - 26 * 3600 * 1000);
  await tx.insert(invitations).values({
    practiceId: refs.practiceIds.larkspur,
    email: DEMO_PENDING_INVITATION.email,
    role: DEMO_PENDING_INVITATION.role,
    invitedBy: refs.userIds.get('odile.park@larkspur.example')!,
    createdAt: sentAt,
    mailStatus: 'sent',
    mailSentAt: sentAt,
    tokenHash: createHash('sha256').update(randomBytes(32)).digest('base64url'),
    expiresAt: new Date(sentAt.getTime() + 72 * 3600 * 1000),
    linkOrigin: 'http://127.0.0.1:3000',
  });
}
