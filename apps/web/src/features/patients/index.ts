// What other features may use from the patients feature.
export { patientKeys } from './api/keys';
export { prefetchPatient, usePatient } from './api/get-patient';
