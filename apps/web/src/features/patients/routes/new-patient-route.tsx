import '../components/patients.css';
import { CreatePatientBody, DuplicateCheckReply } from '@torquetrail/contracts';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { apiRequest } from '../../../lib/api-client';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { localToday } from '../../../lib/dates';
import { applyServerErrors, draftSchema, useContractForm } from '../../../lib/forms';
import { useDebouncedValue } from '../../../lib/use-debounced-value';
import { patientKeys } from '../api/keys';
import { useCreatePatient, useDuplicates } from '../api/patient-records';
import { DuplicateWarning } from '../components/duplicate-warning';
import { draftToRecord, emptyDraft, type PatientDraft, PatientForm } from '../components/patient-form';
import { runMutation } from '../../../lib/run-mutation';

const schema = draftSchema(CreatePatientBody, draftToRecord);

/** /patients/new: register a patient; the likely duplicates show before saving. */
export function NewPatientRoute() {
  const navigate = useNavigate();
  const client = useQueryClient();
  const create = useCreatePatient();
  const form = useContractForm<PatientDraft, CreatePatientBody>(schema, emptyDraft(localToday()));
  const [familyName, birthDate] = form.watch(['familyName', 'birthDate']);
  const live = useDuplicates(useDebouncedValue(familyName, 300), useDebouncedValue(birthDate.trim(), 300));
  // Set when a save stopped on duplicates: the user has seen them and may save anyway, as long
  // as the name and date are still the ones checked.
  const [stopped, setStopped] = useState<{ key: string; matches: DuplicateCheckReply['matches'] } | null>(null);
  const keyOf = (name: string, date: string) => `${name.trim().toLowerCase()}|${date.trim()}`;
  const stoppedOn = stopped && stopped.key === keyOf(familyName, birthDate) ? stopped.matches : null;

  const save = (body: CreatePatientBody) =>
    runMutation(create, body, {
      onSuccess: (patient) => void navigate(`/patients/${patient.id}`),
      onError: (error) => applyServerErrors(form.setError, error),
    });

  const submit = async (body: CreatePatientBody) => {
    // Asked again at the moment of saving, so a fast Enter cannot skip the warning.
    const { matches } = await client.fetchQuery({
      queryKey: patientKeys.duplicates(body.familyName.trim(), body.birthDate),
      queryFn: () =>
        apiRequest(
          `/api/patients/duplicates?${new URLSearchParams({ familyName: body.familyName.trim(), birthDate: body.birthDate })}`,
          { schema: DuplicateCheckReply },
        ),
    });
    if (matches.length > 0) {
      setStopped({ key: keyOf(body.familyName, body.birthDate), matches });
      return;
    }
    save(body);
  };
  const saveAnyway = () => void form.handleSubmit(save)();

  const shown = stoppedOn ?? (live.data && live.data.matches.length > 0 ? live.data.matches : null);
  return (
    <div className="patient-record-page">
      <title>New patient · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Patients', to: '/patients' }, { text: 'New patient' }]} />
      <h1 className="page-title">New patient</h1>
      <p className="muted">The chart number is given when the patient is saved, with your practice&apos;s prefix.</p>
      <PatientForm
        form={form}
        onSubmit={(body) => void submit(body)}
        saving={create.isPending}
        submitLabel="Save patient"
        editable={() => true}
        beforeSubmit={
          shown && (
            <DuplicateWarning
              matches={shown}
              onSaveAnyway={stoppedOn ? saveAnyway : undefined}
              saving={create.isPending}
            />
          )
        }
      />
    </div>
  );
}
