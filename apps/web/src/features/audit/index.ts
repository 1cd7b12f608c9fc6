// What other features may use from the audit feature (a patient's page shows its trail).
export { PatientAccessLog } from './components/patient-access-log';
