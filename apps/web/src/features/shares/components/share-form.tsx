import { Button, Callout, Checkbox, InputGroup, Radio, RadioGroup } from '@blueprintjs/core';
import { CreateShareBody, SHARE_SCOPES, type ArchSite } from '@torquetrail/contracts';
import { FormProvider, useWatch } from 'react-hook-form';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  formErrorMessage,
  FormField,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { SHARE_SCOPE_HINT, SHARE_SCOPE_LABEL } from '../../../lib/labels';
import { useCreateShare } from '../api/shares-api';
import { runMutation } from '../../../lib/run-mutation';

interface ShareDraft {
  surgeonEmail: string;
  placement: boolean;
  outcomes: boolean;
  /** 'all' or 'chosen' (a radio's value). */
  which: 'all' | 'chosen';
  siteIds: string[];
  endsOn: string;
  reason: string;
}

const EMPTY: ShareDraft = {
  surgeonEmail: '',
  placement: false,
  outcomes: false,
  which: 'all',
  siteIds: [],
  endsOn: '',
  reason: '',
};

const schema = draftSchema(CreateShareBody, (draft: ShareDraft): CreateShareBody => ({
  surgeonEmail: draft.surgeonEmail.trim(),
  scopes: SHARE_SCOPES.filter((scope) => draft[scope]),
  siteIds: draft.which === 'all' ? null : draft.siteIds,
  endsOn: draft.endsOn === '' ? null : draft.endsOn,
  reason: draft.reason,
}));

/**
 * Share the patient with a referring surgeon of another practice: found by the exact e-mail (other
 * practices' users are never listed), with a scope, the sites, an optional last day and a reason.
 */
export function ShareForm({ patientId, sites }: { patientId: string; sites: readonly ArchSite[] }) {
  const create = useCreateShare(patientId);
  const form = useContractForm(schema, EMPTY);
  const which = useWatch({ control: form.control, name: 'which' });
  const submit = (body: CreateShareBody) =>
    runMutation(create, body, {
      onSuccess: () => form.reset(EMPTY),
      onError: (error) => applyServerErrors(form.setError, error),
    });
  const message = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form
        className="share-form"
        aria-label="Share with a surgeon"
        noValidate
        onSubmit={(event) => void form.handleSubmit(submit, () => create.reset())(event)}
      >
        <FormField
          name="surgeonEmail"
          label="Surgeon's e-mail"
          labelFor="share-email"
          help="The exact address the surgeon signs in with; a surgeon new to Torquetrail is invited"
        >
          {(a11y) => (
            <InputGroup id="share-email" type="email" {...a11y} {...withInputRef(form.register('surgeonEmail'))} />
          )}
        </FormField>
        <FormField name="scopes" label="What the surgeon may do">
          {SHARE_SCOPES.map((scope) => (
            <Checkbox
              key={scope}
              data-testid={`share-scope-${scope}`}
              labelElement={
                <>
                  {SHARE_SCOPE_LABEL[scope]} <span className="muted">— {SHARE_SCOPE_HINT[scope]}</span>
                </>
              }
              {...withInputRef(form.register(scope))}
            />
          ))}
        </FormField>
        <FormField name="siteIds" label="Which implant sites">
          <RadioGroup
            selectedValue={which}
            onChange={(event) =>
              form.setValue('which', event.currentTarget.value === 'chosen' ? 'chosen' : 'all', { shouldDirty: true })
            }
          >
            <Radio value="all" label="All implant sites, also those added later" />
            <Radio value="chosen" label="Chosen sites" disabled={sites.length === 0} />
          </RadioGroup>
          {which === 'chosen' && (
            <div className="share-form__sites">
              {sites.map((site) => (
                <Checkbox
                  key={site.id}
                  inline
                  value={site.id}
                  label={String(site.fdi)}
                  data-testid={`share-site-${site.fdi}`}
                  {...withInputRef(form.register('siteIds'))}
                />
              ))}
            </div>
          )}
        </FormField>
        <FormField name="endsOn" label="Last day (optional)" labelFor="share-ends-on" help="Empty: until you revoke it">
          {(a11y) => <DateField id="share-ends-on" name="endsOn" {...a11y} />}
        </FormField>
        <FormField name="reason" label="Reason" labelFor="share-reason">
          {(a11y) => <InputGroup id="share-reason" {...a11y} {...withInputRef(form.register('reason'))} />}
        </FormField>
        <Button type="submit" intent="primary" icon="share" loading={create.isPending}>
          Share
        </Button>
      </form>
      {message && (
        <Callout intent="danger" role="alert">
          {message}
        </Callout>
      )}
      {create.isSuccess && (
        <Callout intent="success" role="status">
          {create.data.status === 'invited'
            ? `${create.data.surgeon.email} has no Torquetrail account yet: they are invited by e-mail, and the share opens once they sign up.`
            : `Shared with ${create.data.surgeon.displayName} (${create.data.surgeon.practiceName}); they are told by e-mail.`}
        </Callout>
      )}
    </FormProvider>
  );
}
