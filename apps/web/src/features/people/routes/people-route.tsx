import { Alert, Button, Callout, HTMLSelect, HTMLTable, Tag } from '@blueprintjs/core';
import { ROLES } from '@torquetrail/authz';
import type { Invitation, Person, Role } from '@torquetrail/contracts';
import { useState } from 'react';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatDateTime } from '../../../lib/dates';
import { INVITATION_STATUS_LABEL, ROLE_LABEL } from '../../../lib/labels';
import { InviteForm } from '../components/invite-form';
import { useChangeRole, useDeactivate, usePeople, useResendInvitation, useRevokeInvitation } from '../api/people-api';

/** /practice/people: who works here, in which role, and who is invited. */
export function PeopleRoute() {
  const people = usePeople();
  return (
    <div className="people">
      <title>People · Practice · Torquetrail</title>
      <h1 className="page-title">People</h1>
      <section className="people__section" aria-labelledby="invite-heading">
        <h2 id="invite-heading">Invite someone</h2>
        <InviteForm />
      </section>
      {people.isPending ? (
        <LoadingState label="Loading the practice's people" />
      ) : people.isError ? (
        <ErrorState title="Could not load the people" error={people.error} onRetry={() => void people.refetch()} />
      ) : (
        <>
          <Users people={people.data.people} />
          <Invitations invitations={people.data.invitations} />
        </>
      )}
    </div>
  );
}

function Users({ people }: { people: Person[] }) {
  const changeRole = useChangeRole();
  const deactivate = useDeactivate();
  const [confirming, setConfirming] = useState<Person | null>(null);
  const error = changeRole.error ?? deactivate.error;
  return (
    <section className="people__section" aria-labelledby="users-heading">
      <h2 id="users-heading">Users</h2>
      {error && (
        <Callout intent="danger" role="alert">
          {error.message}
        </Callout>
      )}
      <HTMLTable className="people__table" striped>
        <thead>
          <tr>
            <th scope="col">Name</th>
            <th scope="col">E-mail</th>
            <th scope="col">Role</th>
            <th scope="col">Status</th>
            <th scope="col">
              <span className="bp6-text-muted">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {people.map((person) => (
            <tr key={person.id} data-testid={`person-${person.email}`}>
              <td>{person.displayName}</td>
              <td>{person.email}</td>
              <td>
                {person.active ? (
                  <HTMLSelect
                    aria-label={`Role of ${person.displayName}`}
                    value={person.role}
                    disabled={changeRole.isPending}
                    onChange={(event) => {
                      deactivate.reset();
                      changeRole.mutate({ id: person.id, role: event.currentTarget.value as Role });
                    }}
                  >
                    {ROLES.map((role) => (
                      <option key={role} value={role}>
                        {ROLE_LABEL[role]}
                      </option>
                    ))}
                  </HTMLSelect>
                ) : (
                  ROLE_LABEL[person.role]
                )}
              </td>
              <td>
                {person.active ? (
                  <Tag intent="success" minimal>
                    Active
                  </Tag>
                ) : (
                  <Tag minimal>Deactivated</Tag>
                )}
              </td>
              <td>
                {person.active && (
                  <Button
                    variant="minimal"
                    intent="danger"
                    text="Deactivate"
                    aria-label={`Deactivate ${person.displayName}`}
                    onClick={() => setConfirming(person)}
                  />
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
      <Alert
        isOpen={confirming !== null}
        intent="danger"
        icon="disable"
        confirmButtonText="Deactivate"
        cancelButtonText="Keep active"
        onCancel={() => setConfirming(null)}
        onConfirm={() => {
          if (confirming) {
            changeRole.reset();
            deactivate.mutate(confirming.id);
          }
          setConfirming(null);
        }}
      >
        <p>
          Deactivate {confirming?.displayName}? They are signed out everywhere at once and cannot sign in again. What
          they recorded keeps their name.
        </p>
      </Alert>
    </section>
  );
}

function Invitations({ invitations }: { invitations: Invitation[] }) {
  const resend = useResendInvitation();
  const revoke = useRevokeInvitation();
  const error = resend.error ?? revoke.error;
  return (
    <section className="people__section" aria-labelledby="invitations-heading">
      <h2 id="invitations-heading">Invitations</h2>
      {error && (
        <Callout intent="danger" role="alert">
          {error.message}
        </Callout>
      )}
      {invitations.length === 0 ? (
        <p>No invitations yet.</p>
      ) : (
        <HTMLTable className="people__table" striped>
          <thead>
            <tr>
              <th scope="col">E-mail</th>
              <th scope="col">Role</th>
              <th scope="col">Status</th>
              <th scope="col">Invited by</th>
              <th scope="col">Link works until</th>
              <th scope="col">
                <span className="bp6-text-muted">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {invitations.map((inv) => {
              const open = inv.status === 'pending' || inv.status === 'expired';
              return (
                <tr key={inv.id} data-testid={`invitation-${inv.email}`}>
                  <td>{inv.email}</td>
                  <td>{ROLE_LABEL[inv.role]}</td>
                  <td>
                    {INVITATION_STATUS_LABEL[inv.status]}
                    {inv.mailFailed && ' (the e-mail could not be sent)'}
                    {open && !inv.mailSentAt && ' (e-mail on its way)'}
                  </td>
                  <td>{inv.invitedByName}</td>
                  <td>{inv.expiresAt && inv.status === 'pending' ? formatDateTime(inv.expiresAt) : '—'}</td>
                  <td className="people__actions">
                    {open && (
                      <>
                        <Button
                          variant="minimal"
                          icon="envelope"
                          text="Send again"
                          aria-label={`Send again to ${inv.email}`}
                          loading={resend.isPending && resend.variables === inv.id}
                          onClick={() => {
                            revoke.reset();
                            resend.mutate(inv.id);
                          }}
                        />
                        <Button
                          variant="minimal"
                          intent="danger"
                          text="Withdraw"
                          aria-label={`Withdraw the invitation to ${inv.email}`}
                          loading={revoke.isPending && revoke.variables === inv.id}
                          onClick={() => {
                            resend.reset();
                            revoke.mutate(inv.id);
                          }}
                        />
                      </>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </HTMLTable>
      )}
    </section>
  );
}
