// What other features may use from impressions: a restoration's impression panel (method, scan
// bodies, scan files with upload and the lazily loaded 3D preview), and the practice's impression
// rule for the admin's settings.
export { ImpressionPanel } from './components/impression-panel';
export { ImpressionSummary } from './components/impression-summary';
export { ImpressionSettingsSwitch } from './components/impression-settings-switch';
