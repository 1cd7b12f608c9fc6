// What other features may use from records-out (the patient's page offers the records).
export { RecordsOutPanel } from './components/records-out-panel';
