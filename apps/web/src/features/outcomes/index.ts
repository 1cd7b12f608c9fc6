// What other features may use from the outcomes feature (a patient's page offers the referral summary).
export { ReferralSummaryPanel } from './components/referral-summary-panel';
