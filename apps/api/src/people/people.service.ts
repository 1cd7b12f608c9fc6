import { ConflictException, Inject, Injectable } from '@nestjs/common';
import type { AppAbility, Role } from '@torquetrail/authz';
import type {
  Invitation,
  InvitationStatus,
  PeopleReply,
  Person,
  PracticeContact,
  PracticeContactBody,
  SessionSettings,
} from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { sessionSettings } from '../db/practice-settings.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { findPracticeContact, setPracticeContact } from '../db/practice-contact.js';
import { AccountMailService } from './account-mail.service.js';
import * as repo from './people.repository.js';

type PersonRow = NonNullable<Awaited<ReturnType<typeof repo.findPerson>>>;
type InvitationRow = NonNullable<Awaited<ReturnType<typeof repo.findInvitation>>>;

const toPerson = ({ practiceId: _p, createdAt, ...row }: PersonRow): Person => ({
  ...row,
  createdAt: createdAt.toISOString(),
});

function invitationStatus(row: InvitationRow, now = new Date()): InvitationStatus {
  if (row.acceptedAt) return 'accepted';
  if (row.revokedAt) return 'revoked';
  if (row.expiresAt && row.expiresAt <= now) return 'expired';
  return 'pending';
}

const toInvitation = (row: InvitationRow): Invitation => ({
  id: row.id,
  email: row.email,
  role: row.role,
  status: invitationStatus(row),
  invitedByName: row.invitedByName,
  createdAt: row.createdAt.toISOString(),
  expiresAt: row.expiresAt?.toISOString() ?? null,
  mailSentAt: row.mailSentAt?.toISOString() ?? null,
  mailFailed: row.mailStatus === 'failed',
});

const LAST_ADMIN = "This is the practice's only active administrator: make someone else a practice administrator first";

/** People of a practice (practice administrator): users, roles, deactivation and invitations. */
@Injectable()
export class PeopleService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly mails: AccountMailService,
  ) {}

  async list(user: SessionUser): Promise<PeopleReply> {
    const [people, invitations] = await Promise.all([
      repo.listPeople(this.db, user.practiceId),
      repo.listInvitations(this.db, user.practiceId),
    ]);
    return { people: people.map(toPerson), invitations: invitations.map(toInvitation) };
  }

  async invite(user: SessionUser, email: string, role: Role, linkOrigin: string): Promise<Invitation> {
    if (await repo.findUserIdByEmail(this.db, email))
      throw new ConflictException(`${email} already has a Torquetrail account`);
    let id: string;
    try {
      id = await repo.insertInvitation(this.db, {
        practiceId: user.practiceId,
        email,
        role,
        invitedBy: user.id,
        linkOrigin,
      });
    } catch (error) {
      if (isUniqueViolation(error, 'invitations_open_email_unique'))
        throw new ConflictException(`${email} is already invited: send the invitation again instead`);
      throw error;
    }
    await this.mails.queue({ kind: 'invitation', id, round: 1 });
    return toInvitation(await repo.findInvitation(this.db, id));
  }

  private async loadInvitation(ability: AppAbility, id: string, action: 'create' | 'update') {
    return assertCan(ability, action, 'User', await repo.findInvitation(this.db, id), 'invitation');
  }

  /** A new link for an invitation not yet accepted or withdrawn; the one mailed before stops working. */
  async resend(ability: AppAbility, id: string, linkOrigin: string): Promise<Invitation> {
    const row = await this.loadInvitation(ability, id, 'create');
    const status = invitationStatus(row);
    if (status === 'accepted' || status === 'revoked')
      throw new ConflictException(`This invitation was ${status === 'accepted' ? 'accepted' : 'withdrawn'} already`);
    const round = await repo.restartInvitationMail(this.db, id, linkOrigin);
    await this.mails.queue({ kind: 'invitation', id, round });
    return toInvitation(await repo.findInvitation(this.db, id));
  }

  async revoke(ability: AppAbility, user: SessionUser, id: string): Promise<Invitation> {
    const row = await this.loadInvitation(ability, id, 'update');
    if (row.acceptedAt)
      throw new ConflictException('This invitation was accepted already: deactivate the user instead');
    await repo.revokeInvitation(this.db, id, user.id);
    return toInvitation(await repo.findInvitation(this.db, id));
  }

  /** Changes a role; the last active administrator of the practice keeps theirs (409). */
  changeRole(ability: AppAbility, id: string, role: Role): Promise<Person> {
    return this.db.transaction(async (tx) => {
      const person = assertCan(ability, 'update', 'User', await repo.findPerson(tx, id), 'user');
      if (person.role === 'practice_admin' && role !== 'practice_admin' && person.active) {
        const admins = await repo.lockActiveAdmins(tx, person.practiceId);
        if (admins.length <= 1) throw new ConflictException(LAST_ADMIN);
      }
      await repo.setRole(tx, id, role);
      return toPerson(await repo.findPerson(tx, id));
    });
  }

  /** Deactivates a user: their sessions end at once; their past entries keep their name (the row stays). */
  deactivate(ability: AppAbility, id: string): Promise<Person> {
    return this.db.transaction(async (tx) => {
      const person = assertCan(ability, 'update', 'User', await repo.findPerson(tx, id), 'user');
      if (!person.active) return toPerson(person);
      if (person.role === 'practice_admin') {
        const admins = await repo.lockActiveAdmins(tx, person.practiceId);
        if (admins.length <= 1) throw new ConflictException(LAST_ADMIN);
      }
      await repo.deactivateUser(tx, id);
      return toPerson(await repo.findPerson(tx, id));
    });
  }

  sessionSettings(user: SessionUser): Promise<SessionSettings> {
    return sessionSettings.read(this.db, user.practiceId);
  }

  /** The idle period and the date format, audited with the values before and after. */
  setSessionSettings(user: SessionUser, body: SessionSettings): Promise<SessionSettings> {
    return sessionSettings.change(this.db, user.practiceId, body);
  }

  contact(user: SessionUser): Promise<PracticeContact> {
    return findPracticeContact(this.db, user.practiceId);
  }

  /** The practice's address, phone and e-mail, audited with the values before and after. */
  setContact(user: SessionUser, body: PracticeContactBody): Promise<PracticeContact> {
    return auditedTransaction(this.db, async (tx) => {
      const before = await findPracticeContact(tx, user.practiceId);
      await setPracticeContact(tx, user.practiceId, body);
      const after = await findPracticeContact(tx, user.practiceId);
      reportChange({ type: 'Practice', id: user.practiceId, before, after });
      return after;
    });
  }
}
