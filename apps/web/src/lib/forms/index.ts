// The one way the web's forms work: react-hook-form, validated with the contracts' zod schemas,
// errors (client or server) shown beside their fields through Blueprint's FormGroup.
export { DateField, NumberInput, withInputRef } from './blueprint-inputs';
export { draftSchema, useContractForm } from './contract-form';
export { keepDrafts, setDraftOwner } from './drafts';
export { errorAt, FieldError, FormField, useFieldError } from './form-field';
export { applyServerErrors, formErrorMessage } from './server-errors';
export { AmendmentForm } from './amendment-form';
