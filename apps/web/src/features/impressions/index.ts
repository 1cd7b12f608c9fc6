// What other features may use from impressions: a restoration's impression panel (method, scan
// bodies, scan files with upload and the lazily loaded 3D preview).
export { ImpressionPanel } from './components/impression-panel';
