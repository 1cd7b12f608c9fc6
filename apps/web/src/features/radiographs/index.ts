// What other features may use from radiographs: the Site file's thumbnails of one site and its
// bone-level chart.
export { SiteRadiographs } from './components/site-radiographs';
export { BoneLevelChart } from './components/bone-level-chart';
export { useRadiographs } from './api/radiographs-api';
