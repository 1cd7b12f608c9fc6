import { Button, Callout, HTMLSelect, InputGroup } from '@blueprintjs/core';
import { ROLES } from '@torquetrail/authz';
import { InviteBody, type Role } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import {
  applyServerErrors,
  draftSchema,
  FormField,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { ROLE_LABEL } from '../../../lib/labels';
import { useInvite } from '../api/people-api';
import { runMutation } from '../../../lib/run-mutation';

interface InviteDraft {
  email: string;
  role: Role;
}

const schema = draftSchema(InviteBody, (draft: InviteDraft) => ({ email: draft.email.trim(), role: draft.role }));

/** Invite someone by e-mail with a role: they get a link valid 72 hours to choose their name and password. */
export function InviteForm() {
  const invite = useInvite();
  const form = useContractForm(schema, { email: '', role: 'hygienist' });
  const submit = (body: InviteBody) =>
    runMutation(invite, body, {
      onSuccess: (sent) => form.reset({ email: '', role: sent.role }),
      onError: (error) => applyServerErrors(form.setError, error),
    });
  const message = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form
        className="people__invite"
        aria-label="Invite someone"
        noValidate
        onSubmit={(event) => void form.handleSubmit(submit, () => invite.reset())(event)}
      >
        <FormField name="email" label="E-mail" labelFor="invite-email">
          {(a11y) => <InputGroup id="invite-email" type="email" {...a11y} {...withInputRef(form.register('email'))} />}
        </FormField>
        <FormField name="role" label="Role" labelFor="invite-role">
          <HTMLSelect id="invite-role" {...form.register('role')}>
            {ROLES.map((role) => (
              <option key={role} value={role}>
                {ROLE_LABEL[role]}
              </option>
            ))}
          </HTMLSelect>
        </FormField>
        <Button
          className="people__invite-submit"
          type="submit"
          intent="primary"
          icon="envelope"
          loading={invite.isPending}
        >
          Send invitation
        </Button>
      </form>
      {message && (
        <Callout intent="danger" role="alert">
          {message}
        </Callout>
      )}
      {invite.isSuccess && (
        <Callout intent="success" role="status">
          Invitation to {invite.data.email} is on its way; the link works for 72 hours.
        </Callout>
      )}
    </FormProvider>
  );
}
