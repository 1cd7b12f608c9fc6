// What other features may use from the shares feature (a patient's page shows its shares).
export { PatientShares } from './components/patient-shares';
